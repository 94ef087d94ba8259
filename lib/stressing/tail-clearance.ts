/**
 * Whether a tendon's strand tails may be cut: a step nobody can take back. Pure, so the tablet
 * (from what it pulled) and the server (when a cut arrives) decide with the same rule.
 *
 * Clear only when every flag on the tendon is closed, every end the schedule stresses has a
 * record, and the concrete gate is met (the same gate as the concrete rule: the pour's confirmed
 * strength at least the project's required strength; no requirement set means no gate). A tendon
 * detensioned on the engineer's order stays held ("detensioned: restress required") until every end
 * it is stressed from has a record made after the detension (`awaitingRestress`).
 */

import { showStrength } from "@/lib/format/quantities";
import type { StressingEnds, TendonEnd, UnitSystem } from "@/lib/schemas/domain";
import { stressedEnds } from "./basis";

export interface ClearanceInput {
  ends: StressingEnds;
  /** Ends that have at least one stored record. */
  recordedEnds: readonly TendonEnd[];
  /** Flags on the tendon that are not closed. */
  openFlags: readonly { kind: string }[];
  requiredConcreteMPa: number | null;
  concreteStrengthMPa: number | null;
  /** The project's units for the strengths in the reasons (SI when not given). */
  unitSystem?: UnitSystem;
  /** Ends not stressed again since the tendon's last detension (`awaitingRestress`); empty or absent when none. */
  awaitingRestress?: readonly TendonEnd[];
}

export const DETENSIONED_WORDS = "detensioned: restress required";

/**
 * The ends a detensioned tendon still waits to be stressed again at: every end the schedule
 * stresses that has no record made (device time) after the latest detension. Empty when the
 * tendon was never detensioned or has been stressed again at every end.
 */
export function awaitingRestress(input: {
  ends: StressingEnds;
  detensionedAt: readonly string[];
  records: readonly { tendonEnd: TendonEnd; stressedAt: string }[];
}): TendonEnd[] {
  if (!input.detensionedAt.length) return [];
  const last = Math.max(...input.detensionedAt.map((t) => new Date(t).getTime()));
  return stressedEnds(input.ends).filter(
    (end) => !input.records.some((r) => r.tendonEnd === end && new Date(r.stressedAt).getTime() > last),
  );
}

export interface Clearance {
  clear: boolean;
  /** Why the tendon is held, in words; empty when clear. */
  reasons: string[];
}

export function tailClearance(input: ClearanceInput): Clearance {
  const reasons: string[] = [];
  const open = input.openFlags.length;
  if (open) reasons.push(open === 1 ? "1 flag is still open." : `${open} flags are still open.`);
  const waiting = input.awaitingRestress ?? [];
  if (waiting.length)
    reasons.push(`Detensioned: restress required (no record since the detension at end ${waiting.join(" and ")}).`);
  const missing = stressedEnds(input.ends).filter((e) => !input.recordedEnds.includes(e));
  if (missing.length) reasons.push(`No record yet for end ${missing.join(" and ")}.`);
  const required = input.requiredConcreteMPa;
  if (required !== null) {
    const strength = input.concreteStrengthMPa;
    const show = (mpa: number) => showStrength({ unitSystem: input.unitSystem ?? "si" }, mpa);
    if (strength === null) reasons.push(`Concrete strength not confirmed (${show(required)} required).`);
    else if (strength < required)
      reasons.push(`Confirmed concrete strength ${show(strength)} is below the ${show(required)} required.`);
  }
  return { clear: reasons.length === 0, reasons };
}
