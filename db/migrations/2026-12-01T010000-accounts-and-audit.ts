import { sql, type Kysely } from "kysely";

// Frozen. Sign-in links, invitations, password resets, sign-in rate-limit counters, and the
// append-only audit trail of security events.

export async function up(db: Kysely<any>): Promise<void> {
  // Hashed one-time sign-in link tokens (next-auth's e-mail sign-in).
  await db.schema
    .createTable("verification_tokens")
    .addColumn("identifier", "text", (c) => c.notNull())
    .addColumn("token", "text", (c) => c.notNull())
    .addColumn("expires", "timestamptz", (c) => c.notNull())
    .addPrimaryKeyConstraint("verification_tokens_pkey", ["identifier", "token"])
    .execute();

  await db.schema
    .createTable("invitations")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("project_id", "uuid", (c) => c.notNull().references("projects.id").onDelete("cascade"))
    .addColumn("email", "text", (c) => c.notNull().check(sql`email = lower(email)`))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('crew', 'inspector', 'engineer', 'admin')`))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("invited_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("accepted_at", "timestamptz")
    .addColumn("revoked_at", "timestamptz")
    .addColumn("sent_count", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // At most one open invitation per address and project.
  await sql`create unique index invitations_open_key on invitations (project_id, email)
    where accepted_at is null and revoked_at is null`.execute(db);

  await db.schema
    .createTable("password_resets")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("used_at", "timestamptz")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // The layout rate-limiter-flexible's PostgreSQL store expects.
  await db.schema
    .createTable("rate_limits")
    .addColumn("key", "varchar(255)", (c) => c.primaryKey())
    .addColumn("points", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("expire", "bigint")
    .execute();

  await db.schema
    .createTable("audit_events")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("action", "text", (c) => c.notNull())
    .addColumn("outcome", "text", (c) => c.notNull().check(sql`outcome in ('success', 'failure', 'denied')`))
    .addColumn("actor_user_id", "uuid")
    .addColumn("actor_email", "text")
    .addColumn("project_id", "uuid")
    .addColumn("target", "text")
    .addColumn("ip", "text")
    .addColumn("detail", "jsonb", (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();
  await db.schema.createIndex("audit_events_project_idx").on("audit_events").columns(["project_id", "at"]).execute();

  await sql`
    create function audit_events_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'audit_events is append-only: % refused', tg_op using errcode = 'insufficient_privilege';
    end $$`.execute(db);
  await sql`
    create trigger audit_events_no_change before update or delete on audit_events
    for each row execute function audit_events_append_only()`.execute(db);
  await sql`
    create trigger audit_events_no_truncate before truncate on audit_events
    for each statement execute function audit_events_append_only()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("audit_events").execute();
  await sql`drop function audit_events_append_only()`.execute(db);
  for (const table of ["rate_limits", "password_resets", "invitations", "verification_tokens"]) {
    await db.schema.dropTable(table).execute();
  }
}
