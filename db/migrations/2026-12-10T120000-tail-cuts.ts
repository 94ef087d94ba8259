import { sql, type Kysely } from "kysely";

// Frozen once shipped. Tails cut per tendon: a step nobody can take back, recorded by the crew
// through the tablet's outbox. One cut per tendon; the op id is its permanent key (applied_ops).
// A cut that reaches the server while the tendon is held (a stale tablet) is still stored, with
// held_reasons, and raises a flag of the new kind cut_while_held. The table is tracked by the
// sync cursor, so the pull sends the cut state back. Not frozen by a release: cutting tails is
// what a release clears the crew to do. A cut is never changed (a trigger refuses updates).

const KINDS_BEFORE = `'out_of_band', 'jacking_over_limit', 'anchor_over_limit', 'calibration_expired', 'calibration_range', 'wire_break', 'concrete_unconfirmed', 'reading_missing', 'stressed_twice', 'under_force', 'seating_excess'`;

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("tail_cuts")
    .addColumn("id", "uuid", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().unique().references("tendons.id").onDelete("cascade"))
    .addColumn("cut_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("cut_at", "timestamptz", (c) => c.notNull())
    .addColumn("device_id", "text", (c) => c.notNull())
    .addColumn("held_reasons", sql`text[]`, (c) => c.notNull().defaultTo(sql`'{}'::text[]`))
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("change_xid", sql`xid8`, (c) => c.notNull().defaultTo(sql`pg_current_xact_id()`))
    .execute();
  await db.schema.createIndex("tail_cuts_pour_change_idx").on("tail_cuts").columns(["pour_id", "change_xid"]).execute();
  await sql`create trigger tail_cuts_no_update before update on tail_cuts
    for each row execute function refuse_change()`.execute(db);

  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await sql`alter table flags add constraint flags_kind_check check (kind in (${sql.raw(KINDS_BEFORE)}, 'cut_while_held'))`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from flags where kind = 'cut_while_held'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await sql`alter table flags add constraint flags_kind_check check (kind in (${sql.raw(KINDS_BEFORE)}))`.execute(db);
  await db.schema.dropTable("tail_cuts").execute();
}
