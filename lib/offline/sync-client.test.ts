import { afterEach, describe, expect, it, vi } from "vitest";
import type { PullResponse, PushResponse } from "@/lib/schemas/sync";
import { readMeta, type SyncMeta } from "./db";
import { saveRecord } from "./outbox";
import { NO_CONNECTION, SyncClient, UNREADABLE_ANSWER, type Fetch, type LockManagerLike } from "./sync-client";
import { emptyPull, samplePayload, signIn, testDb } from "./test-support";
import { projectBasis } from "@/tests/support/judge-record";

const opened: { close: () => void }[] = [];
afterEach(() => {
  for (const db of opened.splice(0)) db.close();
});

async function tablet(records = 1) {
  const { db } = testDb();
  opened.push(db);
  await signIn(db);
  const ids: string[] = [];
  for (let i = 0; i < records; i++) {
    const s = samplePayload();
    await saveRecord(db, { ...s, authorName: "Test Crew", local: null });
    ids.push(s.recordId);
  }
  return { db, ids };
}

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } });

/** A server that applies every op it is sent, and counts the pushes. */
function applyingServer() {
  const pushes: string[][] = [];
  const fetch: Fetch = async (url, init) => {
    if (url.startsWith("/api/sync/push")) {
      const body = JSON.parse(String(init!.body)) as { ops: { opId: string }[] };
      pushes.push(body.ops.map((o) => o.opId));
      return json(200, {
        results: body.ops.map((o) => ({ opId: o.opId, status: "applied", revision: 1 })),
      } satisfies PushResponse);
    }
    return json(404, {});
  };
  return { fetch, pushes };
}

describe("SyncClient", () => {
  it("pushes the outbox in order in batches and empties it on applied", async () => {
    const { db } = await tablet(5);
    const server = applyingServer();
    const client = new SyncClient({ db, fetch: server.fetch, locks: null, batchSize: 2 });
    const outcome = await client.sync();
    expect(outcome).toMatchObject({ kind: "done", pushed: 5, confirmed: 5 });
    expect(server.pushes.map((b) => b.length)).toEqual([2, 2, 1]);
    expect(await db.outbox.count()).toBe(0);
    expect((await readMeta<SyncMeta>(db, "sync"))!.lastConfirmedSyncAt).not.toBeNull();
  });

  it("keeps the outbox on a 401 and asks for sign-in again", async () => {
    const { db } = await tablet(2);
    const client = new SyncClient({
      db,
      fetch: async () => json(401, { error: { code: "UNAUTHENTICATED" } }),
      locks: null,
    });
    expect(await client.sync()).toEqual({ kind: "signed-out" });
    expect(await db.outbox.count()).toBe(2);
    expect((await readMeta<SyncMeta>(db, "sync"))!.needsSignIn).toBe(true);
  });

  it("backs off with jitter on network errors and 5xx, and Sync now resets the wait", async () => {
    const { db } = await tablet(1);
    let clock = 1_000_000;
    let calls = 0;
    let answer: "down" | "500" | "up" = "down";
    const server = applyingServer();
    const fetch: Fetch = async (url, init) => {
      calls++;
      if (answer === "down") throw new TypeError("Failed to fetch");
      if (answer === "500") return json(500, {});
      return server.fetch(url, init);
    };
    const client = new SyncClient({ db, fetch, locks: null, now: () => clock, random: () => 0.5, baseDelayMs: 2_000 });
    const offline = await client.sync();
    expect(offline).toMatchObject({ kind: "offline", retryInMs: 1_000, message: NO_CONNECTION });
    // The browser's raw words never reach the crew, neither in the answer nor on the record.
    expect(JSON.stringify(offline)).not.toContain("Failed to fetch");
    expect((await db.outbox.toArray())[0]!.lastError).toBe(NO_CONNECTION);
    expect((await readMeta<SyncMeta>(db, "sync"))!.lastError).toBe(NO_CONNECTION);
    expect(await client.sync()).toMatchObject({ kind: "waiting" });
    expect(calls).toBe(1);
    clock += 1_001;
    answer = "500";
    expect(await client.sync()).toMatchObject({ kind: "offline", retryInMs: 2_000 });
    const [entry] = await db.outbox.toArray();
    expect(entry).toMatchObject({ attempts: 2, lastError: "The server answered 500.", state: "pending" });
    answer = "up";
    expect(await client.sync({ force: true })).toMatchObject({ kind: "done", confirmed: 1 });
    expect(await db.outbox.count()).toBe(0);
  });

  it("leaves the round to the tab that holds the lock", async () => {
    const { db } = await tablet(1);
    const held: LockManagerLike = { request: async (_name, _opts, callback) => callback(null) };
    let calls = 0;
    const client = new SyncClient({ db, fetch: async () => (calls++, json(200, { results: [] })), locks: held });
    expect(await client.sync()).toEqual({ kind: "busy" });
    expect(calls).toBe(0);
    expect(await db.outbox.count()).toBe(1);
  });

  it("shares one running round between callers in the same tab", async () => {
    const { db } = await tablet(3);
    const server = applyingServer();
    const client = new SyncClient({ db, fetch: server.fetch, locks: null });
    const [a, b] = await Promise.all([client.sync(), client.sync()]);
    expect(a).toBe(b);
    expect(server.pushes.flat()).toHaveLength(3);
  });

  it("without a signed-in person sends nothing", async () => {
    const { db } = testDb();
    opened.push(db);
    let calls = 0;
    const client = new SyncClient({ db, fetch: async () => (calls++, json(200, {})), locks: null });
    expect(await client.sync()).toEqual({ kind: "signed-out" });
    expect(calls).toBe(0);
  });
});

