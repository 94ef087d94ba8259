import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * A tendon's lift-off checks as the server judged them, oldest first, with who made each and the
 * equipment set and calibration used; each names the disposition that ordered it and the flag it
 * raised when outside the band. For the engineer's tendon page, beside the disposition.
 */
export async function listLiftoffChecks(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  return db
    .selectFrom("liftoff_checks")
    .innerJoin("users", "users.id", "liftoff_checks.checked_by")
    .innerJoin("equipment_sets", (j) =>
      j
        .onRef("equipment_sets.id", "=", "liftoff_checks.equipment_set_id")
        .onRef("equipment_sets.project_id", "=", "liftoff_checks.project_id"),
    )
    .innerJoin("calibrations", "calibrations.id", "liftoff_checks.calibration_id")
    .select([
      "liftoff_checks.id",
      "liftoff_checks.disposition_id",
      "liftoff_checks.tendon_end",
      "liftoff_checks.entered",
      "liftoff_checks.pressure_mpa",
      "liftoff_checks.liftoff_force_n",
      "liftoff_checks.expected_force_n",
      "liftoff_checks.deviation_pct",
      "liftoff_checks.band_pct",
      "liftoff_checks.within_band",
      "liftoff_checks.raised_flag_id",
      "liftoff_checks.checked_at",
      "liftoff_checks.received_at",
      "users.name as checkedBy",
      "equipment_sets.name as equipmentSet",
      "calibrations.calibrated_on as calibratedOn",
    ])
    .where("liftoff_checks.project_id", "=", input.projectId)
    .where("liftoff_checks.tendon_id", "=", input.tendonId)
    .orderBy("liftoff_checks.checked_at")
    .execute();
}
