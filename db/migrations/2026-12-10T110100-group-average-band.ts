import { sql, type Kysely } from "kysely";

// The group-average band (projects.group_tolerance_pct, already stored) is now computed per pour and
// raises a flag of its own kind (lib/stressing/rules/group-out-of-band.ts).

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
];

const check = (kinds: string[]) =>
  sql.raw(
    `alter table flags add constraint flags_kind_check check (kind in (${kinds.map((k) => `'${k}'`).join(", ")}))`,
  );

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check([...KINDS, "group_out_of_band"]).execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from flags where kind = 'group_out_of_band'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check(KINDS).execute(db);
}
