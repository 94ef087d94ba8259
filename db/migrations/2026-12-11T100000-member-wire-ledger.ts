import { sql, type Kysely } from "kysely";

// Frozen. A tendon may name the member it belongs to (a beam, a slab strip, a band), as the
// schedule draws it: the group-average band and the wire-break ledger are then judged per member
// (per pour when a tendon names none). The ledger sums the steel lost to unreplaced wire breaks
// against the project's limit, 2 % of the member's prestressing steel unless the engineer sets
// another (ACI 318-02 §18.20.4; see DOMAIN.md), and a member over it raises its own flag kind.

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
];

const check = (kinds: string[]) =>
  sql.raw(
    `alter table flags add constraint flags_kind_check check (kind in (${kinds.map((k) => `'${k}'`).join(", ")}))`,
  );

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("tendons")
    .addColumn("member", "text", (c) => c.check(sql`member is null or length(trim(member)) between 1 and 80`))
    .execute();
  await db.schema
    .alterTable("projects")
    .addColumn("wire_loss_limit_pct", "double precision", (c) =>
      c
        .notNull()
        .defaultTo(2)
        .check(sql`wire_loss_limit_pct > 0 and wire_loss_limit_pct <= 10`),
    )
    .execute();
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check([...KINDS, "member_wire_loss"]).execute(db);
  // The ledger reads the breaks of a pour's records.
  await sql`create index records_pour_wire_breaks on records (pour_id) where wire_breaks > 0`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index if exists records_pour_wire_breaks`.execute(db);
  await sql`delete from flags where kind = 'member_wire_loss'`.execute(db);
  await sql`alter table flags drop constraint flags_kind_check`.execute(db);
  await check(KINDS).execute(db);
  await db.schema.alterTable("projects").dropColumn("wire_loss_limit_pct").execute();
  await db.schema.alterTable("tendons").dropColumn("member").execute();
}
