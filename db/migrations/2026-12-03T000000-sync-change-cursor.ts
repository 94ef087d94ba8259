import { sql, type Kysely } from "kysely";

// Frozen. A commit-safe change cursor for the field log's pull: every row the tablet copies
// carries the id of the transaction that last wrote it (xid8, never wraps), and deletes leave a
// tombstone. A pull returns rows written by transactions older than the snapshot's xmin, so a
// transaction that commits late is never skipped (commit order is not timestamp order).

const TRACKED = [
  "projects",
  "pours",
  "tendons",
  "strand_lots",
  "equipment_sets",
  "calibrations",
  "records",
  "evaluations",
  "flags",
];
// Tables whose rows the tablet may hold and which can be deleted (records and verdicts never are).
const TOMBSTONED = ["pours", "tendons", "strand_lots", "equipment_sets", "calibrations"];

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function set_change_xid() returns trigger language plpgsql as $$
    begin
      new.change_xid := pg_current_xact_id();
      return new;
    end $$`.execute(db);

  await db.schema
    .createTable("sync_tombstones")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull())
    .addColumn("table_name", "text", (c) => c.notNull())
    .addColumn("row_id", "uuid", (c) => c.notNull())
    .addColumn("pour_id", "uuid")
    .addColumn("change_xid", sql`xid8`, (c) => c.notNull().defaultTo(sql`pg_current_xact_id()`))
    .addColumn("deleted_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .createIndex("sync_tombstones_project_idx")
    .on("sync_tombstones")
    .columns(["project_id", "change_xid"])
    .execute();

  await sql`
    create function record_tombstone() returns trigger language plpgsql as $$
    begin
      insert into sync_tombstones (project_id, table_name, row_id, pour_id)
      values (
        old.project_id,
        tg_table_name,
        old.id,
        case when tg_table_name = 'pours' then old.id else (to_jsonb(old) ->> 'pour_id')::uuid end
      );
      return old;
    end $$`.execute(db);

  for (const table of TRACKED) {
    await sql`alter table ${sql.id(table)} add column change_xid xid8 not null default pg_current_xact_id()`.execute(
      db,
    );
    // Records and evaluations are append-only (their update trigger refuses), so only inserts stamp them.
    const events = table === "records" || table === "evaluations" ? sql`before insert` : sql`before insert or update`;
    await sql`create trigger ${sql.id(`${table}_change_xid`)} ${events} on ${sql.id(table)}
      for each row execute function set_change_xid()`.execute(db);
  }
  for (const table of TOMBSTONED) {
    await sql`create trigger ${sql.id(`${table}_tombstone`)} after delete on ${sql.id(table)}
      for each row execute function record_tombstone()`.execute(db);
  }
  await db.schema.createIndex("records_pour_change_idx").on("records").columns(["pour_id", "change_xid"]).execute();
  await db.schema.createIndex("tendons_pour_change_idx").on("tendons").columns(["pour_id", "change_xid"]).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of TOMBSTONED)
    await sql`drop trigger ${sql.id(`${table}_tombstone`)} on ${sql.id(table)}`.execute(db);
  for (const table of TRACKED) {
    await sql`drop trigger ${sql.id(`${table}_change_xid`)} on ${sql.id(table)}`.execute(db);
    await sql`alter table ${sql.id(table)} drop column change_xid`.execute(db);
  }
  await db.schema.dropTable("sync_tombstones").execute();
  await sql`drop function record_tombstone()`.execute(db);
  await sql`drop function set_change_xid()`.execute(db);
}
