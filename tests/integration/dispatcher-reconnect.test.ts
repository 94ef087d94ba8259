import { spawn, type ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { checkHealth } from "@/lib/server/check-health";
import { checkMailFlow } from "@/lib/server/check-mail-flow";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { startTcpCut, type TcpCut } from "../support/tcp-cut";
import { inboxCount, queueMail } from "../support/mail";

// The dispatcher process itself (scripts/dispatcher.ts) runs against the test database through
// a relay that the test cuts: every connection reset and new ones refused for a few seconds, as
// in a PostgreSQL restart. Before the pool had an error listener, the reset of an idle
// connection ended the dispatcher and flag e-mails stopped with no sign anywhere.

let t: TestDatabase;
let relay: TcpCut;
let child: ChildProcess;
let output = "";
let projectId: string;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(what: string, probe: () => Promise<T | undefined | null | false>, seconds = 30): Promise<T> {
  for (let i = 0; i < seconds * 10; i++) {
    const value = await probe();
    if (value) return value;
    await sleep(100);
  }
  throw new Error(`timed out waiting for ${what}; dispatcher output:\n${output}`);
}

async function heartbeat(): Promise<number | undefined> {
  const row = await t.db
    .selectFrom("worker_heartbeats")
    .select("beat_at")
    .where("worker", "=", "dispatcher")
    .executeTakeFirst();
  return row ? new Date(row.beat_at).getTime() : undefined;
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db, { records: true });
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  relay = await startTcpCut(Number(new URL(t.url).port));
  // As the app's own role, as `npm start` runs it.
  const through = new URL(t.appUrl);
  through.port = String(relay.port);
  child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "scripts/dispatcher.ts"], {
    env: { ...process.env, DATABASE_URL: through.toString(), DISPATCH_INTERVAL_MS: "200" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (c: Buffer) => (output += c.toString()));
  child.stderr!.on("data", (c: Buffer) => (output += c.toString()));
});
afterAll(async () => {
  child?.kill("SIGTERM");
  await relay?.close();
  await t?.drop();
});

describe("the e-mail dispatcher across a database restart", () => {
  it("keeps running through cut connections, then sends what was queued meanwhile, once", async () => {
    const first = await until("the first heartbeat", heartbeat);
    expect((await checkMailFlow(t.db)).state).toBe("flowing");

    await relay.cut();
    const subject = `restart-${Date.now()}`;
    await queueMail(t.db, projectId, subject, "queued while the database was unreachable");
    await sleep(3000);
    expect(child.exitCode, `dispatcher exited during the cut:\n${output}`).toBeNull();
    expect(output).toMatch(/dispatcher pass failed .*trying again in \d+ ms/);
    await relay.restore();

    await until("the e-mail queued during the cut", async () => (await inboxCount(subject)) === 1);
    const after = await until("a fresh heartbeat", async () => {
      const beat = await heartbeat();
      return beat && beat > first ? beat : undefined;
    });
    expect(after).toBeGreaterThan(first);
    expect(child.exitCode).toBeNull();
    await sleep(1000);
    expect(await inboxCount(subject)).toBe(1);
    expect(output).toMatch(/database reachable again/);

    const health = await checkHealth(t.db);
    expect(health.email).toMatchObject({ state: "flowing", pending: 0, failed: 0 });
    expect(health.email?.heartbeatAgeS).toBeLessThan(10);
  });

  it("reports e-mail stalled once the heartbeat is old and names a flag whose e-mail failed", async () => {
    child.kill("SIGTERM");
    await until("the dispatcher to stop", async () => child.exitCode !== null);
    await t.db
      .updateTable("worker_heartbeats")
      .set({ beat_at: new Date(Date.now() - 10 * 60_000) })
      .execute();
    const subject = `stalled-${Date.now()}`;
    await queueMail(t.db, projectId, subject, "x", { created_at: new Date(Date.now() - 20 * 60_000) });
    const flag = await t.db
      .selectFrom("flags")
      .select(["id", "tendon_id"])
      .where("project_id", "=", projectId)
      .limit(1)
      .executeTakeFirstOrThrow();
    await queueMail(t.db, projectId, `failed-${subject}`, "x", {
      flag_id: flag.id,
      status: "failed",
      last_error: "relay refused",
    });

    const flow = await checkMailFlow(t.db, [projectId]);
    expect(flow.state).toBe("stalled");
    expect(flow.heartbeatAgeS).toBeGreaterThanOrEqual(599);
    expect(flow.oldestPendingAgeS).toBeGreaterThanOrEqual(1199);
    expect(flow.failed).toEqual([
      expect.objectContaining({ lastError: "relay refused", flagId: flag.id, tendonId: flag.tendon_id }),
    ]);
    // Another project's people see none of it.
    const other = (await t.db.selectFrom("projects").select("id").where("code", "!=", "AYP").executeTakeFirstOrThrow())
      .id;
    expect((await checkMailFlow(t.db, [other])).failed).toEqual([]);
    expect((await checkHealth(t.db)).email?.state).toBe("stalled");
  });
});
