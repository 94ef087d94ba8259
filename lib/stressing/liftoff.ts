import { forceFromPressure } from "@/lib/elongation";
import { exceeds } from "@/lib/elongation/checks";
import type { DisplayUnits } from "@/lib/format/quantities";
import { showForce, showPressure } from "@/lib/format/quantities";
import type { StressingEnds, TendonEnd } from "@/lib/schemas/domain";
import { stressedEnds, type CalibrationLine, type TendonPrediction } from "./basis";

/**
 * The lift-off check an engineer orders (disposition liftoff_check): the crew pulls the jack on a
 * seated tendon until the wedges just lift off the anchor and reads the gauge. That pressure, on
 * the equipment set's calibration in force that day, is the force the tendon holds at the
 * anchorage. It is compared with the force the engine expects there after seating (the force
 * profile's after-seating line at that anchor), within the project's band (default ±5 %).
 * Pure and shared: the tablet checks the pressure before saving, the server judges.
 */

/** Default band on a lift-off force, ± % (projects.liftoff_band_pct). */
export const DEFAULT_LIFTOFF_BAND_PCT = 5;

export interface LiftoffJudgement {
  pressureMPa: number;
  liftoffForceN: number;
  expectedForceN: number;
  /** (lift-off − expected) / expected × 100. */
  deviationPct: number;
  bandPct: number;
  withinBand: boolean;
}

/** The fields of a lift-off check a problem can name. */
export type LiftoffField = "tendonEnd" | "pressure" | "equipmentSetId";

/** A lift-off check that cannot be judged, named by its field. */
export interface LiftoffProblem {
  field: LiftoffField;
  message: string;
}

/**
 * The force expected at one stressed end's anchorage after seating: the seating the engine found
 * at that end (the governing end or the other one of a two-end tendon), else, with no anchor set
 * in the basis, the jacking force itself (nothing is lost at the anchor).
 */
export function expectedAnchorForceN(
  predicted: Pick<TendonPrediction, "prediction" | "jackingForceN">,
  end: TendonEnd,
): number {
  const seating = predicted.prediction.seating;
  if (!seating) return predicted.jackingForceN;
  if (seating.end === end) return seating.anchorForceAfterN;
  if (seating.otherEnd?.end === end) return seating.otherEnd.anchorForceAfterN;
  return predicted.jackingForceN;
}

/** The end must be one the schedule stresses: a dead end has no wedges to lift. */
export function liftoffEndProblem(ends: StressingEnds, end: TendonEnd): LiftoffProblem | null {
  if (stressedEnds(ends).includes(end)) return null;
  return {
    field: "tendonEnd",
    message: `End ${end} is the dead end of this tendon; a lift-off check is made at a stressed end (${stressedEnds(ends).join(" or ")}).`,
  };
}

/** The lift-off pressure must lie within the range the set was calibrated over. */
export function liftoffPressureProblem(
  units: Pick<DisplayUnits, "unitSystem">,
  calibration: CalibrationLine,
  pressureMPa: number,
): LiftoffProblem | null {
  if (!(pressureMPa > 0)) return { field: "pressure", message: "The lift-off gauge pressure must be above zero." };
  const above = exceeds(pressureMPa, calibration.maxPressureMPa);
  const below = exceeds(calibration.minPressureMPa, pressureMPa);
  if (!above && !below) return null;
  return {
    field: "pressure",
    message:
      `${showPressure(units, pressureMPa)} is ${above ? "above" : "below"} the range this set was calibrated over ` +
      `(${showPressure(units, calibration.minPressureMPa)} to ${showPressure(units, calibration.maxPressureMPa)}): ` +
      "the force there is not known. Check the reading, or use a set calibrated over it.",
  };
}

/** Lift-off force against the expected anchor force, within ± bandPct. */
export function judgeLiftoff(input: {
  pressureMPa: number;
  calibration: CalibrationLine;
  expectedForceN: number;
  bandPct: number;
}): LiftoffJudgement {
  const liftoffForceN = forceFromPressure(input.calibration, input.pressureMPa);
  const deviationPct = ((liftoffForceN - input.expectedForceN) / input.expectedForceN) * 100;
  return {
    pressureMPa: input.pressureMPa,
    liftoffForceN,
    expectedForceN: input.expectedForceN,
    deviationPct,
    bandPct: input.bandPct,
    // A deviation exactly on the band edge is inside it (to rounding noise).
    withinBand: !exceeds(Math.abs(deviationPct), input.bandPct),
  };
}

/** The result in words, in the project's units, for the tablet, the tendon page and the flag. */
export function liftoffLine(units: Pick<DisplayUnits, "unitSystem">, j: Omit<LiftoffJudgement, "pressureMPa">): string {
  const sign = j.deviationPct >= 0 ? "+" : "−";
  return (
    `Lift-off ${showForce(units, j.liftoffForceN)} against ${showForce(units, j.expectedForceN)} expected after seating: ` +
    `${sign}${Math.abs(j.deviationPct).toFixed(1)} %, ${j.withinBand ? "within" : "outside"} the ±${j.bandPct} % band.`
  );
}
