import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Database } from "@/db/types";
import { findClockSkews } from "@/lib/server/find-clock-skews";
import { findFlags } from "@/lib/server/find-flags";
import { getDailyReport } from "@/lib/server/get-daily-report";
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
let sent: string[] = [];
type Crew = Pusher & Pick<SessionUser, "memberships">;
type Stored = { tendons: number; pours?: number; project: BenchProject; crew: Crew };
const small = { tendons: 3 } as Stored;
const large = { tendons: 40 } as Stored;
/** Three pours of two tendons, every pour stressed on the same day, for the daily report. */
const several = { tendons: 2, pours: 3 } as Stored;

async function stored(which: Stored, code: string) {
  which.project = await seedBenchProject(t.db, {
    code,
    pours: which.pours ?? 1,
    tendonsPerPour: which.tendons,
    outOfBandEvery: 1,
  });
  const user = await t.db
    .selectFrom("users")
    .select("id")
    .where("email", "=", which.project.crewEmail)
    .executeTakeFirstOrThrow();
  which.crew = {
    id: user.id,
    memberships: [{ projectId: which.project.projectId, projectName: "Bench", projectCode: code, role: "crew" }],
  };
  const ops = which.project.opsByPour.flat().map(toSyncOp);
  const { results } = await pushOps(t.db, { user: which.crew, deviceId: `count-${code}-tablet`, ops });
  expect(results.map((r) => r.status)).toEqual(ops.map(() => "applied"));
}

/** Runs a read through the counting instance; answers what it returned and how many statements it sent. */
async function count<T>(
  read: (db: Kysely<Database>) => Promise<T>,
): Promise<{ result: T; statements: number; sent: string[] }> {
  statements = 0;
  sent = [];
  const result = await read(counting);
  return { result, statements, sent };
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await stored(small, "QCS");
  await stored(large, "QCL");
  await stored(several, "QCD");
  counting = new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: t.url, max: 2 }) }),
    log: (event) => {
      if (event.level === "query") {
        statements++;
        sent.push(event.query.sql);
      }
    },
  });
}, 120_000);

afterAll(async () => {
  await counting?.destroy();
  await t?.drop();
});

const at = (w: Stored) => ({ projectId: w.project.projectId, pourId: w.project.pourIds[0]! });

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

  it("the daily report: per pour only the pour's own reads, the project read once", async () => {
    // The bench's records are all stressed at 10:00 UTC on 2026-12-02 (scripts/bench/harness.ts).
    const day = (w: Stored) => (db: Kysely<Database>) =>
      getDailyReport(db, { projectId: w.project.projectId, day: "2026-12-02" });
    const a = await count(day(small));
    const b = await count(day(large));
    const c = await count(day(several));
    expect(a.result.pours.map((p) => p.records.length)).toEqual([3]);
    expect(b.result.pours.map((p) => p.records.length)).toEqual([40]);
    expect(c.result.pours.map((p) => p.records.length)).toEqual([2, 2, 2]);
    expect(a.statements).toBeGreaterThan(0);
    expect(b.statements).toBe(a.statements);
    // Three pours cost three pours' own reads, no more: the project row is read once for the day,
    // and no report reads the project's every flag or disposition to name them.
    const fromProjects = (sql: string[]) => sql.filter((q) => /from "projects"/.test(q)).length;
    expect(fromProjects(a.sent)).toBe(1);
    expect(fromProjects(c.sent)).toBe(1);
    const projectWide = /^select "id", "number" as "n" from "(flags|dispositions)" where "project_id" = \$1$/;
    expect(c.sent.filter((q) => projectWide.test(q))).toEqual([]);
    const pourReport = await count((d) => getPourReport(d, at(small)));
    expect(c.statements - a.statements).toBe(2 * (pourReport.statements - fromProjects(pourReport.sent)));
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

  it("the review queue's records whose time is off", async () => {
    // The bench's records carry a device time of 2026-12-02 10:00 UTC and were received when this
    // test stored them, so every one is off the receipt by more than the default 10 minutes.
    const a = await count((db) => findClockSkews(db, { projectIds: [small.project.projectId] }));
    const b = await count((db) => findClockSkews(db, { projectIds: [large.project.projectId] }));
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

  it("a batch pushed again: answered from its claims in one statement, no tendon read", async () => {
    const again = (w: Stored) => (db: Kysely<Database>) =>
      pushOps(db, {
        user: w.crew,
        deviceId: `count-${w.tendons}-again`,
        ops: w.project.opsByPour.flat().map(toSyncOp),
      });
    const a = await count(again(small));
    const b = await count(again(large));
    expect(a.result.results.map((r) => r.status)).toEqual(Array(3).fill("duplicate"));
    expect(b.result.results.map((r) => r.status)).toEqual(Array(40).fill("duplicate"));
    // The stored answer comes back: the verdict the first delivery got (every bench record here reads 15 % long).
    expect(b.result.results.every((r) => r.evaluation?.verdict === "long")).toBe(true);
    expect(a.sent).toEqual([expect.stringMatching(/^select .* from "applied_ops" where "op_id" = any\(/)]);
    expect(b.statements).toBe(1);
  });
});
