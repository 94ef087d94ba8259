import { sql, type Kysely } from "kysely";

// The project chooses which elongation governs the verdict: Tautline's prediction (as before) or
// the approved shop-drawing value the schedule already carries (lib/stressing/judge.ts). Both are
// always shown side by side with their difference.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("projects")
    .addColumn("governing_value", "text", (c) =>
      c
        .notNull()
        .defaultTo("tautline")
        .check(sql`governing_value in ('tautline', 'shop_drawing')`),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("projects").dropColumn("governing_value").execute();
}
