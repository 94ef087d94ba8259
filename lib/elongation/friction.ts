/**
 * Friction along a tendon: P(x) = Pj·e^-(K·x + μ·α(x)) (ACI 318-08 Eq. 18-1; AASHTO LRFD
 * 5.9.3.2.2b). Within a segment the angle change is taken as spread evenly over its length
 * (constant curvature), so the exponent β grows linearly along the segment and the force is a
 * pure exponential in x there.
 */

/** Exponent of one segment: β = K·L + μ·α, with K per metre and L in mm. */
export function segmentBeta(lengthMm: number, angleRad: number, wobblePerM: number, mu: number): number {
  return (wobblePerM * lengthMm) / 1000 + mu * angleRad;
}

// (1 − e^-β)/β must not lose its digits as β → 0. Below the limit a four-term series is used
// (truncation under β⁴/120 ≤ 8.4e-15); above it, 1 − e^-β is formed from the e^-β the walk
// needs anyway, and the cancellation costs at most 1.1e-16/β ≤ 1.1e-13 relative. Math.expm1
// would be exact to the last bit but costs about four Math.exp calls in V8, and the engine
// evaluates this once per segment per tendon; 1e-13 is far below anything measured on site.
const SERIES_LIMIT = 1e-3;

/** Mean force over start force for a segment with exponent β, given decay = e^-β. */
export function meanFactorFromDecay(beta: number, decay: number): number {
  if (beta < SERIES_LIMIT) return 1 - (beta / 2) * (1 - (beta / 3) * (1 - beta / 4));
  return (1 - decay) / beta;
}

/** (1 − e^-β)/β: the segment's mean force over its start force; 1 in the limit β → 0. */
export function meanForceFactor(beta: number): number {
  return meanFactorFromDecay(beta, Math.exp(-beta));
}
