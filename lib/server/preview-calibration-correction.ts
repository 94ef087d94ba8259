import "server-only";
import type { Db } from "@/db/connect";
import type { CalibrationInput } from "@/lib/schemas/calibration";
import { addCalibration } from "./add-calibration";
import { correctCalibration, type CalibrationCorrection } from "./correct-calibration";
import { trialRejudging, type RejudgePreview } from "./preview-rejudging";
import { retireCalibration } from "./retire-calibration";

export type CalibrationCorrectionPreview = RejudgePreview;

/**
 * What correcting a calibration would do to the stored verdicts, without writing anything: the
 * correction runs exactly as it would (same checks, same fit, same re-judging) inside a transaction
 * that is rolled back, and the tendons' latest verdicts and the flags before and after are compared.
 * What the admin sees before pressing Correct a second time, as the settings screen does for its
 * preview. Bad figures, a future date or a retired calibration are refused exactly as the correction is.
 */
export function previewCalibrationCorrection(db: Db, input: CalibrationCorrection): Promise<RejudgePreview> {
  return trialRejudging(db, input.projectId, (trx) => correctCalibration(trx, input));
}

/**
 * What adding a calibration would do: records of the set that named no calibration are judged on
 * the one in force on their day, which the new one may now be. Run and rolled back like the
 * correction's preview; refused as the addition is (a future date, points that make no line).
 */
export function previewAddCalibration(
  db: Db,
  input: { projectId: string; setId: string; values: CalibrationInput },
): Promise<RejudgePreview> {
  return trialRejudging(db, input.projectId, (trx) => addCalibration(trx, input));
}

/**
 * What retiring a calibration would do: the tendons that stood on it are judged on the calibration
 * then in force, or without one. Run and rolled back like the correction's preview; a calibration
 * already retired or not of this set is refused as the retirement is.
 */
export function previewCalibrationRetirement(
  db: Db,
  input: { projectId: string; setId: string; calibrationId: string; by: { id: string }; reason: string },
): Promise<RejudgePreview> {
  return trialRejudging(db, input.projectId, (trx) => retireCalibration(trx, input));
}
