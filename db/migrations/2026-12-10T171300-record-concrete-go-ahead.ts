import { sql, type Kysely } from "kysely";

// Frozen. A record stressed while the pour's concrete strength is not confirmed carries the crew's
// reason to go ahead (who confirmed the concrete on site, or why stressing could not wait), as the
// tablet asked for it; the concrete flag quotes it to the engineer.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("records")
    .addColumn("concrete_go_ahead", "text", (c) => c.check(sql`char_length(concrete_go_ahead) between 3 and 500`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("records").dropColumn("concrete_go_ahead").execute();
}
