import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { newToken } from "@/lib/auth/tokens";
import { changeMemberRole, removeMember } from "@/lib/server/change-member-role";
import { loadSessionUser } from "@/lib/server/load-session-user";
import { resetPassword } from "@/lib/server/reset-password";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { routeState } from "./route-mocks";

vi.mock("@/db", async () => (await import("./route-mocks")).mockedDb);

// Before, the JWT carried only the user id: a session outlived a password reset and a sign-out
// for its full 12 hours. Each of these now raises the person's session version, and a cookie
// minted under the old version names nobody.

let t: TestDatabase;
let projectId: string;
let adminId: string;

const person = async (email: string) => {
  const u = await t.db
    .selectFrom("users")
    .select(["id", "session_version"])
    .where("email", "=", email)
    .executeTakeFirstOrThrow();
  return { id: u.id, sessionVersion: u.session_version };
};

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  routeState.db = t.db;
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  adminId = (await person("admin@demo.tautline.test")).id;
});
afterAll(async () => {
  await t.drop();
});

describe("sessions end when they should", () => {
  it("a password reset ends the sessions opened before it", async () => {
    const before = await person("crew@demo.tautline.test");
    expect(await loadSessionUser(t.db, before)).not.toBeNull();
    const { token, hash } = newToken();
    await t.db
      .insertInto("password_resets")
      .values({ user_id: before.id, token_hash: hash, expires_at: new Date(Date.now() + 60_000) })
      .execute();
    await resetPassword(t.db, { token, password: "a-new-password-123" });
    expect(await loadSessionUser(t.db, before)).toBeNull();
    expect(await loadSessionUser(t.db, await person("crew@demo.tautline.test"))).not.toBeNull();
  });

  it("a role change ends the person's sessions; a new sign-in carries the new role", async () => {
    const before = await person("inspector@demo.tautline.test");
    await changeMemberRole(t.db, { projectId, userId: before.id, role: "crew", by: adminId });
    expect(await loadSessionUser(t.db, before)).toBeNull();
    const fresh = await loadSessionUser(t.db, await person("inspector@demo.tautline.test"));
    expect(fresh?.memberships.find((m) => m.projectId === projectId)?.role).toBe("crew");
  });

  it("removal from a project ends the person's sessions", async () => {
    const before = await person("inspector@demo.tautline.test");
    await removeMember(t.db, { projectId, userId: before.id, by: adminId });
    expect(await loadSessionUser(t.db, before)).toBeNull();
  });

  it("signing out ends the session, so a copied cookie no longer works", async () => {
    const { authOptions } = await import("@/lib/auth/options");
    const before = await person("engineer@demo.tautline.test");
    expect(await loadSessionUser(t.db, before)).not.toBeNull();
    const token = (await authOptions.callbacks!.jwt!({
      token: {},
      user: { id: before.id },
      account: null,
    } as never)) as {
      sub: string;
      sv: number;
    };
    expect(token).toMatchObject({ sub: before.id, sv: before.sessionVersion });
    await authOptions.events!.signOut!({ token, session: null } as never);
    expect(await loadSessionUser(t.db, { id: token.sub, sessionVersion: token.sv })).toBeNull();
    const audit = await t.db
      .selectFrom("audit_events")
      .select("action")
      .where("actor_user_id", "=", before.id)
      .where("action", "=", "sign-out")
      .execute();
    expect(audit).toHaveLength(1);
  });
});
