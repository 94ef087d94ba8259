import fc from "fast-check";
import { IDBFactory, IDBKeyRange } from "fake-indexeddb";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { deviceId, FieldDb, writeMeta } from "@/lib/offline/db";
import { correctionOf, saveRecord } from "@/lib/offline/outbox";
import { SyncClient, type Fetch } from "@/lib/offline/sync-client";
import { setTimeout as sleep } from "node:timers/promises";
import { createDb, type Db } from "@/db/connect";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { startTcpCut, type TcpCut } from "../support/tcp-cut";
import { routeState } from "./route-mocks";
import { buildWorld, recordPayload, type SyncWorld } from "./sync-fixtures";

/**
 * Model-based test of the sync client against the real server: fast-check drives a tablet
 * through creates, corrections, going offline and online, lost answers, double deliveries, tablet
 * restarts, the app killed in the middle of a push (every connection it holds reset at a drawn
 * moment, and it never writes again) and PostgreSQL restarting under a push (every connection
 * reset and new ones refused until it is back); the model is the set of records the tablet committed. After every step the server
 * holds nothing the tablet did not make and its chains have no gaps; after quiescence every
 * committed record is on the server exactly once.
 */

vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);
vi.mock("@/lib/auth/session", async () => (await import("./route-mocks")).mockedSession);
const { POST: push } = await import("@/app/api/sync/push/route");
const { GET: pull } = await import("@/app/api/sync/pull/route");
const { GET: download } = await import("@/app/api/field/pours/[pourId]/route");

const ORIGIN = process.env.APP_URL ?? "http://localhost:3000";
let t: TestDatabase;
let w: SyncWorld;
/** The path from the app to PostgreSQL, which a "database restart" cuts; the app connects through it. */
let dbLink: TcpCut;
let appDb: Db;

/** A connection string to the test database, as the app's role, through a relay on `port`. */
function appUrlThrough(port: number): string {
  const url = new URL(t.appUrl);
  url.port = String(port);
  return url.toString();
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  w = await buildWorld(t.db);
  dbLink = await startTcpCut(Number(new URL(t.url).port));
  appDb = createDb(appUrlThrough(dbLink.port), 5);
  routeState.db = appDb;
  routeState.user = {
    id: w.crew.id,
    email: w.crew.email,
    name: "Crew",
    isOperator: false,
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  };
});
afterAll(async () => {
  await appDb?.destroy();
  await dbLink?.close();
  await t.drop();
});

interface Net {
  online: boolean;
  dropNextPush: boolean;
  duplicateNextPush: boolean;
  /** PostgreSQL restarts as the next push arrives: cut before it, back after its answer. */
  dbRestartOnNextPush: boolean;
  /** The app process dies this many milliseconds into the next push (null: it does not). */
  killAppInNextPushAfterMs: number | null;
}

const ctx = () => ({ params: Promise.resolve({}) });

/**
 * The app killed in the middle of a push: the handler runs on a connection pool of its own, through
 * a relay that is closed at the drawn moment. Every connection resets (PostgreSQL rolls back what
 * was in flight, as when a process dies) and no new one opens, so the dead app writes nothing
 * more; the tablet sees the connection drop. The handler's leftovers are awaited before going on.
 */
async function pushThenKill(request: NextRequest, afterMs: number): Promise<never> {
  const link = await startTcpCut(Number(new URL(t.url).port));
  const doomed = createDb(appUrlThrough(link.port), 3);
  routeState.db = doomed;
  const inFlight = push(request, ctx()).catch(() => undefined);
  await sleep(afterMs);
  await link.close();
  await inFlight;
  routeState.db = appDb;
  await doomed.destroy().catch(() => undefined);
  throw new TypeError("connection reset");
}

