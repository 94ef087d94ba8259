import { sql, type Kysely } from "kysely";

// Frozen once shipped. The lift-off check a disposition orders (decision liftoff_check), as the
// crew reports it from the tablet's outbox: the gauge pressure at lift-off at one end with one
// equipment set, converted by the server to force on the calibration in force that day and
// compared with the force expected at that anchorage after seating, within the project's band
// (projects.liftoff_band_pct, default ±5 %). Outside the band it raises a flag of the new kind
// liftoff_out_of_band (raised_flag_id). One row per check, never changed (a trigger refuses
// updates); tracked by the sync cursor so the pull sends the result back to the tablet.

const ALL_KINDS_BEFORE = [
  "out_of_band",
  "jacking_over_limit",
  "anchor_over_limit",
  "calibration_expired",
  "calibration_range",
  "wire_break",
  "concrete_unconfirmed",
  "reading_missing",
  "stressed_twice",
  "under_force",
  "seating_excess",
  "cut_while_held",
  "group_out_of_band",
];

const check = (kinds: string[]) =>
  sql.raw(
    `alter table flags add constraint flags_kind_check check (kind in (${kinds.map((k) => `'${k}'`).join(", ")}))`,
  );

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table projects add column liftoff_band_pct double precision not null default 5
    constraint projects_liftoff_band_pct_check check (liftoff_band_pct > 0 and liftoff_band_pct <= 25)`.execute(db);

  await db.schema
    .createTable("liftoff_checks")
    .addColumn("id", "uuid", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("disposition_id", "uuid", (c) => c.notNull().references("dispositions.id").onDelete("cascade"))
    .addColumn("tendon_end", "text", (c) => c.notNull().check(sql`tendon_end in ('A', 'B')`))
    .addColumn("equipment_set_id", "uuid", (c) => c.notNull().references("equipment_sets.id"))
    .addColumn("calibration_id", "uuid", (c) => c.notNull().references("calibrations.id"))
    .addColumn("entered", "jsonb", (c) => c.notNull())
    .addColumn("pressure_mpa", "double precision", (c) => c.notNull())
    .addColumn("liftoff_force_n", "double precision", (c) => c.notNull())
    .addColumn("expected_force_n", "double precision", (c) => c.notNull())
    .addColumn("deviation_pct", "double precision", (c) => c.notNull())
    .addColumn("band_pct", "double precision", (c) => c.notNull())
    .addColumn("within_band", "boolean", (c) => c.notNull())
    .addColumn("raised_flag_id", "uuid", (c) => c.references("flags.id"))
    .addColumn("checked_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("checked_at", "timestamptz", (c) => c.notNull())
    .addColumn("device_id", "text", (c) => c.notNull())
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("change_xid", sql`xid8`, (c) => c.notNull().defaultTo(sql`pg_current_xact_id()`))
    .execute();
  await db.schema
    .createIndex("liftoff_checks_pour_change_idx")
    .on("liftoff_checks")
    .columns(["pour_id", "change_xid"])
    .execute();
  await db.schema
    .createIndex("liftoff_checks_tendon_idx")
    .on("liftoff_checks")
    .columns(["project_id", "tendon_id"])
    .execute();
  await sql`create trigger liftoff_checks_no_update before update on liftoff_checks
    for each row execute function refuse_change()`.execute(db);

  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check([...ALL_KINDS_BEFORE, "liftoff_out_of_band"]).execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("liftoff_checks").execute();
  await sql`delete from flags where kind = 'liftoff_out_of_band'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check(ALL_KINDS_BEFORE).execute(db);
  await sql`alter table projects drop column liftoff_band_pct`.execute(db);
}
