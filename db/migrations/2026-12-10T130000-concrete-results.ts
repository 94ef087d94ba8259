import { sql, type Kysely } from "kysely";

// Concrete strength results per pour (cylinders or cubes broken by the lab), entered by the
// inspector or the admin, optionally with the lab's report uploaded as a `lab_report`
// attachment. The pour's confirmed strength (pours.concrete_strength_mpa) follows from them by
// the rule in lib/stressing/concrete-strength.ts. Results are append-only: a wrong entry is
// answered by a new one, never edited away.

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table attachments drop constraint if exists attachments_purpose_check`.execute(db);
  await sql`
    alter table attachments add constraint attachments_purpose_check check (
      purpose in ('mill_certificate', 'calibration_certificate', 'record_photo', 'review_photo', 'signed_report', 'lab_report')
    )
  `.execute(db);

  await db.schema
    .createTable("concrete_results")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("specimen", "text", (c) => c.notNull().check(sql`specimen in ('cylinder', 'cube')`))
    .addColumn("strength_mpa", "double precision", (c) => c.notNull().check(sql`strength_mpa > 0`))
    .addColumn("age_days", "integer", (c) => c.notNull().check(sql`age_days between 0 and 365`))
    .addColumn("specimen_count", "integer", (c) => c.notNull().check(sql`specimen_count between 1 and 50`))
    .addColumn("attachment_id", "uuid", (c) => c.references("attachments.id"))
    .addColumn("entered_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("entered_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .createIndex("concrete_results_pour_idx")
    .on("concrete_results")
    .columns(["pour_id", "entered_at"])
    .execute();
  await sql`
    create trigger concrete_results_append_only before update or delete on concrete_results
    for each row execute function refuse_change()
  `.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("concrete_results").ifExists().execute();
  await sql`delete from attachments where purpose = 'lab_report'`.execute(db);
  await sql`alter table attachments drop constraint if exists attachments_purpose_check`.execute(db);
  await sql`
    alter table attachments add constraint attachments_purpose_check check (
      purpose in ('mill_certificate', 'calibration_certificate', 'record_photo', 'review_photo', 'signed_report')
    )
  `.execute(db);
}
