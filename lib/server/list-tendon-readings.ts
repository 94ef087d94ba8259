import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { qualified } from "@/lib/schemas/columns";
import { RECORD_COLUMNS, recordFromRow, type StressingRecord } from "@/lib/schemas/record";

/** A reading as the tendon screen lists it: the record's DTO with the name of the set it was read on. */
export interface TendonReading extends StressingRecord {
  equipmentSet: string;
}

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
        ...qualified("records", RECORD_COLUMNS),
        "users.name as author_name",
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
  const readings = records.map((row): TendonReading => ({ ...recordFromRow(row), equipmentSet: row.equipmentSet }));
  readings.sort((a, b) => +new Date(a.deviceTime) - +new Date(b.deviceTime));
  return { records: readings, evaluation: evaluation ?? null };
}
