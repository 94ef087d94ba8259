import { spawn } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { MAX_ATTEMPTS, dispatchOne, drainNotifications } from "@/lib/server/dispatch-notifications";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { inboxCount, queueMail } from "../support/mail";

let t: TestDatabase;
let projectId: string;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
});
afterAll(async () => {
  await t.drop();
});

const queue = (subject: string) => queueMail(t.db, projectId, subject);

describe("the e-mail dispatcher", () => {
  it("sends a queued notification through SMTP once and marks it sent", async () => {
    const subject = `once-${Date.now()}`;
    const id = await queue(subject);
    expect(await drainNotifications(t.db)).toBe(1);
    expect(await drainNotifications(t.db)).toBe(0);
    expect(await inboxCount(subject)).toBe(1);
    const row = await t.db
      .selectFrom("notifications")
      .select(["status", "attempts", "sent_at"])
      .where("id", "=", id)
      .executeTakeFirstOrThrow();
    expect(row).toMatchObject({ status: "sent", attempts: 1 });
    expect(row.sent_at).not.toBeNull();
  });

  it("refuses a second row with the same dedupe key, so a replay cannot queue a copy", async () => {
    const subject = `dedupe-${Date.now()}`;
    await queue(subject);
    await expect(queue(subject)).rejects.toThrow(/duplicate key/);
    expect(await drainNotifications(t.db)).toBe(1);
    expect(await inboxCount(subject)).toBe(1);
  });

  it("retries a failed send later, with backoff, and gives up after the last attempt", async () => {
    const subject = `retry-${Date.now()}`;
    const id = await queue(subject);
    const outcome = await dispatchOne(t.db, async () => {
      throw new Error("relay refused");
    });
    expect(outcome).toBe("retry");
    const row = await t.db
      .selectFrom("notifications")
      .select(["status", "attempts", "last_error", "next_attempt_at"])
      .where("id", "=", id)
      .executeTakeFirstOrThrow();
    expect(row).toMatchObject({ status: "pending", attempts: 1, last_error: "relay refused" });
    expect(new Date(row.next_attempt_at).getTime()).toBeGreaterThan(Date.now());
    // Not due yet: a drain right now sends nothing.
    expect(await drainNotifications(t.db)).toBe(0);
    expect(await inboxCount(subject)).toBe(0);

    // At the last attempt a failure marks the row failed for a person to look at.
    await t.db
      .updateTable("notifications")
      .set({ attempts: MAX_ATTEMPTS - 1, next_attempt_at: new Date(0) })
      .where("id", "=", id)
      .execute();
    expect(await dispatchOne(t.db, async () => Promise.reject(new Error("relay still refusing")))).toBe("failed");
    const failed = await t.db
      .selectFrom("notifications")
      .select(["status", "attempts"])
      .where("id", "=", id)
      .executeTakeFirstOrThrow();
    expect(failed).toEqual({ status: "failed", attempts: MAX_ATTEMPTS });
  });

  it("waits half to all of a doubling step after a failed send", async () => {
    // The schedule itself (and its half-hour cap) is tested in lib/retry/backoff.test.ts; here:
    // the outbox follows it. First failure: a step of 5 s; fourth: 5 s × 2³ = 40 s.
    for (const [before, lowMs, highMs] of [
      [0, 2_500, 5_000],
      [3, 20_000, 40_000],
    ] as const) {
      const id = await queue(`backoff-${before}-${Date.now()}`);
      await t.db.updateTable("notifications").set({ attempts: before }).where("id", "=", id).execute();
      const started = Date.now();
      expect(await dispatchOne(t.db, async () => Promise.reject(new Error("relay down")))).toBe("retry");
      const row = await t.db
        .selectFrom("notifications")
        .select("next_attempt_at")
        .where("id", "=", id)
        .executeTakeFirstOrThrow();
      const waitMs = new Date(row.next_attempt_at).getTime() - started;
      expect(waitMs).toBeGreaterThanOrEqual(lowMs - 1_000);
      expect(waitMs).toBeLessThanOrEqual(highMs + 1_000);
      await t.db.deleteFrom("notifications").where("id", "=", id).execute();
    }
  });

  it("sends exactly once when a dispatcher dies in the middle of sending", async () => {
    await drainNotifications(t.db); // nothing else due
    const subject = `crash-${Date.now()}`;
    const id = await queue(subject);
    // node itself (not the tsx wrapper) so the kill ends the process that holds the row.
    const child = spawn(
      process.execPath,
      ["--conditions=react-server", "--import", "tsx", "tests/support/crashing-dispatcher.ts"],
      {
        env: { ...process.env, DATABASE_URL: t.url },
        stdio: ["ignore", "pipe", "inherit"],
      },
    );
    await new Promise<void>((resolve, reject) => {
      child.stdout.on("data", (chunk: Buffer) => chunk.toString().includes("claimed") && resolve());
      child.on("exit", (code) => reject(new Error(`crashing dispatcher exited early (${code})`)));
    });
    // While the dying dispatcher holds the row, another one skips it.
    expect(await dispatchOne(t.db, async () => undefined)).toBe("idle");
    child.kill("SIGKILL");
    await new Promise((r) => child.on("exit", r));

    expect(await inboxCount(subject)).toBe(0);
    expect(
      (await t.db.selectFrom("notifications").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status,
    ).toBe("pending");
    // PostgreSQL ends the dead session's transaction once it sees the connection gone, which can
    // take a moment after the kill; until then the row is still locked and rightly skipped.
    for (let i = 0; ; i++) {
      const free = await t.db
        .selectFrom("notifications")
        .select("id")
        .where("id", "=", id)
        .forUpdate()
        .skipLocked()
        .executeTakeFirst();
      if (free) break;
      if (i >= 100) throw new Error("the killed dispatcher's lock was never released");
      await new Promise((r) => setTimeout(r, 100));
    }
    // The next dispatcher (at server start it drains first) sends it, once.
    expect(await drainNotifications(t.db)).toBe(1);
    expect(await drainNotifications(t.db)).toBe(0);
    const delivered = await inboxCount(subject);
    // The figure docs/RELIABILITY.md quotes: copies beyond the first that the crash caused.
    console.log(`dispatcher crash test: 1 e-mail queued, ${delivered} delivered, ${delivered - 1} duplicate(s) seen`);
    expect(delivered).toBe(1);
  });

  it("gives every e-mail a Message-ID fixed by its outbox row, the same on every attempt", async () => {
    const subject = `message-id-${Date.now()}`;
    const id = await queue(subject);
    const seen: string[] = [];
    await dispatchOne(t.db, async (mail) => {
      seen.push(mail.messageId);
      throw new Error("relay refused");
    });
    await t.db
      .updateTable("notifications")
      .set({ next_attempt_at: new Date(0) })
      .where("id", "=", id)
      .execute();
    await dispatchOne(t.db, async (mail) => {
      seen.push(mail.messageId);
    });
    expect(seen).toEqual([`<${id}@notifications.tautline>`, `<${id}@notifications.tautline>`]);
  });
});
