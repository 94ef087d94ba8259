import { type Check, exceeds } from "./checks";
import { InputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import { fitLine } from "./least-squares";
import { MIN_CALIBRATION_POINTS, MIN_CALIBRATION_R2 } from "./limits";

export interface CalibrationPoint {
  pressureMPa: number;
  forceN: number;
}

/** force = slope·pressure + intercept, fitted to an equipment set's load-cell readings. */
export interface CalibrationFit {
  /** N per MPa (the effective ram area, less friction). */
  slope: number;
  /** N at zero pressure. */
  intercept: number;
  r2: number;
  pointCount: number;
  minPressureMPa: number;
  maxPressureMPa: number;
  /** calibration-few-points and calibration-poor-fit, when they apply. */
  checks: Check[];
}

export function fitCalibration(points: readonly CalibrationPoint[]): CalibrationFit {
  if (!Array.isArray(points) || points.length < 2) {
    throw new InputError("points", "too-few", "a calibration needs at least two points to fit a line");
  }
  const pressures: number[] = [];
  const forces: number[] = [];
  points.forEach((point, i) => {
    if (point === null || typeof point !== "object")
      throw new InputError(`points[${i}]`, "required", "point is missing");
    pressures.push(requireNonNegative(point.pressureMPa, `points[${i}].pressureMPa`));
    forces.push(requireNonNegative(point.forceN, `points[${i}].forceN`));
  });
  const minPressureMPa = Math.min(...pressures);
  const maxPressureMPa = Math.max(...pressures);
  if (minPressureMPa === maxPressureMPa) {
    throw new InputError("points", "out-of-range", "calibration points must be at different pressures");
  }

  const { slope, intercept, r2 } = fitLine(pressures, forces);
  if (!(slope > 0)) throw new InputError("points", "out-of-range", "force must rise with pressure in a calibration");

  const checks: Check[] = [];
  if (points.length < MIN_CALIBRATION_POINTS) {
    checks.push({
      code: "calibration-few-points",
      message: `Calibration has ${points.length} points; at least ${MIN_CALIBRATION_POINTS} are needed to show a bad one.`,
      value: points.length,
      limit: MIN_CALIBRATION_POINTS,
      quantity: "count",
    });
  }
  if (r2 < MIN_CALIBRATION_R2) {
    checks.push({
      code: "calibration-poor-fit",
      message: `Calibration line fits with r² = ${r2.toFixed(4)}, below ${MIN_CALIBRATION_R2}.`,
      value: r2,
      limit: MIN_CALIBRATION_R2,
      quantity: "ratio",
    });
  }
  return { slope, intercept, r2, pointCount: points.length, minPressureMPa, maxPressureMPa, checks };
}

type LineOnly = Pick<CalibrationFit, "slope" | "intercept">;

function checkedLine(fit: LineOnly): LineOnly {
  return { slope: requirePositive(fit.slope, "fit.slope"), intercept: requireFinite(fit.intercept, "fit.intercept") };
}

export function forceFromPressure(fit: LineOnly, pressureMPa: number): number {
  const line = checkedLine(fit);
  return line.slope * requireNonNegative(pressureMPa, "pressureMPa") + line.intercept;
}

/** Target gauge pressure for a force, from the same fitted line. */
export function pressureForForce(fit: LineOnly, forceN: number): number {
  const line = checkedLine(fit);
  return (requirePositive(forceN, "forceN") - line.intercept) / line.slope;
}

/** Flags a gauge reading outside the range the calibration was made over (the line is not known there). */
export function checkReadingInCalibration(
  fit: Pick<CalibrationFit, "minPressureMPa" | "maxPressureMPa">,
  pressureMPa: number,
  field = "pressureMPa",
): Check[] {
  const pressure = requireNonNegative(pressureMPa, field);
  const min = requireNonNegative(fit.minPressureMPa, "fit.minPressureMPa");
  const max = requireNonNegative(fit.maxPressureMPa, "fit.maxPressureMPa");
  const above = exceeds(pressure, max);
  if (!above && !exceeds(min, pressure)) return [];
  const limit = above ? max : min;
  return [
    {
      code: "reading-outside-calibration",
      message: `Gauge reading ${pressure.toFixed(2)} MPa is ${above ? "above" : "below"} the calibrated range ${min.toFixed(2)}–${max.toFixed(2)} MPa.`,
      value: pressure,
      limit,
      quantity: "pressure",
    },
  ];
}
