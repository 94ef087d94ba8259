import "server-only";
import { inTransaction } from "./in-transaction";
import { reevaluateCalibrationUsers } from "./retire-calibration";
import type { Db } from "@/db/connect";
import { fitCalibration, isInputError } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import { dayInZone, projectTimeZone } from "@/lib/format/dates";
import { addDays, type CalibrationInput } from "@/lib/schemas/calibration";
import { requireStoredAttachment } from "@/lib/storage";

/**
 * Adds a calibration to a set: the least-squares line through the points with its r², and the
 * expiry, which is the certificate's own or the project's validity period after the calibration
 * date, whichever comes first.
 */
export async function addCalibration(
  db: Db,
  input: {
    projectId: string;
    setId: string;
    values: CalibrationInput;
    /** False when the caller judges the tendons again itself (a correction). */
    reevaluate?: boolean;
    /** The site's day ("2026-12-03") the date is checked against; today in the project's zone by default. */
    today?: string;
  },
): Promise<{ calibrationId: string; validUntil: string; r2: number; warnings: string[] }> {
  const v = input.values;
  const [set, project] = await Promise.all([
    db
      .selectFrom("equipment_sets")
      .select("id")
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.setId)
      .executeTakeFirst(),
    db
      .selectFrom("projects")
      .select(["calibration_validity_days", "time_zone"])
      .where("id", "=", input.projectId)
      .executeTakeFirstOrThrow(),
  ]);
  if (!set) throw new AppError("NOT_FOUND", "No such equipment set on this project.");
  // The form's check only knows the day has begun somewhere on Earth; the site's own day decides.
  const siteToday = input.today ?? dayInZone(Date.now(), projectTimeZone(project));
  if (v.calibratedOn > siteToday) {
    const message = `The calibration date is after today on site (${siteToday}); give the day the set was calibrated.`;
    throw new AppError("INVALID_INPUT", message, { calibratedOn: [message] });
  }
  let fit;
  try {
    fit = fitCalibration(v.points);
  } catch (error) {
    if (isInputError(error))
      throw new AppError("INVALID_INPUT", `The calibration points do not make a line: ${error.message}.`, {
        points: [error.message],
      });
    throw error;
  }
  if (v.certificateAttachmentId) {
    await requireStoredAttachment(db, {
      projectId: input.projectId,
      attachmentId: v.certificateAttachmentId,
      purpose: "calibration_certificate",
      field: "certificateAttachmentId",
    });
  }
  const byRule = addDays(v.calibratedOn, project.calibration_validity_days);
  const validUntil = v.validUntil && v.validUntil < byRule ? v.validUntil : byRule;
  return inTransaction(db, async (trx) => {
    const row = await trx
      .insertInto("calibrations")
      .values({
        project_id: input.projectId,
        equipment_set_id: input.setId,
        calibrated_on: v.calibratedOn,
        valid_until: validUntil,
        points: JSON.stringify(v.points),
        slope_n_per_mpa: fit.slope,
        intercept_n: fit.intercept,
        r2: fit.r2,
        min_pressure_mpa: fit.minPressureMPa,
        max_pressure_mpa: fit.maxPressureMPa,
        laboratory: v.laboratory,
        certificate_attachment_id: v.certificateAttachmentId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    // Records that named no calibration are judged on the one in force on their day: a new one
    // may now be it, so their tendons are judged again.
    if (input.reevaluate !== false)
      await reevaluateCalibrationUsers(trx, {
        projectId: input.projectId,
        setId: input.setId,
        calibrationId: null,
        reason: `calibration of ${v.calibratedOn} added to the equipment set`,
      });
    return { calibrationId: row.id, validUntil, r2: fit.r2, warnings: fit.checks.map((c) => c.message) };
  });
}