describe("SyncClient.sendSoon (after a save)", () => {
  it("with signal sends the saved record at once, without waiting for the timer", async () => {
    const { db } = await tablet(1);
    const server = applyingServer();
    const client = new SyncClient({ db, fetch: server.fetch, locks: null, online: () => true });
    expect(await client.sendSoon()).toMatchObject({ kind: "done", pushed: 1, confirmed: 1 });
    expect(server.pushes).toHaveLength(1);
    expect(await db.outbox.count()).toBe(0);
  });

  it("without signal tries nothing and keeps the record in the outbox", async () => {
    const { db } = await tablet(1);
    let calls = 0;
    const client = new SyncClient({
      db,
      fetch: async () => (calls++, json(200, { results: [] })),
      locks: null,
      online: () => false,
    });
    expect(await client.sendSoon()).toBeNull();
    expect(calls).toBe(0);
    expect(await db.outbox.count()).toBe(1);
  });

  it("respects the backoff: no request while waiting after a failure", async () => {
    const { db } = await tablet(1);
    const clock = 1_000_000;
    let calls = 0;
    const client = new SyncClient({
      db,
      fetch: async () => (calls++, json(503, {})),
      locks: null,
      now: () => clock,
      random: () => 0.5,
      online: () => true,
    });
    expect(await client.sync()).toMatchObject({ kind: "offline" });
    expect(await client.sendSoon()).toMatchObject({ kind: "waiting" });
    expect(calls).toBe(1);
  });

  it("respects the lock another tab holds", async () => {
    const { db } = await tablet(1);
    const held: LockManagerLike = { request: async (_name, _opts, callback) => callback(null) };
    let calls = 0;
    const client = new SyncClient({
      db,
      fetch: async () => (calls++, json(200, { results: [] })),
      locks: held,
      online: () => true,
    });
    expect(await client.sendSoon()).toEqual({ kind: "busy" });
    expect(calls).toBe(0);
  });

  it("a save during a running round is sent by a round that follows it", async () => {
    const { db } = await tablet(1);
    const server = applyingServer();
    let release!: () => void;
    const gate = new Promise<void>((resolve) => (release = resolve));
    let entered!: () => void;
    const pushing = new Promise<void>((resolve) => (entered = resolve));
    let first = true;
    const fetch: Fetch = async (url, init) => {
      if (first && url.startsWith("/api/sync/push")) {
        first = false;
        entered();
        await gate;
      }
      return server.fetch(url, init);
    };
    const client = new SyncClient({ db, fetch, locks: null, online: () => true });
    const running = client.sync();
    // The first round has read the outbox and is waiting on the server when the record is saved.
    await pushing;
    const s = samplePayload();
    await saveRecord(db, { ...s, authorName: "Test Crew", local: null });
    const after = client.sendSoon();
    release();
    await running;
    expect(await after).toMatchObject({ kind: "done", pushed: 1 });
    expect(server.pushes).toHaveLength(2);
    expect(await db.outbox.count()).toBe(0);
  });
});

