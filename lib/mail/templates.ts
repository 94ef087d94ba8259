import { CAUTION_LINE } from "@/lib/cautions";
import { formatDateTime } from "@/lib/format/dates";
import { flagLabel } from "@/lib/schemas/flag";
import type { OutgoingMail } from "./send-mail";

/** Plain, readable e-mails: every message has an HTML part and a text part with the same words. */

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c);

function layout(title: string, paragraphs: string[], action: { label: string; url: string }, footer: string): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join("");
  return `<!doctype html><html><body style="margin:0;background:#f6f5f2;font-family:Arial,Helvetica,sans-serif;color:#14213d">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td style="padding:24px">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="background:#ffffff;border:1px solid #c3c0b6;border-radius:8px">
<tr><td style="padding:24px 28px;font-size:17px;line-height:1.5">
<p style="margin:0 0 8px;font-weight:bold;font-size:14px;letter-spacing:.04em;text-transform:uppercase">Tautline</p>
<h1 style="margin:0 0 16px;font-size:22px">${escapeHtml(title)}</h1>
${body}
<p style="margin:24px 0"><a href="${escapeHtml(action.url)}" style="display:inline-block;background:#14213d;color:#f6f5f2;padding:12px 20px;border-radius:6px;text-decoration:none;font-weight:bold">${escapeHtml(action.label)}</a></p>
<p style="margin:0 0 16px;font-size:14px">If the button does not work, copy this address into your browser:<br><span style="word-break:break-all">${escapeHtml(action.url)}</span></p>
<p style="margin:16px 0 0;font-size:13px;color:#4a5878">${escapeHtml(footer)}</p>
</td></tr></table></td></tr></table></body></html>`;
}

function text(title: string, paragraphs: string[], action: { label: string; url: string }, footer: string): string {
  return [title, "", ...paragraphs.flatMap((p) => [p, ""]), `${action.label}: ${action.url}`, "", footer, ""].join(
    "\n",
  );
}

function mail(
  to: string,
  subject: string,
  title: string,
  paragraphs: string[],
  action: { label: string; url: string },
  footer: string,
): OutgoingMail {
  return {
    to,
    subject,
    html: layout(title, paragraphs, action, footer),
    text: text(title, paragraphs, action, footer),
  };
}

export function signInLinkMail(input: { to: string; url: string; minutes: number }): OutgoingMail {
  return mail(
    input.to,
    "Your Tautline sign-in link",
    "Sign in to Tautline",
    [`Use this link to sign in. It works once and expires in ${input.minutes} minutes.`],
    { label: "Sign in", url: input.url },
    "If you did not ask to sign in, you can ignore this message; nobody can sign in without the link.",
  );
}

export function invitationMail(input: {
  to: string;
  url: string;
  projectName: string;
  roleLabel: string;
  invitedBy: string;
  expiresAt: Date;
  /** The project's time zone, the one the expiry is written in. */
  timeZone: string;
}): OutgoingMail {
  return mail(
    input.to,
    `You are invited to ${input.projectName} on Tautline`,
    `Join ${input.projectName}`,
    [
      `${input.invitedBy} has invited you to the project ${input.projectName} as ${input.roleLabel}.`,
      `The link works once and expires on ${formatDateTime(input.expiresAt, input.timeZone)}.`,
    ],
    { label: "Accept the invitation", url: input.url },
    "If you were not expecting this invitation, ignore this message and nothing will happen.",
  );
}

export function passwordResetMail(input: { to: string; url: string; minutes: number }): OutgoingMail {
  return mail(
    input.to,
    "Reset your Tautline password",
    "Choose a new password",
    [
      `Someone asked to reset the password of this account. The link works once and expires in ${input.minutes} minutes.`,
    ],
    { label: "Choose a new password", url: input.url },
    "If it was not you, ignore this message: your password stays as it is.",
  );
}

export function flagMail(input: {
  to: string[];
  projectName: string;
  pourName: string;
  tendonTag: string;
  /** Each new flag; `reference` is its number in the project ("F-0012"), as every screen shows it. */
  flags: { id?: string; reference?: string; kind: string; reason: string }[];
  verdictLine: string;
  basisLine: string;
  /** Per end, the gauge force and the force the elongation implies, with their difference. */
  forcesLine?: string;
  url: string;
}): OutgoingMail {
  // The link names the first new flag, so the page opens on the flag this e-mail is about.
  const first = input.flags[0]?.id;
  const url = first ? `${input.url}${input.url.includes("?") ? "&" : "?"}flag=${encodeURIComponent(first)}` : input.url;
  const title = `Tendon ${input.tendonTag} needs the engineer of record`;
  const paragraphs = [
    `${input.projectName}, ${input.pourName}, tendon ${input.tendonTag}.`,
    `Verdict: ${input.verdictLine}.`,
    ...input.flags.map((f) => `Flag ${f.reference ? `${f.reference} ` : ""}(${flagLabel(f.kind)}): ${f.reason}`),
    ...(input.forcesLine ? [`Force, gauge and elongation: ${input.forcesLine}.`] : []),
    `Basis: ${input.basisLine}`,
    "Do not cut tails or grout this tendon until a disposition is recorded.",
  ];
  return {
    to: input.to.join(", "),
    subject: `Tautline flag: ${input.tendonTag}, ${input.pourName} (${input.flags.map((f) => flagLabel(f.kind)).join(", ")})`,
    html: layout(title, paragraphs, { label: "Open the tendon's flags", url }, CAUTION_LINE),
    text: text(title, paragraphs, { label: "Open the tendon's flags", url }, CAUTION_LINE),
  };
}

