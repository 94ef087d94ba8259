import type { Rule } from "./types";

/**
 * Stressed before the pour's concrete strength reached what the project requires. One flag per
 * pour, not per tendon: while the pour has an open concrete flag (raised by any of its tendons),
 * no other tendon raises another; results that confirm the strength close it
 * (lib/server/add-concrete-result.ts).
 */
export const concreteUnconfirmed: Rule = ({ input, judgement }) => {
  const required = input.project.requiredConcreteMpa ?? null;
  if (!judgement.ends.length || required === null || !input.pour || input.pour.concreteFlagOpen) return null;
  const strength = input.pour.concreteStrengthMpa;
  if (strength !== null && strength >= required) return null;
  return {
    kind: "concrete_unconfirmed",
    reason:
      strength === null
        ? `Stressed before the pour's concrete strength (${required} MPa required) was confirmed.`
        : `Confirmed concrete strength ${strength} MPa is below the ${required} MPa required before stressing.`,
    recordId: judgement.ends[0]!.record.id,
  };
};
