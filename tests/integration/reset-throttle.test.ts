import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { NextRequest } from "next/server";
import pg from "pg";
import { seedDemo } from "@/scripts/seed/demo";
import { MAILS_PER_ADDRESS_PER_HOUR } from "@/lib/server/allow-mail-to-address";
import { requestPasswordReset } from "@/lib/server/reset-password";
import { settleBackground } from "@/lib/server/run-in-background";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { routeState } from "./route-mocks";

vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);

let t: TestDatabase;

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  routeState.db = t.db;
});
afterAll(async () => {
  await t.drop();
});

const resetsOf = async (email: string) =>
  (
    await t.db
      .selectFrom("password_resets")
      .innerJoin("users", "users.id", "password_resets.user_id")
      .select("password_resets.id")
      .where("users.email", "=", email)
      .execute()
  ).length;

describe("reset e-mails", () => {
  it(`go to one address at most ${MAILS_PER_ADDRESS_PER_HOUR} times an hour; the rest are audited as throttled`, async () => {
    const email = "inspector@demo.tautline.test";
    for (let i = 0; i < 5; i++) await requestPasswordReset(t.db, { email, ip: null });
    expect(await resetsOf(email)).toBe(MAILS_PER_ADDRESS_PER_HOUR);
    const denied = await t.db
      .selectFrom("audit_events")
      .select("detail")
      .where("actor_email", "=", email)
      .where("action", "=", "password.reset-request")
      .where("outcome", "=", "denied")
      .execute();
    expect(denied).toHaveLength(2);
  });

  it("the route answers the same words without waiting on the lookup or the e-mail, for an account and for no account", async () => {
    const { POST } = await import("@/app/api/password-reset/route");
    const ask = (email: string) =>
      POST(
        new NextRequest("http://localhost:3000/api/password-reset", {
          method: "POST",
          headers: { "content-type": "application/json", origin: "http://localhost:3000" },
          body: JSON.stringify({ email }),
        }),
        { params: Promise.resolve({}) },
      );
    const known = "engineer@demo.tautline.test";
    const before = await resetsOf(known);
    // The users table is locked while the requests come in: an answer that waited on the lookup
    // would hang here. Both answer at once, with the same words.
    const locker = new pg.Client({ connectionString: t.url });
    await locker.connect();
    await locker.query("begin");
    await locker.query("lock table users in access exclusive mode");
    const [a, b] = await Promise.all([ask(known), ask("nobody@nowhere.tautline.test")]);
    expect([a.status, b.status]).toEqual([202, 202]);
    expect(await a.json()).toEqual(await b.json());
    await locker.query("commit");
    await locker.end();
    await settleBackground();
    expect(await resetsOf(known)).toBe(before + 1);
  });
});