/**
 * To the crew and the inspector: the engineer of record ordered field work on a tendon. Every
 * figure arrives already written in the project's units.
 */
export function workOrderMail(input: {
  to: string[];
  projectName: string;
  pourName: string;
  tendonTag: string;
  decisionLabel: string;
  engineerName: string;
  instructions: string;
  flagKind: string;
  lastStressing: string | null;
  url: string;
}): OutgoingMail {
  const title = `${input.decisionLabel} ordered for tendon ${input.tendonTag}`;
  const paragraphs = [
    `${input.projectName}, ${input.pourName}, tendon ${input.tendonTag}.`,
    `The engineer of record, ${input.engineerName}, ordered: ${input.decisionLabel}.`,
    `Instructions: ${input.instructions}`,
    `It answers the flag: ${flagLabel(input.flagKind).toLowerCase()}.`,
    ...(input.lastStressing ? [`Last stressing on the server: ${input.lastStressing}.`] : []),
    "The tendon stays held: do not cut tails or grout it until the work is recorded and its flags are closed.",
  ];
  const action = { label: "Open the pour on the tablet", url: input.url };
  return {
    to: input.to.join(", "),
    subject: `Tautline order: ${input.decisionLabel}, tendon ${input.tendonTag}, ${input.pourName}`,
    html: layout(title, paragraphs, action, CAUTION_LINE),
    text: text(title, paragraphs, action, CAUTION_LINE),
  };
}

/** To the crew and the inspector: a pour was released, in the releasing person's own words. */
export function releaseMail(input: {
  to: string[];
  projectName: string;
  pourName: string;
  releasedBy: string;
  releasedAt: string;
  tendons: number;
  statement: string;
  url: string;
}): OutgoingMail {
  const title = `${input.pourName} is released`;
  const paragraphs = [
    `${input.projectName}, ${input.pourName}: released by ${input.releasedBy} on ${input.releasedAt}, ${input.tendons} tendon(s).`,
    `Statement: ${input.statement}`,
    "The pour now takes no new record unless the engineer of record reopens it.",
  ];
  const action = { label: "Open the pour on the tablet", url: input.url };
  return {
    to: input.to.join(", "),
    subject: `Tautline release: ${input.pourName}, ${input.projectName}`,
    html: layout(title, paragraphs, action, CAUTION_LINE),
    text: text(title, paragraphs, action, CAUTION_LINE),
  };
}

/**
 * To one engineer who takes flags as a digest: every flag raised on the project in the shift,
 * one line each, figures already written in the project's units.
 */
export function shiftDigestMail(input: {
  to: string;
  projectName: string;
  /** The digest's span in words, e.g. "2026-12-02 18:00 CST to 2026-12-03 18:00 CST". */
  period: string;
  flags: { line: string }[];
  url: string;
}): OutgoingMail {
  const n = input.flags.length;
  const title = `${n} flag${n === 1 ? "" : "s"} raised in the shift on ${input.projectName}`;
  const paragraphs = [
    `Flags raised from ${input.period}.`,
    ...input.flags.map((f, i) => `${i + 1}. ${f.line}`),
    "A flagged tendon stays held on the crew's tablet: no tails cut or grout until a disposition is recorded.",
  ];
  const action = { label: "Open the review queue", url: input.url };
  return {
    to: input.to,
    subject: `Tautline shift digest: ${n} flag${n === 1 ? "" : "s"}, ${input.projectName}`,
    html: layout(title, paragraphs, action, CAUTION_LINE),
    text: text(title, paragraphs, action, CAUTION_LINE),
  };
}

/**
 * To the inspectors: an equipment set's tendons on a pour come out long or short against the
 * other sets by more than the scatter explains. Figures arrive already in words.
 */
export function gaugeCheckMail(input: {
  to: string[];
  projectName: string;
  pourName: string;
  setName: string;
  figures: string;
  note: string;
  url: string;
}): OutgoingMail {
  const title = `Check the gauge of ${input.setName} against the master gauge`;
  const paragraphs = [
    `${input.projectName}, ${input.pourName}: ${input.figures}.`,
    input.note,
    "Check this gauge against the master gauge (or have the set recalibrated) before it stresses more tendons; the engineer of record decides what the tendons already stressed need.",
  ];
  const action = { label: "Open the pour's insight", url: input.url };
  return {
    to: input.to.join(", "),
    subject: `Tautline gauge check: ${input.setName}, ${input.pourName}`,
    html: layout(title, paragraphs, action, CAUTION_LINE),
    text: text(title, paragraphs, action, CAUTION_LINE),
  };
}
