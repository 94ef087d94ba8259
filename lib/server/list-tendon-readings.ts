import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * The readings of one tendon as they stand (the latest revision of each record), oldest first,
 * with the set they were read on and who read them, and the tendon's latest evaluation.
 */
export async function listTendonReadings(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  const [records, evaluation] = await Promise.all([
    db
      .selectFrom("records")
      .innerJoin("users", "users.id", "records.author_user_id")
      .innerJoin("equipment_sets", "equipment_sets.id", "records.equipment_set_id")
      .select([
        "records.id",
        "records.chain_id",
        "records.revision",
        "records.tendon_end",
        "records.final_pressure_mpa",
        "records.measured_mm",
        "records.wire_breaks",
        "records.first_reading_mm",
        "records.reread_declined_reason",
        "records.device_time",
        "records.entered",
        "users.name as author",
        "equipment_sets.name as equipmentSet",
      ])
      .distinctOn("records.chain_id")
      .where("records.project_id", "=", input.projectId)
      .where("equipment_sets.project_id", "=", input.projectId)
      .where("records.tendon_id", "=", input.tendonId)
      .orderBy("records.chain_id")
      .orderBy("records.revision", "desc")
      .execute(),
    db
      .selectFrom("evaluations")
      .select(["verdict", "deviation_pct", "provisional", "created_at"])
      .where("project_id", "=", input.projectId)
      .where("tendon_id", "=", input.tendonId)
      .orderBy("created_at", "desc")
      .limit(1)
      .executeTakeFirst(),
  ]);
  records.sort((a, b) => +new Date(a.device_time) - +new Date(b.device_time));
  return { records, evaluation: evaluation ?? null };
}
