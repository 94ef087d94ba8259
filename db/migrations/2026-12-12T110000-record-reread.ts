import { sql, type Kysely } from "kysely";

// Re-read before flagging: when the reading division alone could change the verdict, the tablet
// asks for a second, finer reading. The record keeps the first reading beside the re-read
// (measured_mm is the re-read, the one judged), or the crew's reason when it could not be taken.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("records")
    .addColumn("first_reading_mm", "double precision", (c) =>
      c.check(sql`first_reading_mm is null or (first_reading_mm > 0 and first_reading_mm <= 5000)`),
    )
    .addColumn("reread_declined_reason", "text", (c) =>
      c.check(sql`reread_declined_reason is null or char_length(reread_declined_reason) between 3 and 500`),
    )
    .execute();
  await sql`alter table records add constraint records_reread_or_declined check (first_reading_mm is null or reread_declined_reason is null)`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table records drop constraint records_reread_or_declined`.execute(db);
  await db.schema.alterTable("records").dropColumn("first_reading_mm").dropColumn("reread_declined_reason").execute();
}
