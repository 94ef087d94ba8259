import net from "node:net";
import type { KyselyPlugin } from "kysely";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createDb, type Db } from "@/db/connect";
import { MomentOld, replicaOutOfReach } from "@/db/moment-old";
import { getPourInsight } from "@/lib/server/get-pour-insight";
import { getShareBoard } from "@/lib/server/get-share-board";
import { createShareLink } from "@/lib/server/manage-share-links";
import { seedDemo } from "@/scripts/seed/demo";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { assertLocalDatabase } from "../support/local-database";
import { startTcpCut } from "../support/tcp-cut";

// The reads that may be a moment old (db/moment-old.ts): the pour insight and the status board go
// to the replica when there is one, to the primary when there is none or it is out of reach, and
// nothing else changes. The "replica" here is the same test database reached by another pool (as
// the app's own role), so what it returns must equal what the primary returns.

let t: TestDatabase;
let pour: { projectId: string; pourId: string };
let engineer: { id: string };
const opened: Db[] = [];

/** A pool on the test server, as the replica would be; refuses anything but loopback. */
function replicaPool(url: string): Db {
  assertLocalDatabase(url, "DATABASE_REPLICA_URL");
  const db = createDb(url, 2, { connectTimeoutMs: 2_000 });
  opened.push(db);
  return db;
}

/** The same pool, counting the statements sent through it (a plugin sees each one before it runs). */
function counted(db: Db): { db: Db; sent: () => number } {
  let n = 0;
  const plugin: KyselyPlugin = {
    transformQuery: (args) => {
      n++;
      return args.node;
    },
    transformResult: async (args) => args.result,
  };
  return { db: db.withPlugin(plugin), sent: () => n };
}

