import {
  InputError,
  optionalPositive,
  requireFinite,
  requireNonNegative,
  requirePositive,
  requirePositiveInteger,
} from "./errors";
import { fitLine } from "./least-squares";

/**
 * Reading taken from an initial force Pi (the reference mark set at, say, 20 %) brought to the
 * elongation from zero. Valid because the elongation is linear in force; the slack taken up
 * below Pi is what this leaves out on purpose.
 *
 * - Gross (ram travel, read at the jacking force before seating): m·Pj/(Pj − Pi).
 * - Net (marks read after lock-off, `seatingMm` given): the reading already lost the seating, so
 *   the part proportional to force is m + set; the total on the same net basis is
 *   (m + set)·Pj/(Pj − Pi) − set. Scaling the net reading alone would scale the seating too and
 *   judge a perfect tendon short.
 */
export function totalFromInitial(input: {
  measuredMm: number;
  initialForceN: number;
  jackingForceN: number;
  /** Seating (anchor set) the reading lost after lock-off; given only on the net basis. */
  seatingMm?: number;
}): number {
  const measuredMm = requireFinite(input.measuredMm, "measuredMm");
  const initialForceN = requireNonNegative(input.initialForceN, "initialForceN");
  const jackingForceN = requirePositive(input.jackingForceN, "jackingForceN");
  const seatingMm = input.seatingMm === undefined ? 0 : requireNonNegative(input.seatingMm, "seatingMm");
  if (initialForceN >= jackingForceN) {
    throw new InputError("initialForceN", "out-of-range", "initial force must be below the jacking force");
  }
  if (initialForceN === 0) return measuredMm;
  return ((measuredMm + seatingMm) * jackingForceN) / (jackingForceN - initialForceN) - seatingMm;
}

export interface GaugeStep {
  forceN: number;
  /** Ram or mark reading at that force, from any fixed origin. */
  readingMm: number;
}

export interface ApparentStiffness {
  /** Slope of force against reading: the tendon's apparent A·E/L, N per mm. */
  stiffnessNPerMm: number;
  r2: number;
  /** slope·L/A: the modulus the tendon behaved as if it had. */
  apparentModulusMPa: number;
  /** The mill-certificate value, passed through so a screen shows the two side by side. */
  millModulusMPa: number | null;
  /** apparent / mill. Friction alone makes this above 1 (less strand stretches per unit force). */
  modulusRatio: number | null;
  /** Reading where the fitted line reaches zero force: the slack-free zero. */
  zeroReadingMm: number;
  /** Reading at the highest-force step less the slack-free zero. */
  elongationFromZeroMm: number;
}

/**
 * Least-squares line through several gauge steps (force against reading). Readings below the
 * first step carry slack and dead-end seating, so the line's intercept, not the first reading,
 * gives the zero.
 */
export function fitApparentStiffness(input: {
  steps: readonly GaugeStep[];
  lengthMm: number;
  strandAreaMm2: number;
  strandCount: number;
  millModulusMPa?: number;
}): ApparentStiffness {
  const { steps } = input;
  if (!Array.isArray(steps) || steps.length < 2) {
    throw new InputError("steps", "too-few", "need at least two gauge steps to fit a line");
  }
  const lengthMm = requirePositive(input.lengthMm, "lengthMm");
  const areaMm2 =
    requirePositive(input.strandAreaMm2, "strandAreaMm2") * requirePositiveInteger(input.strandCount, "strandCount");
  const millModulusMPa = optionalPositive(input.millModulusMPa, "millModulusMPa") ?? null;

  const readings: number[] = [];
  const forces: number[] = [];
  let topIndex = 0;
  steps.forEach((step, i) => {
    if (step === null || typeof step !== "object") throw new InputError(`steps[${i}]`, "required", "step is missing");
    readings.push(requireFinite(step.readingMm, `steps[${i}].readingMm`));
    forces.push(requireNonNegative(step.forceN, `steps[${i}].forceN`));
    if (forces[i]! > forces[topIndex]!) topIndex = i;
  });
  if (Math.min(...readings) === Math.max(...readings)) {
    throw new InputError("steps", "out-of-range", "readings did not change between steps");
  }

  const { slope, intercept, r2 } = fitLine(readings, forces);
  if (!(slope > 0)) throw new InputError("steps", "out-of-range", "force must rise as the strand elongates");
  const apparentModulusMPa = (slope * lengthMm) / areaMm2;
  const zeroReadingMm = -intercept / slope;
  return {
    stiffnessNPerMm: slope,
    r2,
    apparentModulusMPa,
    millModulusMPa,
    modulusRatio: millModulusMPa === null ? null : apparentModulusMPa / millModulusMPa,
    zeroReadingMm,
    elongationFromZeroMm: readings[topIndex]! - zeroReadingMm,
  };
}

export interface StepExtrapolation {
  /** The reading brought to zero force: the typed elongation plus what the line puts below its reference. */
  totalMm: number;
  /** Elongation between zero force and the reference force, on the fitted line: referenceForce ÷ stiffness. */
  belowReferenceMm: number;
  /** Slope of force against reading, N per mm (the engine's `fitApparentStiffness` line). */
  stiffnessNPerMm: number;
  /** Reading where the fitted line reaches zero force. */
  zeroReadingMm: number;
  r2: number;
}

/**
 * Several gauge steps generalise the single initial reading: the least-squares line of force
 * against reading (the same line `fitApparentStiffness` draws) gives the elongation below the
 * reference force the elongation was read from, `Fref ÷ stiffness`, which is added to the reading.
 * On either basis the seating is not scaled: marks read after lock-off lost it after the pull, so
 * with two steps at Pi and Pj read m + set apart this is exactly `(m + set)·Pj/(Pj − Pi) − set`,
 * and ram travel read m apart gives `m·Pj/(Pj − Pi)`.
 */
export function totalFromSteps(input: {
  /** The elongation as read from the reference force (marks after lock-off, or strokes). */
  measuredMm: number;
  /** The force the elongation was read from (0 when read from zero: nothing is added). */
  referenceForceN: number;
  steps: readonly GaugeStep[];
}): StepExtrapolation {
  const measuredMm = requireFinite(input.measuredMm, "measuredMm");
  const referenceForceN = requireNonNegative(input.referenceForceN, "referenceForceN");
  const { steps } = input;
  if (!Array.isArray(steps) || steps.length < 2) {
    throw new InputError("steps", "too-few", "need at least two gauge steps to fit a line");
  }
  const readings: number[] = [];
  const forces: number[] = [];
  steps.forEach((step, i) => {
    if (step === null || typeof step !== "object") throw new InputError(`steps[${i}]`, "required", "step is missing");
    readings.push(requireFinite(step.readingMm, `steps[${i}].readingMm`));
    forces.push(requireNonNegative(step.forceN, `steps[${i}].forceN`));
  });
  if (Math.min(...forces) === Math.max(...forces)) {
    throw new InputError("steps", "too-few", "need at least two different gauge pressures");
  }
  if (Math.min(...readings) === Math.max(...readings)) {
    throw new InputError("steps", "out-of-range", "readings did not change between steps");
  }
  const { slope, intercept, r2 } = fitLine(readings, forces);
  if (!(slope > 0)) throw new InputError("steps", "out-of-range", "force must rise as the strand elongates");
  const belowReferenceMm = referenceForceN / slope;
  return {
    totalMm: measuredMm + belowReferenceMm,
    belowReferenceMm,
    stiffnessNPerMm: slope,
    zeroReadingMm: -intercept / slope,
    r2,
  };
}
