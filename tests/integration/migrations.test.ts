import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { migrateToLatest } from "@/db/migrate";
import { migrations } from "@/db/migrations";
import { createTestDatabase, type TestDatabase } from "../support/database";

let t: TestDatabase;
beforeAll(async () => {
  t = await createTestDatabase();
});
afterAll(async () => {
  await t.drop();
});

async function tableNames(): Promise<string[]> {
  const { rows } = await sql<{ table_name: string }>`
    select table_name from information_schema.tables where table_schema = 'public' order by table_name`.execute(t.db);
  return rows.map((r) => r.table_name);
}

describe("migrations", () => {
  it("run up on an empty database and create the core tables", async () => {
    expect(await tableNames()).toEqual([]);
    const { results = [] } = await migrateToLatest(t.db);
    expect(results.map((r) => [r.migrationName, r.status])).toEqual(
      Object.keys(migrations).map((name) => [name, "Success"]),
    );
    const tables = await tableNames();
    for (const table of [
      "users",
      "projects",
      "project_members",
      "pours",
      "strand_lots",
      "tendons",
      "records",
      "evaluations",
      "flags",
      "dispositions",
      "notifications",
      "applied_ops",
      "audit_events",
    ]) {
      expect(tables).toContain(table);
    }
  });

  it("are keyed in time order so the static index applies them in sequence", () => {
    const keys = Object.keys(migrations);
    expect(keys).toEqual([...keys].sort());
    for (const key of keys) expect(key).toMatch(/^\d{4}-\d{2}-\d{2}T\d{6}-[a-z0-9-]+$/);
  });

  it("do nothing when run a second time", async () => {
    const { results = [] } = await migrateToLatest(t.db);
    expect(results).toEqual([]);
  });

  it("enforce the data rules in the schema itself", async () => {
    const project = await t.db
      .insertInto("projects")
      .values({ code: "CHK", name: "Constraint check" })
      .returning(["id", "tolerance_pct", "comparison_basis", "unit_system"])
      .executeTakeFirstOrThrow();
    expect(project).toMatchObject({ tolerance_pct: 7, comparison_basis: "gross", unit_system: "us" });

    await expect(t.db.insertInto("users").values({ email: "Mixed@Case.test", name: "x" }).execute()).rejects.toThrow(
      /users_email_lower/,
    );
    await expect(
      t.db
        .insertInto("project_members")
        .values({ project_id: project.id, user_id: project.id, role: "boss" as never })
        .execute(),
    ).rejects.toThrow();
    const pour = await t.db
      .insertInto("pours")
      .values({ project_id: project.id, name: "P1" })
      .returning("id")
      .executeTakeFirstOrThrow();
    await expect(
      t.db
        .insertInto("tendons")
        .values({
          project_id: project.id,
          pour_id: pour.id,
          tag: "T1",
          kind: "unbonded_monostrand",
          strand_size: "0.5in",
          strand_count: 1,
          segments: JSON.stringify([]),
          ends: "A",
        })
        .execute(),
    ).rejects.toThrow(/segments/);
  });
});
