import { sql, type Kysely } from "kysely";

// Frozen once shipped. Telling people at the pace of the shift:
// - projects.shift_end_minutes: when the project's shifts end, minutes after local midnight in
//   the project's time zone (default one shift ending at 18:00).
// - project_members.flag_mail: how a member takes the flag e-mails, one per flag ("each", as
//   before) or one digest per shift ("digest"); digest_from is where the member's next digest
//   begins (set when they choose it, moved on by each digest sent). The dispatcher claims the
//   member's row FOR UPDATE SKIP LOCKED to compose a digest, so two dispatchers never send one twice.
// - gauge_drift_scans: how far the dispatcher has looked at each pour's evaluations for a gauge
//   that reads long or short; the e-mail itself is kept to one per set per pour per day by its
//   dedupe key in notifications.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("projects")
    .addColumn("shift_end_minutes", sql`smallint[]`, (c) =>
      c
        .notNull()
        .defaultTo(sql`'{1080}'::smallint[]`)
        .check(
          sql`cardinality(shift_end_minutes) between 1 and 4 and 0 <= all(shift_end_minutes) and 1440 > all(shift_end_minutes)`,
        ),
    )
    .execute();
  await db.schema
    .alterTable("project_members")
    .addColumn("flag_mail", "text", (c) =>
      c
        .notNull()
        .defaultTo("each")
        .check(sql`flag_mail in ('each', 'digest')`),
    )
    .addColumn("digest_from", "timestamptz")
    .execute();
  await sql`alter table project_members add constraint project_members_digest_from_check
    check (flag_mail = 'each' or digest_from is not null)`.execute(db);
  await db.schema
    .createTable("gauge_drift_scans")
    .addColumn("pour_id", "uuid", (c) => c.primaryKey().references("pours.id").onDelete("cascade"))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("scanned_through", "timestamptz", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("evaluations_created_at_idx").on("evaluations").column("created_at").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex("evaluations_created_at_idx").execute();
  await db.schema.dropTable("gauge_drift_scans").execute();
  await sql`alter table project_members drop constraint project_members_digest_from_check`.execute(db);
  await db.schema.alterTable("project_members").dropColumn("digest_from").dropColumn("flag_mail").execute();
  await db.schema.alterTable("projects").dropColumn("shift_end_minutes").execute();
}
