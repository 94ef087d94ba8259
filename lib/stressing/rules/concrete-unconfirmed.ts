import { showStrength } from "@/lib/format/quantities";
import type { Rule } from "./types";

/**
 * Stressed before the pour's concrete strength reached what the project requires. One flag per
 * pour, not per tendon: while the pour has an open concrete flag (raised by any of its tendons),
 * no other tendon raises another; results that confirm the strength close it
 * (lib/server/add-concrete-result.ts). The flag quotes the crew's reason to go ahead, as the
 * tablet asked for it with the record, or says that none came.
 */
export const concreteUnconfirmed: Rule = ({ input, judgement }) => {
  const required = input.project.requiredConcreteMPa ?? null;
  if (!judgement.ends.length || required === null || !input.pour || input.pour.concreteFlagOpen) return null;
  const strength = input.pour.concreteStrengthMPa;
  if (strength !== null && strength >= required) return null;
  const show = (mpa: number) => showStrength(input.project, mpa);
  const goAhead = [
    ...new Set(judgement.ends.flatMap((e) => (e.record.concreteGoAhead ? [e.record.concreteGoAhead] : []))),
  ];
  const crew = goAhead.length
    ? ` Crew's reason to go ahead: ${goAhead.join(" / ")}`
    : " No reason to go ahead came with the record.";
  return {
    kind: "concrete_unconfirmed",
    reason:
      (strength === null
        ? `Stressed before the pour's concrete strength (${show(required)} required) was confirmed.`
        : `Confirmed concrete strength ${show(strength)} is below the ${show(required)} required before stressing.`) +
      crew,
    recordId: judgement.ends[0]!.record.id,
  };
};
