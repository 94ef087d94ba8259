import "server-only";
import type { Db } from "@/db/connect";
import type { CalibrationInput } from "@/lib/schemas/calibration";
import { addCalibration } from "./add-calibration";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";
import { lockStandingCalibration, reevaluateCalibrationUsers } from "./retire-calibration";

/** A correction of a standing calibration: its corrected figures and why, by whom. */
export interface CalibrationCorrection {
  projectId: string;
  setId: string;
  calibrationId: string;
  by: { id: string };
  reason: string;
  values: CalibrationInput;
}

/**
 * Corrects a calibration typed wrong: the corrected figures become a new calibration of the set
 * (fitted and dated like any other) and the old one is retired naming it, with the reason. The old
 * row is never changed, so stored evaluations keep the calibration they used; records that named
 * the old one are judged again on the correction.
 */
export async function correctCalibration(
  db: Db,
  input: CalibrationCorrection,
): Promise<{ calibrationId: string; validUntil: string; r2: number; warnings: string[]; reevaluated: number }> {
  return inTransaction(db, async (trx) => {
    const old = await lockStandingCalibration(trx, input);
    const added = await addCalibration(trx, {
      projectId: input.projectId,
      setId: input.setId,
      values: input.values,
      reevaluate: false,
    });
    await trx
      .updateTable("calibrations")
      .set({
        retired_at: new Date(),
        retired_reason: `Corrected: ${input.reason}`,
        retired_by: input.by.id,
        replaced_by: added.calibrationId,
      })
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.calibrationId)
      .execute();
    const reevaluated = await reevaluateCalibrationUsers(trx, {
      projectId: input.projectId,
      setId: input.setId,
      calibrationId: added.calibrationId,
      reason: `calibration of ${old.calibrated_on} corrected: ${input.reason}`,
    });
    await recordAudit(trx, {
      action: "calibration.correct",
      outcome: "success",
      actorUserId: input.by.id,
      projectId: input.projectId,
      target: `calibration:${input.calibrationId}`,
      detail: { reason: input.reason, replacedBy: added.calibrationId, reevaluated },
    });
    return { ...added, reevaluated };
  });
}
