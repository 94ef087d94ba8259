import { sql, type Kysely } from "kysely";

// Frozen once shipped. The detension a disposition orders (decision detension_restress), as the
// crew reports it from the tablet's outbox: when, who ran the jack, the equipment set, the gauge
// pressure at release when it was read (as typed, and in MPa), how many strands were released and
// remarks. One row per detension, never changed (a trigger refuses updates; the app role may not
// delete); a released pour takes none. Tracked by the sync cursor so the pull brings it back to
// every tablet on the pour. While no stressing record has come in after it, the tendon stays held.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("detensions")
    .addColumn("id", "uuid", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("disposition_id", "uuid", (c) => c.notNull().references("dispositions.id").onDelete("cascade"))
    .addColumn("equipment_set_id", "uuid", (c) => c.notNull().references("equipment_sets.id"))
    .addColumn("operator_name", "text", (c) => c.notNull())
    .addColumn("entered", "jsonb")
    .addColumn("release_pressure_mpa", "double precision", (c) =>
      c.check(sql`release_pressure_mpa is null or release_pressure_mpa > 0`),
    )
    .addColumn("strands_detensioned", "integer", (c) => c.notNull().check(sql`strands_detensioned >= 1`))
    .addColumn("remarks", "text")
    .addColumn("detensioned_at", "timestamptz", (c) => c.notNull())
    .addColumn("recorded_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("device_id", "text", (c) => c.notNull())
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("change_xid", sql`xid8`, (c) => c.notNull().defaultTo(sql`pg_current_xact_id()`))
    .execute();
  await db.schema
    .createIndex("detensions_pour_change_idx")
    .on("detensions")
    .columns(["pour_id", "change_xid"])
    .execute();
  await db.schema.createIndex("detensions_tendon_idx").on("detensions").columns(["project_id", "tendon_id"]).execute();
  await sql`create trigger detensions_no_update before update on detensions
    for each row execute function refuse_change()`.execute(db);
  await sql`create trigger detensions_no_truncate before truncate on detensions
    for each statement execute function refuse_change()`.execute(db);
  await sql`create trigger detensions_pour_not_released before insert on detensions
    for each row execute function refuse_write_to_released_pour()`.execute(db);
  await sql`do $$ begin
    if exists (select 1 from pg_roles where rolname = 'tautline_app') then
      revoke update, delete on detensions from tautline_app;
    end if;
  end $$`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("detensions").execute();
}
