import { formatDateTime } from "@/lib/format/dates";
import type { SignatureBlock } from "./pdf-frame";

/**
 * The signature section of a report's CSV (the pour's stressing report and the day's inspection
 * report alike). The CSV is drawn live from the records, so it carries the signature only when the
 * last signed revision is of exactly this content (the same content sha256); otherwise it says it
 * is not signed, and why. Pure.
 */
export interface SignatureState {
  /** The last signed revision, or null when none has been signed. */
  last: Pick<SignatureBlock, "revision" | "signerName" | "licence" | "statement" | "signedAt" | "contentSha256"> | null;
  /** Whether the content as it stands is the last signed revision's (same content sha256). */
  current: boolean;
}

/**
 * Where a report stands against its signatures, in one sentence for the screens (office and
 * tablet alike): "The report of 2026-12-02 is not signed yet.", "… as it stands is signed:
 * revision 2.", "… has changed since revision 2 was signed; it needs a new signature." `subject`
 * names the report as the sentence starts.
 */
export function signatureStanding(subject: string, lastRevision: number | null, signedAsItStands: boolean): string {
  if (lastRevision === null) return `${subject} is not signed yet.`;
  return signedAsItStands
    ? `${subject} as it stands is signed: revision ${lastRevision}.`
    : `${subject} has changed since revision ${lastRevision} was signed; it needs a new signature.`;
}

export function signatureLines(state: SignatureState, timeZone: string): [string, string][] {
  const s = state.last;
  if (!s) return [["Signature", "Not signed: no revision of this report has been signed."]];
  const signedAt = formatDateTime(s.signedAt, timeZone);
  if (!state.current)
    return [
      [
        "Signature",
        `Not signed: the content changed after revision ${s.revision} was signed by ${s.signerName} on ${signedAt}; ` +
          `the signed revision no longer matches this content, which needs a new signature.`,
      ],
    ];
  return [
    ["Signed by", s.signerName],
    ["Licence or certification", s.licence],
    ["Statement", s.statement],
    ["Signed", signedAt],
    ["Content sha256", s.contentSha256],
    ["Revision", String(s.revision)],
  ];
}
