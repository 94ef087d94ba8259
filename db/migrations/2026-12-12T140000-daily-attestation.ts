import { sql, type Kysely } from "kysely";

// Frozen. A signed daily special-inspection report carries what the inspector attested at signing:
// whether the day's work was in conformance (and the exceptions open when it was not), and per pour
// or group of tendons stressed that day, how much of the stressing they witnessed and who did. It is
// kept with the revision so the next unsigned copy of the day prints what was last signed. Null on
// stressing reports and on daily revisions signed before this column.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("report_revisions")
    .addColumn("attestation", "jsonb", (c) =>
      c.check(sql`attestation is null or (kind = 'daily_inspection' and jsonb_typeof(attestation) = 'object')`),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("report_revisions").dropColumn("attestation").execute();
}
