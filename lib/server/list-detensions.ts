import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * A tendon's detensions as the crew recorded them, oldest first, with the equipment set and who
 * recorded each; each names the disposition that ordered it. For the engineer's tendon page,
 * beside the disposition.
 */
export async function listDetensions(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  return db
    .selectFrom("detensions")
    .innerJoin("users", "users.id", "detensions.recorded_by")
    .innerJoin("equipment_sets", (j) =>
      j
        .onRef("equipment_sets.id", "=", "detensions.equipment_set_id")
        .onRef("equipment_sets.project_id", "=", "detensions.project_id"),
    )
    .select([
      "detensions.id",
      "detensions.disposition_id",
      "detensions.detensioned_at",
      "detensions.operator_name",
      "detensions.entered",
      "detensions.release_pressure_mpa",
      "detensions.strands_detensioned",
      "detensions.remarks",
      "detensions.received_at",
      "users.name as recordedBy",
      "equipment_sets.name as equipmentSet",
    ])
    .where("detensions.project_id", "=", input.projectId)
    .where("detensions.tendon_id", "=", input.tendonId)
    .orderBy("detensions.detensioned_at")
    .execute();
}