describe("SyncClient: the server's answers are parsed before anything is stored", () => {
  const PROJECT_ID = "0190a0b0-0000-7000-8000-0000000000aa";
  const POUR_ID = "0190a0b0-0000-7000-8000-0000000000bb";
  const goodPull = (cursor: string, over: Partial<PullResponse> = {}): PullResponse =>
    emptyPull(cursor, {
      projects: [
        {
          id: PROJECT_ID,
          code: "T1",
          name: "Test project",
          unitSystem: "si",
          readingResolution: "1mm",
          ...projectBasis({ comparisonBasis: "gross", countJackGrip: true, wobblePerM: 0.0014 }),
          blindEntry: false,
        },
      ],
      pours: [
        {
          id: POUR_ID,
          projectId: PROJECT_ID,
          name: "Level 3 east",
          level: "3",
          plannedStressingDate: null,
          status: "planned",
          release: null,
          reopened: null,
        },
      ],
      tendons: [
        {
          id: "t1",
          projectId: PROJECT_ID,
          pourId: POUR_ID,
          tag: "U07",
          kind: "uniform",
          strandSize: "0.5",
          strandCount: 1,
          segments: [{ lengthMm: 12_000, angleRad: 0 }],
          ends: "A",
          jackGripMm: null,
          strandLotId: null,
        },
      ],
      ...over,
    });
  /** A pull whose one tendon says its strand count in words: it breaks the contract. */
  const badPull = (cursor: string) => {
    const pull = goodPull(cursor);
    return { ...pull, tendons: [{ ...pull.tendons[0], id: "t2", strandCount: "twelve" }] };
  };
  const counts = async (db: Awaited<ReturnType<typeof tablet>>["db"]) => ({
    projects: await db.projects.count(),
    pours: await db.pours.count(),
    tendons: await db.tendons.count(),
  });

  it("stores a download that matches the contract, without keys it does not name", async () => {
    const { db } = await tablet(0);
    const pull = goodPull("40");
    const withExtra = { ...pull, tendons: [{ ...pull.tendons[0], internalNote: "not for the tablet" }] };
    const client = new SyncClient({ db, fetch: async () => json(200, withExtra), locks: null });
    expect(await client.download(POUR_ID)).toEqual({ ok: true });
    expect(await counts(db)).toEqual({ projects: 1, pours: 1, tendons: 1 });
    expect(await db.pours.get(POUR_ID)).toMatchObject({ cursor: "40", name: "Level 3 east" });
    expect(await db.tendons.get("t1")).not.toHaveProperty("internalNote");
  });

  it("refuses a download that breaks the contract: nothing written, the crew's words", async () => {
    const { db } = await tablet(0);
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const client = new SyncClient({ db, fetch: async () => json(200, badPull("40")), locks: null });
    expect(await client.download(POUR_ID)).toEqual({ ok: false, status: 200, message: UNREADABLE_ANSWER });
    expect(await counts(db)).toEqual({ projects: 0, pours: 0, tendons: 0 });
    // The console says where, for whoever looks; the crew never reads the parse's own words.
    expect(String(warn.mock.calls[0]?.[1])).toContain("tendons.0.strandCount");
    expect(UNREADABLE_ANSWER).not.toMatch(/fetch|invalid|expected/i);
    warn.mockRestore();
  });

  it("refuses a pull that breaks the contract: the pour keeps its cursor, nothing new is stored, the outbox is sent", async () => {
    const { db } = await tablet(1);
    await new SyncClient({ db, fetch: async () => json(200, goodPull("40")), locks: null }).download(POUR_ID);
    const before = await counts(db);
    const server = applyingServer();
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const fetch: Fetch = async (url, init) =>
      url.startsWith("/api/sync/pull") ? json(200, badPull("41")) : server.fetch(url, init);
    const outcome = await new SyncClient({ db, fetch, locks: null, random: () => 0.5 }).sync();
    warn.mockRestore();
    expect(outcome).toMatchObject({ kind: "offline", message: UNREADABLE_ANSWER });
    expect(server.pushes).toHaveLength(1);
    expect(await counts(db)).toEqual(before);
    expect(await db.tendons.get("t2")).toBeUndefined();
    expect((await db.pours.get(POUR_ID))!.cursor).toBe("40");
    expect((await readMeta<SyncMeta>(db, "sync"))!.lastError).toBe(UNREADABLE_ANSWER);
  });

  it("stores a pull that matches the contract and moves the pour's cursor", async () => {
    const { db } = await tablet(0);
    await new SyncClient({ db, fetch: async () => json(200, goodPull("40")), locks: null }).download(POUR_ID);
    const later = goodPull("41", { tendons: [{ ...goodPull("41").tendons[0]!, id: "t3", tag: "U08" }] });
    const fetch: Fetch = async (url) => (url.startsWith("/api/sync/pull") ? json(200, later) : json(404, {}));
    expect(await new SyncClient({ db, fetch, locks: null }).sync()).toMatchObject({ kind: "done", pulled: true });
    expect(await db.tendons.get("t3")).toMatchObject({ tag: "U08" });
    expect((await db.pours.get(POUR_ID))!.cursor).toBe("41");
  });

  it("keeps the outbox when the push's answer breaks the contract, and says so in plain words", async () => {
    const { db, ids } = await tablet(2);
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const fetch: Fetch = async (url, init) => {
      const body = JSON.parse(String(init!.body)) as { ops: { opId: string }[] };
      return json(200, { results: body.ops.map((o) => ({ opId: o.opId, status: "stored" })) });
    };
    const outcome = await new SyncClient({ db, fetch, locks: null, random: () => 0.5 }).sync();
    warn.mockRestore();
    expect(outcome).toMatchObject({ kind: "offline", message: UNREADABLE_ANSWER });
    const outbox = await db.outbox.toArray();
    expect(outbox.map((e) => [e.recordId, e.state, e.lastError])).toEqual(
      ids.map((id) => [id, "pending", UNREADABLE_ANSWER]),
    );
    expect((await db.records.toArray()).every((r) => r.syncState === "pending")).toBe(true);
  });

  it("lists the pours to take out only from an answer that matches, else in the crew's words", async () => {
    const { db } = await tablet(0);
    const warn = vi.spyOn(console, "warn").mockImplementation(() => undefined);
    const pour = {
      id: POUR_ID,
      projectId: PROJECT_ID,
      projectCode: "T1",
      projectName: "Test project",
      name: "Level 3 east",
      level: "3",
      plannedStressingDate: null,
      status: "planned",
      tendonCount: 12,
    };
    const good = new SyncClient({ db, fetch: async () => json(200, { pours: [pour] }), locks: null });
    expect(await good.availablePours()).toEqual({ pours: [pour], error: null });
    const bad = new SyncClient({
      db,
      fetch: async () => json(200, { pours: [{ ...pour, tendonCount: null }] }),
      locks: null,
    });
    expect(await bad.availablePours()).toEqual({
      pours: null,
      error: "The server's list of pours could not be read; try again.",
    });
    warn.mockRestore();
  });
});
