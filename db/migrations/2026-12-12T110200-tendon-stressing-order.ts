import { sql, type Kysely } from "kysely";

// The schedule may say how a two-end tendon is stressed (one end after the other, or both at
// once); the record form asks once per tendon and defaults to it. Null: not given (the form
// defaults to one end after the other, the usual case).

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("tendons")
    .addColumn("stressing_order", "text", (c) => c.check(sql`stressing_order in ('sequential', 'simultaneous')`))
    .execute();
  await sql`alter table tendons add constraint tendons_stressing_order_two_ends check (stressing_order is null or ends = 'both')`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("tendons").dropColumn("stressing_order").execute();
}
