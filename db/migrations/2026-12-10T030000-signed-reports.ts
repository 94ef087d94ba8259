import { sql, type Kysely } from "kysely";

// Frozen. Signed revisions of a pour's stressing report (and later the day's inspection report):
// each keeps what was signed (the sha256 of the unsigned report's bytes), the signed file in the
// upload store with its own sha256, who signed with their licence or certification and statement,
// and what changed since the previous revision. Append-only. Read-only share links for the general
// contractor and the building official: only the token's sha256 is stored.

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table attachments drop constraint if exists attachments_purpose_check`.execute(db);
  await sql`
    alter table attachments add constraint attachments_purpose_check check (
      purpose in ('mill_certificate', 'calibration_certificate', 'record_photo', 'review_photo', 'signed_report')
    )
  `.execute(db);

  await db.schema
    .createTable("report_revisions")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.references("pours.id").onDelete("cascade"))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('pour_stressing', 'daily_inspection')`))
    .addColumn("report_day", "date")
    .addColumn("revision", "integer", (c) => c.notNull().check(sql`revision >= 1`))
    .addColumn("content_sha256", "text", (c) => c.notNull().check(sql`content_sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("file_sha256", "text", (c) => c.notNull().check(sql`file_sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("snapshot", "jsonb", (c) => c.notNull())
    .addColumn("changes", "jsonb", (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn("attachment_id", "uuid", (c) => c.notNull().references("attachments.id"))
    .addColumn("signer_user_id", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("signer_name", "text", (c) => c.notNull())
    .addColumn("licence", "text", (c) => c.notNull())
    .addColumn("statement", "text", (c) => c.notNull())
    .addColumn("signed_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint(
      "report_revisions_scope",
      sql`(kind = 'pour_stressing' and pour_id is not null) or (kind = 'daily_inspection' and report_day is not null)`,
    )
    .execute();
  await sql`
    create unique index report_revisions_pour_revision on report_revisions (project_id, pour_id, revision)
    where kind = 'pour_stressing'
  `.execute(db);
  await sql`
    create unique index report_revisions_day_revision on report_revisions (project_id, report_day, revision)
    where kind = 'daily_inspection'
  `.execute(db);
  await db.schema.createIndex("report_revisions_file_sha256").on("report_revisions").column("file_sha256").execute();
  await sql`
    create function report_revisions_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'report revisions are append-only';
    end $$
  `.execute(db);
  await sql`
    create trigger report_revisions_append_only before update or delete on report_revisions
    for each row execute function report_revisions_append_only()
  `.execute(db);

  await db.schema
    .createTable("share_links")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("token_sha256", "text", (c) => c.notNull().unique())
    .addColumn("label", "text", (c) => c.notNull())
    .addColumn("created_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("revoked_at", "timestamptz")
    .addColumn("revoked_by", "uuid", (c) => c.references("users.id"))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("share_links").execute();
  await db.schema.dropTable("report_revisions").execute();
  await sql`drop function report_revisions_append_only`.execute(db);
  await sql`alter table attachments drop constraint if exists attachments_purpose_check`.execute(db);
  await sql`
    alter table attachments add constraint attachments_purpose_check check (
      purpose in ('mill_certificate', 'calibration_certificate', 'record_photo', 'review_photo')
    )
  `.execute(db);
}
