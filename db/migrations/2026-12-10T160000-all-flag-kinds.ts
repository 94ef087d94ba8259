import { sql, type Kysely } from "kysely";

// Frozen. Two earlier migrations each re-made the flag kind check with one new kind (the group
// average, tails cut while held), each without the other's; this one lists every kind there is.

const BEFORE = [
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
];

const check = (kinds: string[]) =>
  sql.raw(
    `alter table flags add constraint flags_kind_check check (kind in (${kinds.map((k) => `'${k}'`).join(", ")}))`,
  );

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check([...BEFORE, "group_out_of_band"]).execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from flags where kind = 'group_out_of_band'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check(BEFORE).execute(db);
}
