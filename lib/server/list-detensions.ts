import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { qualified } from "@/lib/schemas/columns";
import { DETENSION_COLUMNS, detensionFromRow, type Detension } from "@/lib/schemas/detension";

/**
 * A project's detensions as the crew recorded them, with the equipment set and who recorded each,
 * and the columns of the one DTO (`detensionFromRow`); a reader adds its filter (a tendon, a pour), its own columns
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
    .select([...qualified("detensions", DETENSION_COLUMNS), "users.name as recorded_by_name"])
    .where("detensions.project_id", "=", projectId);
}

/** A detension on the engineer's tendon page: the one DTO with its set's name. */
export interface DetensionView extends Detension {
  equipmentSet: string;
}

/**
 * A tendon's detensions, oldest first. For the engineer's tendon page, beside the disposition.
 */
export async function listDetensions(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string },
): Promise<DetensionView[]> {
  const rows = await selectDetensions(db, input.projectId)
    .select("equipment_sets.name as equipmentSet")
    .where("detensions.tendon_id", "=", input.tendonId)
    .orderBy("detensions.detensioned_at")
    .execute();
  return rows.map((r) => ({ ...detensionFromRow(r), equipmentSet: r.equipmentSet }));
}
