import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * A project's detensions as the crew recorded them, with the equipment set and who recorded each,
 * and the columns every reader shows; a reader adds its filter (a tendon, a pour), its own columns
 * and its order. Each names the disposition that ordered it.
 */
export function selectDetensions(db: Kysely<Database>, projectId: string) {
  return db
    .selectFrom("detensions")
    .innerJoin("users", "users.id", "detensions.recorded_by")
    .innerJoin("equipment_sets", (j) =>
      j
        .onRef("equipment_sets.id", "=", "detensions.equipment_set_id")
        .onRef("equipment_sets.project_id", "=", "detensions.project_id"),
    )
    .select([
      "detensions.disposition_id",
      "detensions.detensioned_at",
      "detensions.operator_name",
      "detensions.entered",
      "detensions.release_pressure_mpa",
      "detensions.strands_detensioned",
      "detensions.remarks",
    ])
    .where("detensions.project_id", "=", projectId);
}

/**
 * A tendon's detensions, oldest first. For the engineer's tendon page, beside the disposition.
 */
export async function listDetensions(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  return selectDetensions(db, input.projectId)
    .select([
      "detensions.id",
      "detensions.received_at",
      "users.name as recordedBy",
      "equipment_sets.name as equipmentSet",
    ])
    .where("detensions.tendon_id", "=", input.tendonId)
    .orderBy("detensions.detensioned_at")
    .execute();
}
