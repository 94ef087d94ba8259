import type { Check } from "./checks";
import { optionalNonNegative, optionalPositive, requireFinite, requireNonNegative, requirePositive } from "./errors";
import type { Verdict } from "./types";

export interface ComparisonInput {
  measuredMm: number;
  predictedMm: number;
  tolerancePct: number;
  /** Absolute floor for short tendons: the band is never narrower than this. */
  floorMm?: number;
  /** When given, the force the measured elongation implies is reported. */
  jackingForceN?: number;
}

export interface Comparison {
  deviationPct: number;
  verdict: Verdict;
  /** Half-width of the band: max(tolerancePct/100·predicted, floorMm). */
  bandMm: number;
  lowerMm: number;
  upperMm: number;
  /** measured − predicted. */
  absoluteDeviationMm: number;
  /** Pj·measured/predicted, or null when no jacking force was given. */
  impliedForceN: number | null;
  /** elongation-not-positive when the measured value is zero or negative. */
  checks: Check[];
}

// Readings converted from fractional inches carry last-bit noise; a reading that is on the band
// edge on paper stays in band.
const EDGE_NOISE_MM = 1e-9;

export function bandHalfWidthMm(predictedMm: number, tolerancePct: number, floorMm = 0): number {
  return Math.max((tolerancePct / 100) * predictedMm, floorMm);
}

function verdictFor(measuredMm: number, predictedMm: number, bandMm: number): Verdict {
  const offset = measuredMm - predictedMm;
  if (offset > bandMm + EDGE_NOISE_MM) return "long";
  if (offset < -bandMm - EDGE_NOISE_MM) return "short";
  return "in band";
}

function readComparison(input: ComparisonInput) {
  return {
    measuredMm: requireFinite(input.measuredMm, "measuredMm"),
    predictedMm: requirePositive(input.predictedMm, "predictedMm"),
    tolerancePct: requireNonNegative(input.tolerancePct, "tolerancePct"),
    floorMm: optionalNonNegative(input.floorMm, "floorMm") ?? 0,
  };
}

/** deviation % = (measured − predicted)/predicted·100, judged against the project's band. */
export function compareElongation(input: ComparisonInput): Comparison {
  const { measuredMm, predictedMm, tolerancePct, floorMm } = readComparison(input);
  const jackingForceN = optionalPositive(input.jackingForceN, "jackingForceN");
  const bandMm = bandHalfWidthMm(predictedMm, tolerancePct, floorMm);
  const checks: Check[] = [];
  if (measuredMm <= 0) {
    checks.push({
      code: "elongation-not-positive",
      message: `Measured elongation ${measuredMm} mm is not positive; check the reading and its reference mark.`,
      value: measuredMm,
      limit: 0,
      quantity: "length",
    });
  }
  return {
    deviationPct: ((measuredMm - predictedMm) / predictedMm) * 100,
    verdict: verdictFor(measuredMm, predictedMm, bandMm),
    bandMm,
    lowerMm: predictedMm - bandMm,
    upperMm: predictedMm + bandMm,
    absoluteDeviationMm: measuredMm - predictedMm,
    impliedForceN: jackingForceN === undefined ? null : (jackingForceN * measuredMm) / predictedMm,
    checks,
  };
}

export interface ResolutionEffect {
  /** True when measured ± half a division falls on both sides of a band edge. */
  couldChangeVerdict: boolean;
  verdictAtLowMm: Verdict;
  verdictAtHighMm: Verdict;
}

/**
 * Whether the reading division alone could decide the verdict: a true value anywhere within
 * half a division of the reading would be read the same, so if that interval straddles a band
 * edge the verdict rests on rounding rather than on the tendon.
 */
export function resolutionEffect(input: ComparisonInput & { resolutionMm: number }): ResolutionEffect {
  const { measuredMm, predictedMm, tolerancePct, floorMm } = readComparison(input);
  const half = requirePositive(input.resolutionMm, "resolutionMm") / 2;
  const bandMm = bandHalfWidthMm(predictedMm, tolerancePct, floorMm);
  const verdictAtLowMm = verdictFor(measuredMm - half, predictedMm, bandMm);
  const verdictAtHighMm = verdictFor(measuredMm + half, predictedMm, bandMm);
  return { couldChangeVerdict: verdictAtLowMm !== verdictAtHighMm, verdictAtLowMm, verdictAtHighMm };
}
