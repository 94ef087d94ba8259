import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "@/db/connect";
import { seedDemo } from "@/scripts/seed/demo";
import { createTestDatabase, type TestDatabase } from "../support/database";

// The app connects as tautline_app (scripts/start.sh, scripts/test.sh). Each way around the
// append-only rules that worked while the app was a superuser is tried here as that role, and
// refused. Migrations, run by the owner, still work, and a table a later migration creates is
// usable by the app without a grant of its own.

let t: TestDatabase;
let app: Db;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
  app = createDb(t.appUrl, 2);
});
afterAll(async () => {
  await app?.destroy();
  await t?.drop();
});

const refused = async (statement: string) => {
  const error = await sql
    .raw(statement)
    .execute(app)
    .then(
      () => null,
      (e: unknown) => e as Error,
    );
  return error?.message ?? "(it ran)";
};

describe("the app's database role", () => {
  it("is no superuser, owns nothing and may not create roles or databases", async () => {
    const role = await sql<{ rolsuper: boolean; rolcreaterole: boolean; rolcreatedb: boolean; rolbypassrls: boolean }>`
      select rolsuper, rolcreaterole, rolcreatedb, rolbypassrls from pg_roles where rolname = current_user`.execute(
      app,
    );
    expect(role.rows[0]).toEqual({ rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolbypassrls: false });
    const owned = await sql<{ n: number }>`
      select count(*)::int as n from pg_class c join pg_namespace n on n.oid = c.relnamespace
      where n.nspname = 'public' and pg_get_userbyid(c.relowner) = 'tautline_app'`.execute(t.db);
    expect(owned.rows[0]!.n).toBe(0);
  });

  it("does the app's work: reads, inserts and updates rows", async () => {
    const n = await app
      .selectFrom("records")
      .select(sql<number>`count(*)::int`.as("n"))
      .executeTakeFirstOrThrow();
    expect(n.n).toBeGreaterThan(0);
    await app
      .updateTable("users")
      .set({ session_version: sql`session_version + 1` })
      .where("email", "=", "crew@demo.tautline.test")
      .execute();
    await app.insertInto("worker_heartbeats").values({ worker: "least-privilege-test" }).execute();
  });

  it.each([
    ["truncate audit_events", /permission denied/],
    ["truncate records", /permission denied/],
    ["truncate dispositions cascade", /permission denied/],
    ["truncate notifications", /permission denied/],
    ["delete from audit_events", /permission denied/],
    ["update records set remarks = 'changed'", /permission denied/],
    ["delete from evaluations", /permission denied/],
    ["delete from reviews", /permission denied/],
    ["update dispositions set created_at = now()", /permission denied/],
    ["delete from releases", /permission denied/],
    ["delete from pour_reopenings", /permission denied/],
    ["update report_revisions set statement = 'changed'", /permission denied/],
    ["alter table records disable trigger records_append_only", /must be owner/],
    ["alter table audit_events disable trigger all", /must be owner/],
    ["drop trigger audit_events_no_change on audit_events", /must be owner/],
    [
      "create or replace function refuse_change() returns trigger language plpgsql as $$ begin return null; end $$",
      /must be owner|permission denied/,
    ],
    ["drop table audit_events", /must be owner/],
    ["alter table records add column sneaky text", /must be owner/],
    ["create table sneaky (id int)", /permission denied for schema public/],
    ["set session_replication_role = replica", /permission denied/],
    ["insert into schema_migrations (name, timestamp) values ('x', now()::text)", /permission denied/],
    ["delete from schema_migrations", /permission denied/],
    ["create role sneaky", /permission denied/],
  ])("refuses: %s", async (statement, expected) => {
    expect(await refused(statement)).toMatch(expected);
  });

  it("refuses TRUNCATE of an append-only table even from the owner", async () => {
    for (const table of [
      "records",
      "evaluations",
      "reviews",
      "dispositions",
      "releases",
      "audit_events",
      "pour_reopenings",
      "report_revisions",
    ]) {
      const error = await sql
        .raw(`truncate ${table} cascade`)
        .execute(t.db)
        .then(
          () => null,
          (e: unknown) => e as Error,
        );
      expect(error?.message, table).toMatch(/append-only: TRUNCATE refused/);
    }
  });

  it("gets rows access to a table a later migration creates, with no grant of its own, but still no TRUNCATE", async () => {
    await sql`create table later_feature (id serial primary key, note text)`.execute(t.db);
    await sql`insert into later_feature (note) values ('by the app')`.execute(app);
    const rows = await sql<{ note: string }>`select note from later_feature`.execute(app);
    expect(rows.rows).toEqual([{ note: "by the app" }]);
    expect(await refused("truncate later_feature")).toMatch(/permission denied/);
    expect(await refused("drop table later_feature")).toMatch(/must be owner/);
  });
});
