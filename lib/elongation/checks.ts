import { InputError, optionalPositive, requirePositive, requirePositiveInteger } from "./errors";
import { ANCHORAGE_LIMIT_FPU_FRACTION, JACKING_LIMIT_FPU_FRACTION } from "./limits";

/** Closed set of things the computation flags for a person to look at. */
export const CHECK_CODES = [
  "jacking-over-limit", // jacking force above 0.80·fpu·A
  "jacking-over-equipment", // jacking force above the equipment set's rated maximum
  "anchor-over-limit", // force at the anchor after seating above 0.70·fpu·A
  "calibration-few-points", // calibration fitted through fewer than three points
  "calibration-poor-fit", // calibration r² below 0.99
  "reading-outside-calibration", // gauge pressure outside the calibrated range
  "elongation-not-positive", // measured elongation zero or negative
] as const;

export type CheckCode = (typeof CHECK_CODES)[number];

/** Tells a screen how to format `value` and `limit` (N, MPa, mm or a plain number). */
export type CheckQuantity = "force" | "pressure" | "length" | "count" | "ratio";

export interface Check {
  code: CheckCode;
  /** Plain-language fallback in SI; screens format value and limit in the project's units. */
  message: string;
  value: number;
  limit: number;
  quantity: CheckQuantity;
}

// A force set exactly at the limit in one unit system comes back a few ulps above it after
// conversion; "above" means above by more than that noise.
const LIMIT_NOISE = 1e-9;

export function exceeds(value: number, limit: number): boolean {
  return value > limit * (1 + LIMIT_NOISE);
}

const kN = (n: number): string => `${(n / 1000).toFixed(1)} kN`;

export type StrandStrength =
  | { breakingLoadPerStrandN: number; fpuMPa?: undefined; strandAreaMm2?: undefined }
  | { fpuMPa: number; strandAreaMm2: number; breakingLoadPerStrandN?: undefined };

export type StressLimitInput = StrandStrength & {
  strandCount: number;
  jackingForceN: number;
  anchorForceAfterN?: number;
  /** The equipment set's rated maximum force, when known. */
  equipmentMaxForceN?: number;
};

export interface StressLimits {
  /** fpu·A for the whole tendon. */
  breakingLoadN: number;
  jackingLimitN: number;
  anchorLimitN: number;
}

export function stressLimits(input: StrandStrength & { strandCount: number }): StressLimits {
  const strands = requirePositiveInteger(input.strandCount, "strandCount");
  let perStrand: number;
  if (input.breakingLoadPerStrandN !== undefined) {
    perStrand = requirePositive(input.breakingLoadPerStrandN, "breakingLoadPerStrandN");
  } else if (input.fpuMPa !== undefined) {
    perStrand = requirePositive(input.fpuMPa, "fpuMPa") * requirePositive(input.strandAreaMm2, "strandAreaMm2");
  } else {
    throw new InputError(
      "breakingLoadPerStrandN",
      "required",
      "give the breaking load per strand, or fpu and the strand area",
    );
  }
  const breakingLoadN = perStrand * strands;
  return {
    breakingLoadN,
    jackingLimitN: JACKING_LIMIT_FPU_FRACTION * breakingLoadN,
    anchorLimitN: ANCHORAGE_LIMIT_FPU_FRACTION * breakingLoadN,
  };
}

/**
 * The one jacking rule: a force above 0.80·fpu·A (ACI 318-19 Table 20.3.2.5.1, from memory). The
 * flag on the force reached and the refusal of a schedule's specified force both ask it.
 */
export function jackingAboveLimit(jackingForceN: number, limits: Pick<StressLimits, "jackingLimitN">): boolean {
  return exceeds(jackingForceN, limits.jackingLimitN);
}

/** Jacking and anchorage force limits (ACI 318-19 Table 20.3.2.5.1), and the equipment maximum. */
export function checkStressLimits(input: StressLimitInput): Check[] {
  const limits = stressLimits(input);
  const jackingForceN = requirePositive(input.jackingForceN, "jackingForceN");
  const anchorForceAfterN = optionalPositive(input.anchorForceAfterN, "anchorForceAfterN");
  const equipmentMaxForceN = optionalPositive(input.equipmentMaxForceN, "equipmentMaxForceN");
  const checks: Check[] = [];

  if (jackingAboveLimit(jackingForceN, limits)) {
    checks.push({
      code: "jacking-over-limit",
      message: `Jacking force ${kN(jackingForceN)} is above 0.80·fpu·A = ${kN(limits.jackingLimitN)}.`,
      value: jackingForceN,
      limit: limits.jackingLimitN,
      quantity: "force",
    });
  }
  if (equipmentMaxForceN !== undefined && exceeds(jackingForceN, equipmentMaxForceN)) {
    checks.push({
      code: "jacking-over-equipment",
      message: `Jacking force ${kN(jackingForceN)} is above the equipment's rated ${kN(equipmentMaxForceN)}.`,
      value: jackingForceN,
      limit: equipmentMaxForceN,
      quantity: "force",
    });
  }
  if (anchorForceAfterN !== undefined && exceeds(anchorForceAfterN, limits.anchorLimitN)) {
    checks.push({
      code: "anchor-over-limit",
      message: `Force at the anchor after seating ${kN(anchorForceAfterN)} is above 0.70·fpu·A = ${kN(limits.anchorLimitN)}.`,
      value: anchorForceAfterN,
      limit: limits.anchorLimitN,
      quantity: "force",
    });
  }
  return checks;
}
