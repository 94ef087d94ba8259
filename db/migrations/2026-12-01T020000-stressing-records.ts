import { sql, type Kysely } from "kysely";

// Frozen. Equipment sets and calibrations, uploaded files, stressing records with their
// revision chain, the server's evaluations, flags, reviews, dispositions, releases, the
// e-mail outbox and the sync idempotency keys. Evaluations, reviews and dispositions are
// append-only, enforced by triggers.

const now = sql`now()`;

async function appendOnly(db: Kysely<any>, table: string): Promise<void> {
  await sql`create trigger ${sql.id(`${table}_append_only`)} before update or delete on ${sql.id(table)}
    for each row execute function refuse_change()`.execute(db);
}

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create function refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception '% is append-only: % refused', tg_table_name, tg_op using errcode = 'insufficient_privilege';
    end $$`.execute(db);

  await db.schema
    .alterTable("pours")
    .addColumn("concrete_strength_mpa", "double precision", (c) => c.check(sql`concrete_strength_mpa > 0`))
    .addColumn("concrete_confirmed_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("concrete_confirmed_at", "timestamptz")
    .execute();
  await db.schema
    .alterTable("projects")
    .addColumn("release_by", "text", (c) =>
      c
        .notNull()
        .defaultTo("engineer")
        .check(sql`release_by in ('engineer', 'inspector')`),
    )
    .execute();

  await db.schema
    .createTable("attachments")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("purpose", "text", (c) =>
      c
        .notNull()
        .check(sql`purpose in ('mill_certificate', 'calibration_certificate', 'record_photo', 'review_photo')`),
    )
    .addColumn("object_key", "text", (c) => c.notNull().unique())
    .addColumn("content_type", "text", (c) => c.notNull())
    .addColumn("size_bytes", "bigint", (c) => c.notNull().check(sql`size_bytes > 0`))
    .addColumn("sha256", "text", (c) => c.check(sql`sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("original_name", "text")
    .addColumn("status", "text", (c) =>
      c
        .notNull()
        .defaultTo("pending")
        .check(sql`status in ('pending', 'stored')`),
    )
    .addColumn("record_id", "uuid")
    .addColumn("uploaded_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await db.schema.createIndex("attachments_project_idx").on("attachments").column("project_id").execute();

  await db.schema
    .createTable("equipment_sets")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("jack_serial", "text", (c) => c.notNull())
    .addColumn("gauge_serial", "text", (c) => c.notNull())
    .addColumn("pump_serial", "text")
    .addColumn("jack_grip_mm", "double precision", (c) => c.check(sql`jack_grip_mm >= 0`))
    .addColumn("max_force_n", "double precision", (c) => c.check(sql`max_force_n > 0`))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .addUniqueConstraint("equipment_sets_project_name_key", ["project_id", "name"])
    .execute();

  await db.schema
    .createTable("calibrations")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("equipment_set_id", "uuid", (c) => c.notNull().references("equipment_sets.id").onDelete("cascade"))
    .addColumn("calibrated_on", "date", (c) => c.notNull())
    .addColumn("valid_until", "date", (c) => c.notNull())
    // [{ pressureMPa, forceN }] as the certificate gives them (stored in SI).
    .addColumn("points", "jsonb", (c) => c.notNull().check(sql`jsonb_typeof(points) = 'array'`))
    .addColumn("slope_n_per_mpa", "double precision", (c) => c.notNull())
    .addColumn("intercept_n", "double precision", (c) => c.notNull())
    .addColumn("r2", "double precision", (c) => c.notNull())
    .addColumn("min_pressure_mpa", "double precision", (c) => c.notNull())
    .addColumn("max_pressure_mpa", "double precision", (c) => c.notNull())
    .addColumn("laboratory", "text")
    .addColumn("certificate_attachment_id", "uuid", (c) => c.references("attachments.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .addCheckConstraint("calibrations_dates", sql`valid_until >= calibrated_on`)
    .execute();
  await db.schema
    .createIndex("calibrations_set_idx")
    .on("calibrations")
    .columns(["equipment_set_id", "calibrated_on"])
    .execute();

  // One stressing event of one tendon end. Never updated: a correction is a new revision in
  // the same chain (chain_id = the first revision's id) naming its base and a reason.
  await db.schema
    .createTable("records")
    .addColumn("id", "uuid", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("tendon_end", "text", (c) => c.notNull().check(sql`tendon_end in ('A', 'B')`))
    .addColumn("chain_id", "uuid", (c) => c.notNull())
    .addColumn("revision", "integer", (c) => c.notNull().check(sql`revision >= 1`))
    .addColumn("base_record_id", "uuid", (c) => c.references("records.id"))
    .addColumn("revision_reason", "text")
    .addColumn("equipment_set_id", "uuid", (c) => c.notNull().references("equipment_sets.id"))
    .addColumn("calibration_id", "uuid", (c) => c.references("calibrations.id"))
    .addColumn("expired_calibration_reason", "text")
    .addColumn("initial_pressure_mpa", "double precision", (c) => c.check(sql`initial_pressure_mpa >= 0`))
    .addColumn("final_pressure_mpa", "double precision", (c) => c.notNull().check(sql`final_pressure_mpa > 0`))
    .addColumn("reading_method", "text", (c) => c.notNull().check(sql`reading_method in ('marks', 'strokes')`))
    // The values exactly as typed, with their unit: { unit, pressures: {...}, marks | strokes }.
    .addColumn("entered", "jsonb", (c) => c.notNull())
    .addColumn("measured_mm", "double precision", (c) => c.notNull())
    .addColumn("seating_mm", "double precision", (c) => c.check(sql`seating_mm >= 0`))
    .addColumn("wire_breaks", "integer", (c) =>
      c
        .notNull()
        .defaultTo(0)
        .check(sql`wire_breaks >= 0`),
    )
    .addColumn("remarks", "text")
    .addColumn("device_time", "timestamptz", (c) => c.notNull())
    .addColumn("device_time_zone", "text", (c) => c.notNull())
    .addColumn("device_id", "text", (c) => c.notNull())
    .addColumn("author_user_id", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("restress_of_disposition_id", "uuid")
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .addUniqueConstraint("records_chain_revision_key", ["chain_id", "revision"])
    .addCheckConstraint(
      "records_revision_base",
      sql`(revision = 1 and base_record_id is null) or (revision > 1 and base_record_id is not null and revision_reason is not null)`,
    )
    .execute();
  await db.schema.createIndex("records_tendon_idx").on("records").columns(["project_id", "tendon_id"]).execute();
  await appendOnly(db, "records");

  // The server's verdict, with every input it used and the engine version. Never rewritten:
  // a re-evaluation is a new row with a reason.
  await db.schema
    .createTable("evaluations")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("record_ids", sql`uuid[]`, (c) => c.notNull())
    .addColumn("reason", "text", (c) => c.notNull())
    .addColumn("engine_version", "text", (c) => c.notNull())
    .addColumn("inputs", "jsonb", (c) => c.notNull())
    .addColumn("result", "jsonb", (c) => c.notNull())
    .addColumn("verdict", "text", (c) => c.notNull().check(sql`verdict in ('in band', 'long', 'short', 'incomplete')`))
    .addColumn("provisional", "boolean", (c) => c.notNull())
    .addColumn("deviation_pct", "double precision")
    .addColumn("predicted_mm", "double precision")
    .addColumn("measured_mm", "double precision")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await db.schema
    .createIndex("evaluations_tendon_idx")
    .on("evaluations")
    .columns(["tendon_id", "created_at"])
    .execute();
  await appendOnly(db, "evaluations");

  await db.schema
    .createTable("flags")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().references("pours.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("record_id", "uuid", (c) => c.references("records.id"))
    .addColumn("evaluation_id", "uuid", (c) => c.references("evaluations.id"))
    .addColumn("kind", "text", (c) =>
      c
        .notNull()
        .check(
          sql`kind in ('out_of_band', 'jacking_over_limit', 'anchor_over_limit', 'calibration_expired', 'calibration_range', 'wire_break', 'concrete_unconfirmed', 'reading_missing', 'stressed_twice')`,
        ),
    )
    .addColumn("reason", "text", (c) => c.notNull())
    .addColumn("status", "text", (c) =>
      c
        .notNull()
        .defaultTo("open")
        .check(sql`status in ('open', 'with_engineer', 'closed')`),
    )
    .addColumn("closed_at", "timestamptz")
    .addColumn("closed_by", "uuid", (c) => c.references("users.id"))
    .addColumn("close_reason", "text")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await db.schema.createIndex("flags_project_status_idx").on("flags").columns(["project_id", "status"]).execute();

  await db.schema
    .createTable("reviews")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("flag_id", "uuid", (c) => c.notNull().references("flags.id").onDelete("cascade"))
    .addColumn("author_user_id", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("kind", "text", (c) =>
      c
        .notNull()
        .check(sql`kind in ('note', 'remeasured', 'paperwork_error', 'photo', 'sent_to_engineer', 'closed_paperwork')`),
    )
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("remeasured_mm", "double precision")
    .addColumn("attachment_id", "uuid", (c) => c.references("attachments.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await appendOnly(db, "reviews");

  await db.schema
    .createTable("dispositions")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("flag_id", "uuid", (c) => c.notNull().references("flags.id").onDelete("cascade"))
    .addColumn("tendon_id", "uuid", (c) => c.notNull().references("tendons.id").onDelete("cascade"))
    .addColumn("decision", "text", (c) =>
      c
        .notNull()
        .check(sql`decision in ('accept', 'restress', 'detension_restress', 'liftoff_check', 'replace', 'other')`),
    )
    .addColumn("reasons", "text", (c) => c.notNull().check(sql`length(trim(reasons)) >= 10`))
    .addColumn("engineer_user_id", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("engineer_name", "text", (c) => c.notNull())
    .addColumn("licence_statement", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await appendOnly(db, "dispositions");

  await db.schema
    .createTable("releases")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("pour_id", "uuid", (c) => c.notNull().unique().references("pours.id").onDelete("cascade"))
    .addColumn("released_by", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("released_by_name", "text", (c) => c.notNull())
    .addColumn("statement", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await appendOnly(db, "releases");

  // Transactional outbox: written in the same transaction as the flag, sent by the dispatcher.
  await db.schema
    .createTable("notifications")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("flag_id", "uuid", (c) => c.references("flags.id").onDelete("set null"))
    .addColumn("dedupe_key", "text", (c) => c.notNull().unique())
    .addColumn("to_emails", sql`text[]`, (c) => c.notNull())
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("text_body", "text", (c) => c.notNull())
    .addColumn("html_body", "text", (c) => c.notNull())
    .addColumn("status", "text", (c) =>
      c
        .notNull()
        .defaultTo("pending")
        .check(sql`status in ('pending', 'sent', 'failed')`),
    )
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("next_attempt_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .addColumn("last_error", "text")
    .addColumn("sent_at", "timestamptz")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
  await sql`create index notifications_due_idx on notifications (next_attempt_at) where status = 'pending'`.execute(db);

  // Idempotency keys of sync operations. Never expire.
  await db.schema
    .createTable("applied_ops")
    .addColumn("op_id", "uuid", (c) => c.primaryKey())
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("device_id", "text", (c) => c.notNull())
    .addColumn("user_id", "uuid", (c) => c.notNull().references("users.id"))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("record_id", "uuid")
    .addColumn("status", "text", (c) => c.notNull().check(sql`status in ('applied', 'conflict', 'rejected')`))
    .addColumn("result", "jsonb", (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn("applied_at", "timestamptz", (c) => c.notNull().defaultTo(now))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of [
    "applied_ops",
    "notifications",
    "releases",
    "dispositions",
    "reviews",
    "flags",
    "evaluations",
    "records",
    "calibrations",
    "equipment_sets",
    "attachments",
  ]) {
    await db.schema.dropTable(table).execute();
  }
  await db.schema.alterTable("projects").dropColumn("release_by").execute();
  await db.schema
    .alterTable("pours")
    .dropColumn("concrete_strength_mpa")
    .dropColumn("concrete_confirmed_by")
    .dropColumn("concrete_confirmed_at")
    .execute();
  await sql`drop function refuse_change()`.execute(db);
}
