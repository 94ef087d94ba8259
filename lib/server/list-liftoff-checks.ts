import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { qualified } from "@/lib/schemas/columns";
import { LIFTOFF_CHECK_COLUMNS, liftoffCheckFromRow, type LiftoffCheck } from "@/lib/schemas/liftoff";

/**
 * A project's lift-off checks as the server judged them, with who made each, the equipment set and
 * the calibration used, and the columns of the one DTO (`liftoffCheckFromRow`); a reader adds its filter (a tendon, a
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
    .select([...qualified("liftoff_checks", LIFTOFF_CHECK_COLUMNS), "users.name as checked_by_name"])
    .where("liftoff_checks.project_id", "=", projectId);
}

/** A lift-off check on the engineer's tendon page: the one DTO with its set's name and its calibration's date. */
export interface LiftoffCheckView extends LiftoffCheck {
  equipmentSet: string;
  /** YYYY-MM-DD. */
  calibratedOn: string;
}

/**
 * A tendon's lift-off checks, oldest first. For the engineer's tendon page, beside the
 * disposition.
 */
export async function listLiftoffChecks(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string },
): Promise<LiftoffCheckView[]> {
  const rows = await selectLiftoffChecks(db, input.projectId)
    .select(["equipment_sets.name as equipmentSet", "calibrations.calibrated_on as calibratedOn"])
    .where("liftoff_checks.tendon_id", "=", input.tendonId)
    .orderBy("liftoff_checks.checked_at")
    .execute();
  return rows.map((r) => ({ ...liftoffCheckFromRow(r), equipmentSet: r.equipmentSet, calibratedOn: r.calibratedOn }));
}
