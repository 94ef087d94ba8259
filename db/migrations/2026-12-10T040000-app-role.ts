import { sql, type Kysely } from "kysely";

// Frozen. Least privilege: the app connects as `tautline_app`, a role that owns nothing and may
// only read and write rows. Migrations keep running as the owner role (the one that runs this
// file), which owns every table, function and trigger. The app role gets no TRUNCATE, TRIGGER,
// REFERENCES or DDL right, and no UPDATE/DELETE on the append-only tables. Default privileges
// make every table a later migration creates (run by the same owner) readable and writable by the
// app role without further grants. The role is cluster-wide and created here without a password
// (NOLOGIN) when missing; scripts/lib.sh gives it LOGIN and a password on local clusters, and a
// deployment does the same once (see docs/RELIABILITY.md).

export const APP_ROLE = "tautline_app";

const APPEND_ONLY = ["audit_events", "records", "evaluations", "reviews", "dispositions", "releases"];

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    do $$ begin
      if not exists (select 1 from pg_roles where rolname = 'tautline_app') then
        create role tautline_app nologin nosuperuser nocreatedb nocreaterole noinherit;
      end if;
    exception when duplicate_object then null;
    end $$`.execute(db);

  // Nobody but the owner creates objects in public (PostgreSQL 15 already defaults to this).
  await sql`revoke create on schema public from public`.execute(db);
  await sql`grant usage on schema public to tautline_app`.execute(db);
  await sql`grant select, insert, update, delete on all tables in schema public to tautline_app`.execute(db);
  await sql`grant usage, select on all sequences in schema public to tautline_app`.execute(db);
  await sql`alter default privileges in schema public grant select, insert, update, delete on tables to tautline_app`.execute(
    db,
  );
  await sql`alter default privileges in schema public grant usage, select on sequences to tautline_app`.execute(db);

  // The migration bookkeeping is the owner's; the app only reads which version it runs on.
  await sql`revoke insert, update, delete on schema_migrations, schema_migrations_lock from tautline_app`.execute(db);

  for (const table of APPEND_ONLY) {
    await sql`revoke update, delete on ${sql.id(table)} from tautline_app`.execute(db);
  }
  // Append-only tables refuse TRUNCATE too, even from the owner (audit_events already did).
  for (const table of APPEND_ONLY.filter((t) => t !== "audit_events")) {
    await sql`create trigger ${sql.id(`${table}_no_truncate`)} before truncate on ${sql.id(table)}
      for each statement execute function refuse_change()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of APPEND_ONLY.filter((t) => t !== "audit_events")) {
    await sql`drop trigger ${sql.id(`${table}_no_truncate`)} on ${sql.id(table)}`.execute(db);
  }
  await sql`alter default privileges in schema public revoke all on tables from tautline_app`.execute(db);
  await sql`alter default privileges in schema public revoke all on sequences from tautline_app`.execute(db);
  await sql`revoke all on all tables in schema public from tautline_app`.execute(db);
  await sql`revoke all on all sequences in schema public from tautline_app`.execute(db);
  await sql`revoke usage on schema public from tautline_app`.execute(db);
}
