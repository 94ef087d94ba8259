import { sql, type Kysely } from "kysely";

// Each end is judged the way it was read (lib/stressing/judge.ts). Projects gain the settings the
// judge reads: their time zone (the stressing day), the specified jacking force as a fraction of
// fpu·A, the under-force threshold and the seating threshold. Records gain the stressing order of
// a two-end tendon and the draw-in lost at each re-grip between strokes. Flags gain the kinds of
// the two new rules.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("projects")
    .addColumn("time_zone", "text", (c) => c.notNull().defaultTo("UTC"))
    .addColumn("jacking_force_factor", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(0.8)
        .check(sql`jacking_force_factor >= 0.5 and jacking_force_factor <= 0.8`),
    )
    .addColumn("under_force_pct", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(2)
        .check(sql`under_force_pct >= 0 and under_force_pct <= 10`),
    )
    .addColumn("seating_excess_mm", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(3.175)
        .check(sql`seating_excess_mm >= 0 and seating_excess_mm < 50`),
    )
    .execute();
  await db.schema
    .alterTable("records")
    .addColumn("stressing_order", "text", (c) => c.check(sql`stressing_order in ('sequential', 'simultaneous')`))
    .addColumn("draw_in_mm", "double precision", (c) => c.check(sql`draw_in_mm >= 0 and draw_in_mm < 50`))
    .execute();
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await sql`alter table flags add constraint flags_kind_check check (kind in ('out_of_band', 'jacking_over_limit', 'anchor_over_limit', 'calibration_expired', 'calibration_range', 'wire_break', 'concrete_unconfirmed', 'reading_missing', 'stressed_twice', 'under_force', 'seating_excess'))`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await sql`alter table flags add constraint flags_kind_check check (kind in ('out_of_band', 'jacking_over_limit', 'anchor_over_limit', 'calibration_expired', 'calibration_range', 'wire_break', 'concrete_unconfirmed', 'reading_missing', 'stressed_twice'))`.execute(
    db,
  );
  await db.schema.alterTable("records").dropColumn("stressing_order").dropColumn("draw_in_mm").execute();
  await db.schema
    .alterTable("projects")
    .dropColumn("time_zone")
    .dropColumn("jacking_force_factor")
    .dropColumn("under_force_pct")
    .dropColumn("seating_excess_mm")
    .execute();
}
