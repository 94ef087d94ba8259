import { sql, type Kysely } from "kysely";

// Indexes for the statements the sync push, the pull and the report send, found with
// `scripts/bench/explain.ts` (plans in docs/PERFORMANCE.md). Without them each of these read every
// row of the table and filtered, so they grew with the whole database rather than with the pour:
// - the push's read of a tendon's open flags and of its dispositions (once per pushed record);
// - the pull's and the report's flags of a pour (the pull also since a cursor, like records and
//   tendons in 2026-12-03T000000-sync-change-cursor);
// - the reviews and dispositions of a list of flags (the report's and the flag trail's).

export async function up(db: Kysely<any>): Promise<void> {
  await sql`create index flags_tendon_open_idx on flags (tendon_id) where status <> 'closed'`.execute(db);
  await db.schema.createIndex("flags_pour_change_idx").on("flags").columns(["pour_id", "change_xid"]).execute();
  await db.schema.createIndex("dispositions_tendon_idx").on("dispositions").column("tendon_id").execute();
  await db.schema.createIndex("dispositions_flag_idx").on("dispositions").column("flag_id").execute();
  await db.schema.createIndex("reviews_flag_idx").on("reviews").column("flag_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const name of [
    "reviews_flag_idx",
    "dispositions_flag_idx",
    "dispositions_tendon_idx",
    "flags_pour_change_idx",
    "flags_tendon_open_idx",
  ]) {
    await db.schema.dropIndex(name).ifExists().execute();
  }
}