/** The tablet's network: the real route handlers behind switchable faults. */
function network(net: Net): Fetch {
  return async (url, init) => {
    if (!net.online) throw new TypeError("Failed to fetch");
    const request = () =>
      new NextRequest(`${ORIGIN}${url}`, {
        method: init?.method ?? "GET",
        body: init?.body as string | undefined,
        headers: { ...(init?.headers as Record<string, string> | undefined), origin: ORIGIN },
      });
    if (url.startsWith("/api/sync/push")) {
      if (net.killAppInNextPushAfterMs !== null) {
        const afterMs = net.killAppInNextPushAfterMs;
        net.killAppInNextPushAfterMs = null;
        return pushThenKill(request(), afterMs);
      }
      if (net.dbRestartOnNextPush) {
        net.dbRestartOnNextPush = false;
        await dbLink.cut();
        try {
          return await push(request(), ctx()); // answered without the database: nothing is stored
        } finally {
          await dbLink.restore();
        }
      }
      if (net.dropNextPush) {
        net.dropNextPush = false;
        await push(request(), ctx()); // the server commits…
        throw new TypeError("connection reset"); // …and the answer never arrives
      }
      if (net.duplicateNextPush) {
        net.duplicateNextPush = false;
        await push(request(), ctx());
      }
      return push(request(), ctx());
    }
    if (url.startsWith("/api/sync/pull")) return pull(request(), { params: Promise.resolve({}) });
    const pourId = url.split("/").pop()!;
    return download(request(), { params: Promise.resolve({ pourId }) });
  };
}

interface Model {
  /** recordId → chain and revision, for every record the tablet committed. */
  records: Map<string, { chainId: string; revision: number }>;
  /** chainId → newest committed revision's record id. */
  heads: Map<string, string>;
}

class Tablet {
  db: FieldDb;
  client: SyncClient;
  constructor(
    readonly name: string,
    readonly factory: IDBFactory,
    readonly net: Net,
  ) {
    this.db = new FieldDb(name, { indexedDB: factory, IDBKeyRange });
    this.client = new SyncClient({ db: this.db, fetch: network(net), locks: null, random: () => 0.5 });
  }
  restart() {
    this.db.close();
    this.db = new FieldDb(this.name, { indexedDB: this.factory, IDBKeyRange });
    this.client = new SyncClient({ db: this.db, fetch: network(this.net), locks: null, random: () => 0.5 });
  }
}

type Cmd = fc.AsyncCommand<Model, Tablet>;

/** Server rows of this tablet: nothing it did not make, chains without gaps. */
async function checkServer(model: Model, tablet: Tablet) {
  const device = await deviceId(tablet.db);
  const rows = await t.db
    .selectFrom("records")
    .select(["id", "chain_id", "revision"])
    .where("device_id", "=", device)
    .execute();
  for (const row of rows)
    expect(model.records.get(row.id), `server row ${row.id} not made by the tablet`).toEqual({
      chainId: row.chain_id,
      revision: row.revision,
    });
  const byChain = new Map<string, number[]>();
  for (const row of rows) byChain.set(row.chain_id, [...(byChain.get(row.chain_id) ?? []), row.revision]);
  for (const revisions of byChain.values())
    expect(revisions.sort((a, b) => a - b)).toEqual(revisions.map((_, i) => i + 1));
  return rows;
}

// Stressing times inside the demo's calibration period (seeded as on 2026-12-01), one minute apart.
let stressedAt = Date.parse("2026-12-02T14:00:00Z");

class CreateCmd implements Cmd {
  constructor(readonly tendon: number) {}
  check = () => true;
  async run(model: Model, tablet: Tablet) {
    const { recordId, payload } = recordPayload(
      w,
      w.tendons[this.tendon]!.id,
      {},
      { deviceTime: new Date((stressedAt += 60_000)).toISOString() },
    );
    await saveRecord(tablet.db, { recordId, payload, authorName: "Crew", local: null });
    model.records.set(recordId, { chainId: recordId, revision: 1 });
    model.heads.set(recordId, recordId);
  }
  toString = () => `create(${this.tendon})`;
}

