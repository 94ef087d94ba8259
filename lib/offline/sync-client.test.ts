import { afterEach, describe, expect, it } from "vitest";
import type { PushResponse } from "@/lib/schemas/sync";
import { readMeta, type SyncMeta } from "./db";
import { saveRecord } from "./outbox";
import { NO_CONNECTION, SyncClient, type Fetch, type LockManagerLike } from "./sync-client";
import { samplePayload, signIn, testDb } from "./test-support";

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