/** A loopback port nothing listens on: taken from the system, then let go. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

function urlOnPort(port: number): string {
  const url = new URL(t.appUrl);
  url.port = String(port);
  return url.toString();
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
  // A pour the crew has stressed, so the insight has points to compare.
  const row = await t.db
    .selectFrom("evaluations")
    .innerJoin("tendons", "tendons.id", "evaluations.tendon_id")
    .select(["tendons.project_id as projectId", "tendons.pour_id as pourId"])
    .where("evaluations.deviation_pct", "is not", null)
    .executeTakeFirstOrThrow();
  pour = { projectId: row.projectId, pourId: row.pourId };
  engineer = await t.db
    .selectFrom("project_members")
    .innerJoin("users", "users.id", "project_members.user_id")
    .select("users.id")
    .where("project_members.project_id", "=", pour.projectId)
    .where("project_members.role", "=", "engineer")
    .executeTakeFirstOrThrow();
}, 120_000);

afterAll(async () => {
  await Promise.all(opened.map((db) => db.destroy()));
  await t?.drop();
});

describe("reads that may be a moment old", () => {
  it("go to the primary when no replica is set", async () => {
    const primary = counted(t.db);
    const insight = await getPourInsight(new MomentOld(primary.db, null), pour);
    expect(insight.points.length).toBeGreaterThan(0);
    expect(primary.sent()).toBeGreaterThan(0);
  });

  it("read the insight and the status board through the replica, the share link and its audit on the primary", async () => {
    const expected = await getPourInsight(new MomentOld(t.db, null), pour);
    const primary = counted(t.db);
    const replica = counted(replicaPool(t.appUrl));
    const reads = new MomentOld(primary.db, replica.db);
    expect(reads.hasReplica).toBe(true);

    expect(await getPourInsight(reads, pour)).toEqual(expected);
    expect(primary.sent()).toBe(0);
    const insightStatements = replica.sent();
    expect(insightStatements).toBeGreaterThan(0);

    const link = await createShareLink(t.db, {
      projectId: pour.projectId,
      by: engineer,
      values: { label: "Replica check", days: 7 },
    });
    const board = await getShareBoard(primary.db, reads, { token: link.token, ip: "192.0.2.7" });
    expect(board.pours.map((p) => p.pourId)).toContain(pour.pourId);
    // The link's lookup and the view's audit row went to the primary; the board's queries to the replica.
    expect(primary.sent()).toBe(2);
    expect(replica.sent()).toBeGreaterThan(insightStatements);
    const audit = await t.db
      .selectFrom("audit_events")
      .select(["outcome", "ip"])
      .where("action", "=", "share.view")
      .where("project_id", "=", pour.projectId)
      .execute();
    expect(audit).toContainEqual({ outcome: "success", ip: "192.0.2.7" });
  });

  it("fall back to the primary with a log line when the replica's port is closed, and try it again later", async () => {
    const expected = await getPourInsight(new MomentOld(t.db, null), pour);
    const primary = counted(t.db);
    const replica = counted(replicaPool(urlOnPort(await closedPort())));
    const lines: string[] = [];
    let clock = 1_000_000;
    const reads = new MomentOld(primary.db, replica.db, {
      retryAfterMs: 30_000,
      log: (line) => lines.push(line),
      now: () => clock,
    });

    expect(await getPourInsight(reads, pour)).toEqual(expected);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/read replica out of reach \(ECONNREFUSED.*go to the primary; .*again in 30 s/);
    const tried = replica.sent();
    expect(tried).toBeGreaterThan(0);
    expect(primary.sent()).toBeGreaterThan(0);

    // Within the interval the replica is not tried at all, and nothing more is logged.
    expect(await getPourInsight(reads, pour)).toEqual(expected);
    expect(replica.sent()).toBe(tried);
    expect(lines).toHaveLength(1);

    // After it, the replica is tried again (still closed: one more line, still no error).
    clock += 30_001;
    expect(await getPourInsight(reads, pour)).toEqual(expected);
    expect(replica.sent()).toBeGreaterThan(tried);
    expect(lines).toHaveLength(2);
  });

  it("fall back when a replica that was serving goes away, and come back to it when it returns", async () => {
    const relay = await startTcpCut(Number(new URL(t.appUrl).port));
    try {
      const primary = counted(t.db);
      const replica = counted(replicaPool(urlOnPort(relay.port)));
      const lines: string[] = [];
      let clock = 0;
      const reads = new MomentOld(primary.db, replica.db, { log: (l) => lines.push(l), now: () => clock });
      const expected = await getPourInsight(reads, pour);
      expect(primary.sent()).toBe(0);

      await relay.cut();
      expect(await getPourInsight(reads, pour)).toEqual(expected);
      expect(primary.sent()).toBeGreaterThan(0);
      expect(lines).toHaveLength(1);

      await relay.restore();
      clock += 30_001;
      const before = primary.sent();
      expect(await getPourInsight(reads, pour)).toEqual(expected);
      expect(primary.sent()).toBe(before);
      expect(lines).toHaveLength(1);
    } finally {
      await relay.close();
    }
  });

  it("do not retry a read that fails on its own (no such pour) on the primary", async () => {
    const primary = counted(t.db);
    const replica = counted(replicaPool(t.appUrl));
    const lines: string[] = [];
    const reads = new MomentOld(primary.db, replica.db, { log: (l) => lines.push(l) });
    await expect(
      getPourInsight(reads, { projectId: pour.projectId, pourId: "00000000-0000-7000-8000-000000000000" }),
    ).rejects.toMatchObject({ code: "NOT_FOUND" });
    expect(primary.sent()).toBe(0);
    expect(lines).toEqual([]);
  });

  it("tell the replica's absence from the read's own faults", () => {
    const withCode = (code: string, message = "x") => Object.assign(new Error(message), { code });
    expect(replicaOutOfReach(withCode("ECONNREFUSED"))).toBe(true);
    expect(replicaOutOfReach(withCode("57P03", "the database system is starting up"))).toBe(true);
    expect(replicaOutOfReach(withCode("53300", "sorry, too many clients already"))).toBe(true);
    expect(replicaOutOfReach(withCode("40001", "canceling statement due to conflict with recovery"))).toBe(true);
    expect(replicaOutOfReach(new Error("timeout exceeded when trying to connect"))).toBe(true);
    expect(replicaOutOfReach(new AggregateError([withCode("ECONNREFUSED"), withCode("ECONNREFUSED")]))).toBe(true);
    expect(replicaOutOfReach(withCode("42P01", 'relation "pours" does not exist'))).toBe(false);
    expect(replicaOutOfReach(withCode("22P02", "invalid input syntax for type uuid"))).toBe(false);
    expect(replicaOutOfReach(new Error("No such pour on this project."))).toBe(false);
  });

  it("are wired from DATABASE_REPLICA_URL: the app's handle falls back when the replica's port is closed", async () => {
    const saved = { url: process.env.DATABASE_URL, replica: process.env.DATABASE_REPLICA_URL };
    const global = globalThis as { tautlineDb?: unknown; tautlineMomentOld?: unknown };
    const replicaUrl = urlOnPort(await closedPort());
    assertLocalDatabase(replicaUrl, "DATABASE_REPLICA_URL");
    process.env.DATABASE_URL = t.appUrl;
    process.env.DATABASE_REPLICA_URL = replicaUrl;
    delete global.tautlineDb;
    delete global.tautlineMomentOld;
    vi.resetModules();
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const app = await import("@/db");
    try {
      expect(app.momentOld.hasReplica).toBe(true);
      const expected = await getPourInsight(new MomentOld(t.db, null), pour);
      expect(await getPourInsight(app.momentOld, pour)).toEqual(expected);
      expect(logged.mock.calls.map((c) => String(c[0])).join("\n")).toMatch(/read replica out of reach/);
    } finally {
      logged.mockRestore();
      await app.db.destroy();
      delete global.tautlineDb;
      delete global.tautlineMomentOld;
      process.env.DATABASE_URL = saved.url;
      if (saved.replica === undefined) delete process.env.DATABASE_REPLICA_URL;
      else process.env.DATABASE_REPLICA_URL = saved.replica;
    }
  });
});
