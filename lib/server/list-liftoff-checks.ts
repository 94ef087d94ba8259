import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * A project's lift-off checks as the server judged them, with who made each, the equipment set and
 * the calibration used, and the columns every reader shows; a reader adds its filter (a tendon, a
 * pour), its own columns and its order. Each check names the disposition that ordered it and the
 * flag it raised when outside the band.
 */
export function selectLiftoffChecks(db: Kysely<Database>, projectId: string) {
  return db
    .selectFrom("liftoff_checks")
    .innerJoin("users", "users.id", "liftoff_checks.checked_by")
    .innerJoin("equipment_sets", (j) =>
      j
        .onRef("equipment_sets.id", "=", "liftoff_checks.equipment_set_id")
        .onRef("equipment_sets.project_id", "=", "liftoff_checks.project_id"),
    )
    .innerJoin("calibrations", (j) =>
      j
        .onRef("calibrations.id", "=", "liftoff_checks.calibration_id")
        .onRef("calibrations.project_id", "=", "liftoff_checks.project_id"),
    )
    .select([
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
    ])
    .where("liftoff_checks.project_id", "=", projectId);
}

/**
 * A tendon's lift-off checks, oldest first. For the engineer's tendon page, beside the
 * disposition.
 */
export async function listLiftoffChecks(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  return selectLiftoffChecks(db, input.projectId)
    .select([
      "liftoff_checks.id",
      "liftoff_checks.received_at",
      "users.name as checkedBy",
      "equipment_sets.name as equipmentSet",
      "calibrations.calibrated_on as calibratedOn",
    ])
    .where("liftoff_checks.tendon_id", "=", input.tendonId)
    .orderBy("liftoff_checks.checked_at")
    .execute();
}
