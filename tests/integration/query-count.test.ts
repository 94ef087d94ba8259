import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Database } from "@/db/types";
import { findFlags } from "@/lib/server/find-flags";
import { getPourReport } from "@/lib/server/get-pour-report";
import { listTendonResults } from "@/lib/server/list-tendon-results";
import { listTendons } from "@/lib/server/list-tendons";
import { pullChanges } from "@/lib/server/pull-changes";
import { pushOps, type Pusher } from "@/lib/server/push-ops";
import type { SessionUser } from "@/lib/auth/session";
import { seedBenchProject, toSyncOp, type BenchProject } from "../../scripts/bench/harness";
import { createTestDatabase, type TestDatabase } from "../support/database";

/**
 * No N+1 on the list screens and the pull: the number of SQL statements a read sends does not
 * grow with the number of tendons. The same reads run on a pour of 3 tendons and one of 40, every
 * record out of band (so each tendon has a record, an evaluation and a flag), through a Kysely
 * instance that counts every statement it sends.
 */

let t: TestDatabase;
let counting: Kysely<Database>;
let statements = 0;
type Crew = Pusher & Pick<SessionUser, "memberships">;
const small = { tendons: 3 } as { tendons: number; project: BenchProject; crew: Crew };
const large = { tendons: 40 } as { tendons: number; project: BenchProject; crew: Crew };

async function stored(which: typeof small, code: string) {
  which.project = await seedBenchProject(t.db, { code, pours: 1, tendonsPerPour: which.tendons, outOfBandEvery: 1 });
  const user = await t.db
    .selectFrom("users")
    .select("id")
    .where("email", "=", which.project.crewEmail)
    .executeTakeFirstOrThrow();
  which.crew = {
    id: user.id,
    memberships: [{ projectId: which.project.projectId, projectName: "Bench", projectCode: code, role: "crew" }],
  };
  const ops = which.project.opsByPour[0]!.map(toSyncOp);
  const { results } = await pushOps(t.db, { user: which.crew, deviceId: `count-${code}-tablet`, ops });
  expect(results.map((r) => r.status)).toEqual(ops.map(() => "applied"));
}

/** Runs a read through the counting instance; answers what it returned and how many statements it sent. */
async function count<T>(read: (db: Kysely<Database>) => Promise<T>): Promise<{ result: T; statements: number }> {
  statements = 0;
  const result = await read(counting);
  return { result, statements };
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await stored(small, "QCS");
  await stored(large, "QCL");
  counting = new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: t.url, max: 2 }) }),
    log: (event) => {
      if (event.level === "query") statements++;
    },
  });
}, 120_000);

afterAll(async () => {
  await counting?.destroy();
  await t?.drop();
});

const at = (w: typeof small) => ({ projectId: w.project.projectId, pourId: w.project.pourIds[0]! });

describe("statements per read do not grow with the tendons", () => {
  it("the tendon list of a pour", async () => {
    const a = await count((db) => listTendons(db, at(small)));
    const b = await count((db) => listTendons(db, at(large)));
    expect(a.result.tendons).toHaveLength(3);
    expect(b.result.tendons).toHaveLength(40);
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
  });

  it("the tendon results of a pour (report and office tendon table)", async () => {
    const a = await count((db) => listTendonResults(db, at(small)));
    const b = await count((db) => listTendonResults(db, at(large)));
    expect(a.result).toHaveLength(3);
    expect(b.result).toHaveLength(40);
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
  });

  it("the pour report", async () => {
    const a = await count((db) => getPourReport(db, at(small)));
    const b = await count((db) => getPourReport(db, at(large)));
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
  });

  it("the review queue", async () => {
    const filter = { status: "any_open" as const };
    const a = await count((db) => findFlags(db, { projectIds: [small.project.projectId], filter }));
    const b = await count((db) => findFlags(db, { projectIds: [large.project.projectId], filter }));
    expect(a.result).toHaveLength(3);
    expect(b.result).toHaveLength(40);
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
  });

  it("the pull of a pour from the start", async () => {
    const a = await count((db) => pullChanges(db, { user: small.crew, cursor: "0", pourIds: small.project.pourIds }));
    const b = await count((db) => pullChanges(db, { user: large.crew, cursor: "0", pourIds: large.project.pourIds }));
    expect([a.result.tendons.length, a.result.records.length, a.result.flags.length]).toEqual([3, 3, 3]);
    expect([b.result.tendons.length, b.result.records.length, b.result.flags.length]).toEqual([40, 40, 40]);
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
  });
});
