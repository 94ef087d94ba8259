/**
 * The pour's confirmed concrete strength from the lab's results, by Tautline's rule:
 *
 * 1. Only the results at the latest test age count. Concrete gains strength with age, so an
 *    earlier break is superseded by a later one and never lowers it.
 * 2. At that age the confirmed strength is the average over every specimen: each result is the
 *    mean of its set, weighted by its specimen count.
 * 3. At least two specimens at that age are needed; with fewer the strength stays unconfirmed.
 *    (ACI 318-19 26.12.1.1 calls a strength test the average of at least two 6 × 12 in or three
 *    4 × 8 in cylinders: from memory. Its acceptance rule, 26.12.3, judges the specified 28-day
 *    strength over consecutive tests and is not the strength required before stressing, so it is
 *    not applied here.)
 *
 * The pour is cleared for stressing when the confirmed strength reaches the project's required
 * strength (projects.required_concrete_mpa); the engineer of record sets that figure.
 */

export interface ConcreteResult {
  strengthMPa: number;
  ageDays: number;
  specimenCount: number;
}

export const MIN_SPECIMENS = 2;

export interface ConfirmedStrength {
  /** The confirmed strength in MPa, or null while the results do not confirm one. */
  strengthMPa: number | null;
  /** The test age the figure comes from (null without results). */
  ageDays: number | null;
  specimens: number;
  /** In words, for the pour's page: why there is (or is not) a figure. */
  basis: string;
}

export function confirmedStrength(results: readonly ConcreteResult[]): ConfirmedStrength {
  if (!results.length) return { strengthMPa: null, ageDays: null, specimens: 0, basis: "No results entered." };
  const ageDays = Math.max(...results.map((r) => r.ageDays));
  const atAge = results.filter((r) => r.ageDays === ageDays);
  const specimens = atAge.reduce((n, r) => n + r.specimenCount, 0);
  if (specimens < MIN_SPECIMENS)
    return {
      strengthMPa: null,
      ageDays,
      specimens,
      basis: `Only ${specimens} specimen at ${ageDays} days: at least ${MIN_SPECIMENS} are needed.`,
    };
  const strengthMPa = atAge.reduce((s, r) => s + r.strengthMPa * r.specimenCount, 0) / specimens;
  return { strengthMPa, ageDays, specimens, basis: `Average of ${specimens} specimens at ${ageDays} days.` };
}

/** Whether the pour may be stressed: a confirmed strength at or above the required one. */
export function concreteGateMet(strengthMPa: number | null, requiredMPa: number | null): boolean {
  if (requiredMPa === null) return true;
  return strengthMPa !== null && strengthMPa >= requiredMPa;
}
