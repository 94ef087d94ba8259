/**
 * Tendon elongation: prediction, gauge calibration, initial-stress extrapolation, comparison and
 * checks. Pure computation in SI base units (N, mm, mm², MPa, K per metre), the same code on the
 * tablet and on the server.
 */

/** Stored with every evaluation so a verdict can be traced to the code that produced it. */
export const ENGINE_VERSION = "tautline-elongation/1.0.0";

export { predictElongation } from "./predict";
export { forceProfile } from "./profile";
export type { ForceProfile, ForceProfilePoint } from "./profile";
export { COMPARISON_VERDICTS, STRESSED_ENDS, TENDON_ENDS } from "./types";
export type {
  ElongationPrediction,
  SeatingResult,
  StressedEndSeating,
  StressedEnds,
  TendonEnd,
  TendonInput,
  TendonSegment,
  Verdict,
} from "./types";

export { influenceLengthMm, mirrorLevelN, seatPolyline } from "./anchor-set";
export type { EndSeating, ForcePoint } from "./anchor-set";
export { meanForceFactor, segmentBeta } from "./friction";

export { checkReadingInCalibration, fitCalibration, forceFromPressure, pressureForForce } from "./calibration";
export type { CalibrationFit, CalibrationPoint } from "./calibration";
export { fitApparentStiffness, totalFromInitial, totalFromSteps } from "./initial-stress";
export type { ApparentStiffness, GaugeStep, StepExtrapolation } from "./initial-stress";

export { bandHalfWidthMm, compareElongation, resolutionEffect } from "./compare";
export type { Comparison, ComparisonInput, ResolutionEffect } from "./compare";

export { CHECK_CODES, checkStressLimits, jackingAboveLimit, stressLimits } from "./checks";
export type { Check, CheckCode, CheckQuantity, StrandStrength, StressLimitInput, StressLimits } from "./checks";
export * from "./limits";
export { ASTM_A416_GRADE_270, DEFAULT_STRAND_MODULUS_MPA, findStrandSize, GRADE_270_FPU_MPA } from "./strands";
export type { StrandSize } from "./strands";
export { InputError, INPUT_ERROR_CODES, isInputError } from "./errors";
export type { InputErrorCode } from "./errors";
