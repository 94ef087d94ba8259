import type { TendonEnd } from "@/lib/schemas/domain";
import type { FieldDisposition, FieldFlag, FieldPour, FieldProject, FieldTendon } from "@/lib/schemas/sync";
import { awaitingRestress, DETENSIONED_WORDS, tailClearance, type Clearance } from "@/lib/stressing/tail-clearance";
import type { LocalDetension, LocalLiftoffCheck, LocalRecord } from "./db";

/**
 * Why a tendon is held and what the crew is to do, in words, from the flags and the engineer's
 * dispositions the tablet pulled. Pure, so the list, the tendon panel and the tests agree.
 */

export type Decision = FieldDisposition["decision"];

/** What each disposition that orders work asks of the crew. Accept closes the flag. */
export const DECISION_INSTRUCTIONS: Record<Decision, string> = {
  accept: "Accepted by the engineer of record.",
  restress: "Restress this tendon as the engineer instructs, then log it with “Record a restress”.",
  detension_restress:
    "Detension this tendon as the engineer instructs and record it with “Record the detension”, then restress it and log the restress.",
  liftoff_check: "Do a lift-off check as the engineer instructs and report the lift-off gauge pressure.",
  replace: "Do not stress again or cut tails: the engineer orders this tendon replaced.",
  other: "Follow the engineer's instruction below.",
};

export const DECISION_WORDS: Record<Decision, string> = {
  accept: "accepted",
  restress: "restress ordered",
  detension_restress: "detension and restress ordered",
  liftoff_check: "lift-off check ordered",
  replace: "replacement ordered",
  other: "instruction from the engineer",
};

export const WAITING_INSTRUCTION = "Wait for the engineer of record's decision. Do not cut tails.";

export interface Hold {
  flagId: string;
  kind: string;
  status: string;
  /** Why the flag was raised; null when the tablet pulled it before reasons were synced. */
  reason: string | null;
  /** The engineer's latest decision on it, or null while none is recorded. */
  decision: FieldDisposition | null;
  /** What to do now, in words. */
  instruction: string;
}

export const isOpen = (f: Pick<FieldFlag, "status">) => f.status !== "closed";

/** The open flags of a tendon as holds, oldest first. */
export function holdsOf(flags: FieldFlag[]): Hold[] {
  return flags
    .filter(isOpen)
    .sort((a, b) => (a.createdAt ?? "").localeCompare(b.createdAt ?? ""))
    .map((f) => {
      const decision = f.dispositions?.at(-1) ?? null;
      return {
        flagId: f.id,
        kind: f.kind,
        status: f.status,
        reason: f.reason ?? null,
        decision,
        instruction: decision ? DECISION_INSTRUCTIONS[decision.decision] : WAITING_INSTRUCTION,
      };
    });
}

/** What the tablet holds of the follow-up work on a tendon, for the words of its hold. */
export interface FollowUps {
  liftoffChecks?: Pick<LocalLiftoffCheck, "dispositionId" | "checkedAt" | "withinBand" | "syncState">[];
  detensions?: Pick<LocalDetension, "dispositionId">[];
  /** Ends not stressed again since the last detension (`awaitingRestressOf`). */
  awaitingRestress?: readonly TendonEnd[];
}

/** How far the work an order asks for has come, in words; null while nothing has been done. */
function progressOf(decision: FieldDisposition, followUps: FollowUps): string | null {
  if (decision.decision === "liftoff_check") {
    const last = (followUps.liftoffChecks ?? [])
      .filter((c) => decision.id !== undefined && c.dispositionId === decision.id)
      .sort((a, b) => a.checkedAt.localeCompare(b.checkedAt))
      .at(-1);
    if (!last) return null;
    if (last.withinBand === true) return "lift-off within band: engineer to decide";
    if (last.withinBand === false) return "lift-off outside band: engineer to decide";
    return last.syncState === "pending" ? "lift-off check waiting to send" : "lift-off check needs attention";
  }
  if (decision.decision === "detension_restress") {
    const done = (followUps.detensions ?? []).some((d) => decision.id !== undefined && d.dispositionId === decision.id);
    return done ? "detensioned and restressed: waiting for the verdict" : null;
  }
  return null;
}

/**
 * One line for the tendon list: what holds the tendon, e.g. "restress ordered", "lift-off within
 * band: engineer to decide", "detensioned: restress required" or "waiting for the engineer".
 */
