import { sql, type Kysely } from "kysely";

// Frozen. The e-mail dispatcher writes a heartbeat after every pass, so /api/health and the
// engineer's and admin's screens can tell when e-mail stopped flowing. Each user carries a
// session version: signing out, a password reset, removal and a role change raise it, and every
// authorized call refuses a session cookie minted under an older version.

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("worker_heartbeats")
    .addColumn("worker", "text", (c) => c.primaryKey())
    .addColumn("beat_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("last_error", "text")
    .addColumn("last_error_at", "timestamptz")
    .execute();
  await db.schema
    .alterTable("users")
    .addColumn("session_version", "integer", (c) => c.notNull().defaultTo(0))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("users").dropColumn("session_version").execute();
  await db.schema.dropTable("worker_heartbeats").execute();
}
