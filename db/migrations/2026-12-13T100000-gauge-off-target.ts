import { sql, type Kysely } from "kysely";

// Frozen. A final gauge pressure farther from its target than the band, kept by the crew with a
// reason (or with none, from a tablet that did not ask), raises its own flag kind. The check lists
// every kind there is.

const KINDS = [
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
  "liftoff_out_of_band",
  "member_wire_loss",
  "force_disagreement",
];

const check = (kinds: string[]) =>
  sql.raw(
    `alter table flags add constraint flags_kind_check check (kind in (${kinds.map((k) => `'${k}'`).join(", ")}))`,
  );

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check([...KINDS, "gauge_off_target"]).execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from flags where kind = 'gauge_off_target'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check(KINDS).execute(db);
}
