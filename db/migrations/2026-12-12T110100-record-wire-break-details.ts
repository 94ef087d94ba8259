import { sql, type Kysely } from "kysely";

// Wire breaks, which strand and where: one entry per broken wire, { strand: number | null, where }
// (the strand's number in the tendon or null when not known; where: jack_end, far_end,
// along_length, not_known). Null on records made before the question was asked.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("records")
    .addColumn("wire_break_details", "jsonb", (c) =>
      c.check(
        sql`wire_break_details is null or (jsonb_typeof(wire_break_details) = 'array' and jsonb_array_length(wire_break_details) = wire_breaks)`,
      ),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("records").dropColumn("wire_break_details").execute();
}
