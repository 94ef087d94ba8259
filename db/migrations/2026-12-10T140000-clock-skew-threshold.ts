import { sql, type Kysely } from "kysely";

// A record whose device time differs from the server's receipt time by more than this many
// minutes (or lies after its receipt) is marked for the inspector, with both times shown.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("projects")
    .addColumn("clock_skew_minutes", "integer", (c) =>
      c
        .notNull()
        .defaultTo(10)
        .check(sql`clock_skew_minutes >= 1 and clock_skew_minutes <= 1440`),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("projects").dropColumn("clock_skew_minutes").execute();
}
