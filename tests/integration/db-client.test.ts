import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, PREPARED_PER_CONNECTION, type Db } from "@/db/connect";
import { reusableQuery } from "@/db/reusable-query";
import { createTestDatabase, type TestDatabase } from "../support/database";

let t: TestDatabase;
let prepared: Db;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  // One connection, so every statement below runs in the session whose statements are listed.
  prepared = createDb(t.url, 1, { prepare: true });
});
afterAll(async () => {
  await prepared.destroy();
  await t.drop();
});

const preparedNames = async (db: Db) =>
  (await sql<{ name: string }>`select name from pg_prepared_statements`.execute(db)).rows.map((r) => r.name);

describe("the app's database client", () => {
  it("prepares a parameterised query once per connection and runs it again by name", async () => {
    const count = (code: string) =>
      prepared
        .selectFrom("projects")
        .select((eb) => eb.fn.countAll<number>().as("n"))
        .where("code", "=", code)
        .executeTakeFirstOrThrow();
    expect((await count("NONE")).n).toBe(0);
    const before = await preparedNames(prepared);
    expect(before.filter((n) => n.startsWith("tl_"))).toHaveLength(1);
    await prepared
      .insertInto("projects")
      .values({ code: "PRP", name: "Prepared statements (invented)", unit_system: "si", reading_resolution: "1mm" })
      .execute();
    expect((await count("PRP")).n).toBe(1);
    // The same text ran again under the same name: only the insert was added.
    expect((await preparedNames(prepared)).filter((n) => n.startsWith("tl_"))).toHaveLength(2);
  });

  it("keeps working after a prepared statement failed inside a transaction that rolled back", async () => {
    const insert = (code: string) =>
      prepared
        .insertInto("projects")
        .values({ code, name: "Rolled back (invented)", unit_system: "si", reading_resolution: "1mm" })
        .execute();
    await expect(
      prepared.transaction().execute(async (trx) => {
        await trx
          .insertInto("projects")
          .values({ code: "RBK", name: "Rolled back (invented)", unit_system: "si", reading_resolution: "1mm" })
          .execute();
        await trx
          .insertInto("projects")
          .values({ code: "RBK", name: "Same code again", unit_system: "si", reading_resolution: "1mm" })
          .execute();
      }),
    ).rejects.toMatchObject({ code: "23505" });
    await insert("RBK");
    const rows = await prepared.selectFrom("projects").select("name").where("code", "=", "RBK").execute();
    expect(rows).toEqual([{ name: "Rolled back (invented)" }]);
  });

  it(`names at most ${PREPARED_PER_CONNECTION} statements on a connection and runs the rest unnamed`, async () => {
    for (let i = 0; i < PREPARED_PER_CONNECTION + 20; i++) {
      const { rows } = await sql<{ v: number }>`select ${i}::int + ${sql.raw(String(i))} as v`.execute(prepared);
      expect(rows[0]!.v).toBe(2 * i);
    }
    expect((await preparedNames(prepared)).filter((n) => n.startsWith("tl_"))).toHaveLength(PREPARED_PER_CONNECTION);
  });
});

describe("a reusable query", () => {
  const byCode = reusableQuery(["code", "name"], (db, a) =>
    db
      .selectFrom("projects")
      .select(["code", "name"])
      .where("code", "=", a.code)
      .where("name", "!=", a.name)
      .where("unit_system", "=", "si"),
  );

  it("answers as the same query built for each call would", async () => {
    await t.db
      .insertInto("projects")
      .values([
        { code: "RQ1", name: "First (invented)", unit_system: "si", reading_resolution: "1mm" },
        { code: "RQ2", name: "Second (invented)", unit_system: "si", reading_resolution: "1mm" },
      ])
      .execute();
    expect(await byCode.executeTakeFirst(t.db, { code: "RQ2", name: "x" })).toEqual({
      code: "RQ2",
      name: "Second (invented)",
    });
    expect(await byCode.executeTakeFirst(t.db, { code: "RQ1", name: "x" })).toEqual({
      code: "RQ1",
      name: "First (invented)",
    });
    expect(await byCode.executeTakeFirst(t.db, { code: "RQ1", name: "First (invented)" })).toBeUndefined();
  });

  it("refuses an argument written into the SQL text, or one it never uses", async () => {
    const inText = reusableQuery(["code"], (db, a) =>
      db.selectFrom("projects").select("code").where(sql.ref(a.code), "=", "x"),
    );
    await expect(inText.executeTakeFirst(t.db, { code: "RQ1" })).rejects.toThrow(/SQL text/);
    const unused = reusableQuery(["code", "spare"], (db, a) =>
      db.selectFrom("projects").select("code").where("code", "=", a.code),
    );
    await expect(unused.executeTakeFirst(t.db, { code: "RQ1", spare: "y" })).rejects.toThrow(/spare/);
  });
});