export function holdSummary(holds: Hold[], followUps: FollowUps = {}): string | null {
  if (followUps.awaitingRestress?.length) return DETENSIONED_WORDS;
  if (!holds.length) return null;
  const ordered = holds.find((h) => h.decision && h.decision.decision !== "accept");
  if (ordered?.decision) return progressOf(ordered.decision, followUps) ?? DECISION_WORDS[ordered.decision.decision];
  return holds.some((h) => h.status === "with_engineer") ? "with the engineer" : "waiting for the engineer";
}

/** The ends a detensioned tendon waits to be stressed again at, from the detensions and records on this tablet. */
export function awaitingRestressOf(
  tendon: Pick<FieldTendon, "ends">,
  detensions: Pick<LocalDetension, "detensionedAt">[],
  records: Pick<LocalRecord, "tendonEnd" | "deviceTime">[],
): TendonEnd[] {
  return awaitingRestress({
    ends: tendon.ends,
    detensionedAt: detensions.map((d) => d.detensionedAt),
    records: records.map((r) => ({ tendonEnd: r.tendonEnd, stressedAt: r.deviceTime })),
  });
}

/**
 * Whether the crew may cut a tendon's tails, from what this tablet holds: the shared rule
 * (lib/stressing/tail-clearance.ts) on the records the server has received and the flags of the
 * last sync, held also while a record waits to be sent (the server may flag it) or the tablet's
 * own check finds it out of band, and while the tablet does not know the concrete gate.
 */
export function cutClearanceOf(input: {
  tendon: Pick<FieldTendon, "ends">;
  records: Pick<LocalRecord, "tendonEnd" | "syncState">[];
  flags: FieldFlag[];
  heldOnTablet: boolean;
  /** Ends not stressed again since the tendon's last detension (`awaitingRestressOf`). */
  awaitingRestress?: readonly TendonEnd[];
  project: Pick<FieldProject, "requiredConcreteMPa" | "unitSystem">;
  pour: Pick<FieldPour, "concreteStrengthMPa">;
}): Clearance {
  const received = input.records.filter((r) => r.syncState === "synced");
  const open = input.flags.filter(isOpen);
  const shared = tailClearance({
    ends: input.tendon.ends,
    recordedEnds: [...new Set(received.map((r) => r.tendonEnd))],
    openFlags: open,
    requiredConcreteMPa: input.project.requiredConcreteMPa ?? null,
    concreteStrengthMPa: input.pour.concreteStrengthMPa ?? null,
    unitSystem: input.project.unitSystem,
    awaitingRestress: input.awaitingRestress,
  });
  const reasons = [...shared.reasons];
  if (input.records.some((r) => r.syncState !== "synced"))
    reasons.push("A record of this tendon has not reached the server yet: it judges the record first.");
  if (input.heldOnTablet && !open.length) reasons.push("This tablet's own check puts the tendon out of band.");
  const required = input.project.requiredConcreteMPa;
  if (required === undefined || (required !== null && input.pour.concreteStrengthMPa === undefined))
    reasons.push("The concrete gate is not on this tablet yet: sync with signal.");
  return { clear: reasons.length === 0, reasons };
}

/**
 * The flags that hold a tendon beside its elongation verdict on the tablet: none once every flag on
 * it is closed by a decision (`settled`); the server's flags once it has judged; before that, the
 * flags the tablet's own judge expects the server to raise (under force, a gauge off its target…).
 * An elongation in band with any of these is never shown green.
 */
export function verdictHolds(input: {
  settled: boolean;
  server: { flagKinds: string[] } | null | undefined;
  local: { flagKinds?: string[] } | null;
}): string[] {
  if (input.settled) return [];
  if (input.server) return input.server.flagKinds;
  return input.local?.flagKinds ?? [];
}

/**
 * What the verdict box tells the crew about the tails, after why the tendon is held: the order once
 * the engineer of record has given one, the disposition still awaited while some flag has none, and
 * the flag's closing at the next sync once every disposition accepts.
 */
export function heldUntil(holds: Hold[]): string {
  const ordered = holds.find((h) => h.decision && h.decision.decision !== "accept");
  if (ordered?.decision)
    return `The engineer of record's disposition: ${DECISION_WORDS[ordered.decision.decision]}. ${ordered.instruction} Tails and grout wait until the tendon is clear.`;
  if (!holds.length || holds.some((h) => !h.decision))
    return "Do not cut the tails or grout until the engineer of record gives a disposition.";
  return "Accepted by the engineer of record: the hold lifts when the next sync closes the flag. Do not cut the tails or grout until then.";
}
