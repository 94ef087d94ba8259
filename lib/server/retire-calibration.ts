import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";
import { reevaluateTendons } from "./reevaluate-project";

/** Locks a calibration of the project's set that still stands, or refuses with a message. */
export async function lockStandingCalibration(
  trx: Transaction<Database>,
  input: { projectId: string; setId: string; calibrationId: string },
) {
  const row = await trx
    .selectFrom("calibrations")
    .select(["id", "calibrated_on", "retired_at"])
    .where("project_id", "=", input.projectId)
    .where("equipment_set_id", "=", input.setId)
    .where("id", "=", input.calibrationId)
    .forUpdate()
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such calibration on this equipment set.");
  if (row.retired_at) throw new AppError("CONFLICT", "This calibration is already retired.");
  return row;
}

/**
 * Judges again the tendons whose records stand on a calibration of the set that was added, retired
 * or corrected: records of the set that named none (judged on the one in force on their day, which
 * the change may alter) and, for `calibrationId`, records that name it or a calibration it corrected.
 */
export async function reevaluateCalibrationUsers(
  trx: Kysely<Database>,
  input: { projectId: string; setId: string; calibrationId: string | null; reason: string },
): Promise<number> {
  const { calibrationId } = input;
  const touched = await trx
    .selectFrom("records")
    .select("tendon_id")
    .distinct()
    .where("project_id", "=", input.projectId)
    .where("equipment_set_id", "=", input.setId)
    .where((w) =>
      calibrationId === null
        ? w("calibration_id", "is", null)
        : w.or([
            w("calibration_id", "is", null),
            w("calibration_id", "=", calibrationId),
            w(
              "calibration_id",
              "in",
              w
                .selectFrom("calibrations")
                .select("id")
                .where("project_id", "=", input.projectId)
                .where("replaced_by", "=", calibrationId),
            ),
          ]),
    )
    .execute();
  if (!touched.length) return 0;
  const result = await reevaluateTendons(trx, {
    projectId: input.projectId,
    tendonIds: touched.map((t) => t.tendon_id),
    reason: input.reason,
  });
  return result.reevaluated;
}

/**
 * Retires a calibration with a reason: it is never picked again (office or tablet), its figures
 * stay as they were, so stored evaluations keep the calibration they used, and the tendons that
 * stood on it are judged again (on the calibration then in force, or incomplete without one).
 */
export async function retireCalibration(
  db: Kysely<Database>,
  input: { projectId: string; setId: string; calibrationId: string; by: { id: string }; reason: string },
): Promise<{ reevaluated: number }> {
  return inTransaction(db, async (trx) => {
    const row = await lockStandingCalibration(trx, input);
    await trx
      .updateTable("calibrations")
      .set({ retired_at: new Date(), retired_reason: input.reason, retired_by: input.by.id })
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.calibrationId)
      .execute();
    const reevaluated = await reevaluateCalibrationUsers(trx, {
      ...input,
      reason: `calibration of ${row.calibrated_on} retired: ${input.reason}`,
    });
    await recordAudit(trx, {
      action: "calibration.retire",
      outcome: "success",
      actorUserId: input.by.id,
      projectId: input.projectId,
      target: `calibration:${input.calibrationId}`,
      detail: { reason: input.reason, reevaluated },
    });
    return { reevaluated };
  });
}
