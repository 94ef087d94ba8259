import Dexie from "dexie";
import { afterEach, describe, expect, it, onTestFinished, vi } from "vitest";
import { readMeta, type SessionMeta, type SyncMeta } from "./db";
import { openField, UNREADABLE_SESSION } from "./open-field";
import { saveRecord, type OutboxStatus } from "./outbox";
import { samplePayload, signIn, TEST_USER, testDb } from "./test-support";

afterEach(() => {
  vi.unstubAllGlobals();
});

/** The browser globals the shell's start touches, in node: events on window and document, the timer. */
function browserGlobals() {
  const window = Object.assign(new EventTarget(), {
    setInterval: (fn: () => void, ms: number) => setInterval(fn, ms) as unknown as number,
    clearInterval: (id: number) => clearInterval(id),
  });
  vi.stubGlobal("window", window);
  vi.stubGlobal("document", Object.assign(new EventTarget(), { visibilityState: "visible" }));
}

async function until<T>(values: T[], test: (v: T) => boolean): Promise<T> {
  for (let i = 0; i < 200; i++) {
    const hit = values.find(test);
    if (hit !== undefined) return hit;
    await new Promise((r) => setTimeout(r, 10));
  }
  throw new Error(`no value passed the test; saw ${JSON.stringify(values)}`);
}

describe("openField (the shell's database, loaded after the first paint)", () => {
  it("reports the outbox and the sync record as they change, and stops reporting when stopped", async () => {
    browserGlobals();
    // Signed out on the server: /api/me answers 401, so the sync record must come to say so.
    vi.stubGlobal("fetch", async () => new Response("{}", { status: 401 }));
    const { db, factory } = testDb();
    // liveQuery runs only where Dexie found an indexedDB when it loaded (a browser); here that is the test's fake.
    const deps = Dexie.dependencies as { indexedDB: IDBFactory | null };
    const before = deps.indexedDB;
    deps.indexedDB = factory;
    onTestFinished(() => {
      deps.indexedDB = before;
    });
    await signIn(db);
    const outbox: OutboxStatus[] = [];
    const sync: SyncMeta[] = [];
    const field = openField(db);
    const stop = field.start({ outbox: (s) => outbox.push(s), sync: (m) => sync.push(m) });

    expect((await until(outbox, () => true)).pending).toBe(0);
    expect((await until(sync, (m) => m.needsSignIn)).needsSignIn).toBe(true);

    await saveRecord(db, { ...samplePayload(), authorName: "Test Crew", local: null });
    expect((await until(outbox, (s) => s.pending === 1)).pending).toBe(1);

    stop();
    const seen = outbox.length;
    await saveRecord(db, { ...samplePayload(), authorName: "Test Crew", local: null });
    await new Promise((r) => setTimeout(r, 100));
    expect(outbox.length).toBe(seen);
    expect(await db.outbox.count()).toBe(2);
    db.close();
  });

  it("keeps the person it had when the server's answer about who is signed in breaks its contract", async () => {
    vi.stubGlobal("fetch", async (url: string) =>
      url === "/api/me"
        ? new Response(JSON.stringify({ id: "someone-else", memberships: "all of them" }), { status: 200 })
        : new Response("{}", { status: 404 }),
    );
    const { db } = testDb();
    await signIn(db);
    await openField(db).syncNow();
    expect(await readMeta<SessionMeta>(db, "session")).toEqual(TEST_USER);
    expect((await readMeta<SyncMeta>(db, "sync"))!.lastError).toBe(UNREADABLE_SESSION);
    db.close();
  });
});
