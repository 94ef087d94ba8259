import { showPressure } from "@/lib/format/quantities";
import type { Rule } from "./types";

/** A gauge reading outside the range the calibration was made over: the force there is not known. */
export const calibrationRange: Rule = ({ input, judgement }) => {
  const bad = judgement.ends.filter((e) => e.outsideRangeMPa.length && e.calibration);
  if (!bad.length) return null;
  const p = input.project;
  return {
    kind: "calibration_range",
    reason: bad
      .map(
        (e) =>
          `Gauge reading ${e.outsideRangeMPa.map((v) => showPressure(p, v)).join(", ")} at end ${e.end} is outside the calibrated range ${showPressure(p, e.calibration!.minPressureMPa)} to ${showPressure(p, e.calibration!.maxPressureMPa)}.`,
      )
      .join(" "),
    recordId: bad[0]!.record.id,
  };
};