class ReviseCmd implements Cmd {
  constructor(readonly pick: number) {}
  check = (model: Readonly<Model>) => model.heads.size > 0;
  async run(model: Model, tablet: Tablet) {
    const chains = [...model.heads.keys()];
    const chainId = chains[this.pick % chains.length]!;
    const head = (await tablet.db.records.get(model.heads.get(chainId)!))!;
    const fix = correctionOf(head, { remarks: `correction ${head.revision + 1}` }, "Second reading of the mark");
    await saveRecord(tablet.db, { ...fix, authorName: "Crew", local: null });
    model.records.set(fix.recordId, { chainId, revision: fix.payload.revision });
    model.heads.set(chainId, fix.recordId);
  }
  toString = () => `revise(${this.pick})`;
}

const netCmd = (name: string, change: (net: Net) => void): Cmd => ({
  check: () => true,
  run: async (_m, tablet) => change(tablet.net),
  toString: () => name,
});

class SyncCmd implements Cmd {
  check = () => true;
  async run(model: Model, tablet: Tablet) {
    await tablet.client.sync({ force: true });
    await checkServer(model, tablet);
    expect(await tablet.db.outbox.where("state").equals("attention").count()).toBe(0);
  }
  toString = () => "sync";
}

class RestartCmd implements Cmd {
  check = () => true;
  async run(model: Model, tablet: Tablet) {
    tablet.restart();
    // Nothing committed is lost across a restart.
    for (const id of model.records.keys()) expect(await tablet.db.records.get(id)).toBeDefined();
  }
  toString = () => "restart";
}

describe("sync client against the real server (model-based)", () => {
  it("after quiescence every committed record is on the server exactly once", async () => {
    const create = fc.integer({ min: 0, max: 40 }).map((i) => new CreateCmd(i));
    const sync = fc.constant(new SyncCmd());
    // Creates and syncs are listed twice so runs carry work through the faults.
    const commands = [
      create,
      create,
      fc.nat(50).map((i) => new ReviseCmd(i)),
      sync,
      fc.constant(netCmd("offline", (n) => (n.online = false))),
      fc.constant(netCmd("online", (n) => (n.online = true))),
      fc.constant(netCmd("dropResponse", (n) => (n.dropNextPush = true))),
      fc.constant(netCmd("deliverTwice", (n) => (n.duplicateNextPush = true))),
      fc.constant(netCmd("databaseRestart", (n) => (n.dbRestartOnNextPush = true))),
      fc.nat(40).map((ms) => netCmd(`killApp(${ms} ms)`, (n) => (n.killAppInNextPushAfterMs = ms))),
      fc.constant(new SyncCmd()),
      fc.constant(new RestartCmd()),
    ];
    await fc.assert(
      fc.asyncProperty(fc.commands(commands, { maxCommands: 40 }), async (cmds) => {
        const net: Net = {
          online: true,
          dropNextPush: false,
          duplicateNextPush: false,
          dbRestartOnNextPush: false,
          killAppInNextPushAfterMs: null,
        };
        const tablet = new Tablet(`model-${crypto.randomUUID()}`, new IDBFactory(), net);
        await writeMeta(tablet.db, "session", {
          userId: w.crew.id,
          name: "Crew",
          email: w.crew.email,
          projects: [],
          checkedAt: new Date().toISOString(),
        });
        expect(await tablet.client.download(w.pourId)).toEqual({ ok: true });
        const model: Model = { records: new Map(), heads: new Map() };
        await fc.asyncModelRun(() => ({ model, real: tablet }), cmds);

        // Quiescence: the connection comes back and stays.
        Object.assign(net, {
          online: true,
          dropNextPush: false,
          duplicateNextPush: false,
          dbRestartOnNextPush: false,
          killAppInNextPushAfterMs: null,
        });
        for (let i = 0; i < 5 && (await tablet.db.outbox.count()) > 0; i++) await tablet.client.sync({ force: true });
        expect(await tablet.db.outbox.count()).toBe(0);
        const rows = await checkServer(model, tablet);
        expect(rows.map((r) => r.id).sort()).toEqual([...model.records.keys()].sort());
        const local = await tablet.db.records.where("syncState").notEqual("synced").count();
        expect(local).toBe(0);
        tablet.db.close();
      }),
      { numRuns: Number(process.env.SYNC_MODEL_RUNS ?? 100) },
    );
  }, 300_000);
});
