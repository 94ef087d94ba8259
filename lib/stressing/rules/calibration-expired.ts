import type { Rule } from "./types";

/** A gauge used outside its calibration's dates on the stressing day (in the project's time zone). */
export const calibrationExpired: Rule = ({ input, judgement }) => {
  const bad = judgement.ends.filter((e) => e.calibrationExpired);
  if (!bad.length) return null;
  const reason = bad
    .map((e) => {
      const name = input.sets.find((s) => s.id === e.record.equipmentSetId)?.name ?? "The equipment set";
      return e.calibration
        ? `${name} was used on ${e.day}, outside its calibration (${e.calibration.calibratedOn} to ${e.calibration.validUntil}).` +
            (e.record.expiredCalibrationReason ? ` Crew's reason: ${e.record.expiredCalibrationReason}` : "")
        : `${name} had no calibration covering ${e.day}.`;
    })
    .join(" ");
  return { kind: "calibration_expired", reason, recordId: bad[0]!.record.id };
};
