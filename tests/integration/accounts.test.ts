import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { hashToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { acceptInvitation, previewInvitation } from "@/lib/server/accept-invitation";
import { changeMemberRole, removeMember } from "@/lib/server/change-member-role";
import { inviteMember } from "@/lib/server/invite-member";
import { listMembers } from "@/lib/server/list-members";
import { recordAudit } from "@/lib/server/record-audit";
import { requestPasswordReset, resetPassword } from "@/lib/server/reset-password";
import { revokeInvitation } from "@/lib/server/revoke-invitation";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";

const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1081";

let t: TestDatabase;
let projectId: string;
let admin: { id: string; name: string };

async function mailTo(address: string): Promise<{ text: string; subject: string }> {
  for (let i = 0; i < 40; i++) {
    const list = (await (await fetch(`${INBOX}/api/messages?to=${encodeURIComponent(address)}`)).json()) as {
      text: string;
      subject: string;
    }[];
    const last = list.at(-1);
    if (last) return last;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${address}`);
}
const tokenFrom = (text: string, path: string) => new RegExp(`${path}([A-Za-z0-9_-]+)`).exec(text)?.[1] ?? "";

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  admin = await demoPerson(t.db, "admin@demo.tautline.test");
});
afterAll(async () => {
  await t.drop();
});

describe("invitations", () => {
  it("store only the token's hash, e-mail a single-use link, and make a member on acceptance", async () => {
    const email = `int-${Date.now()}@demo.tautline.test`;
    const { invitationId } = await inviteMember(t.db, { projectId, email, role: "inspector", invitedBy: admin });
    const mail = await mailTo(email);
    expect(mail.subject).toBe("You are invited to Alder Yard Parking on Tautline");
    const token = tokenFrom(mail.text, "/invite/");
    const row = await t.db
      .selectFrom("invitations")
      .select("token_hash")
      .where("id", "=", invitationId)
      .executeTakeFirstOrThrow();
    expect(row.token_hash).toBe(hashToken(token));
    expect(row.token_hash).not.toContain(token);

    expect(await previewInvitation(t.db, token)).toEqual({
      email,
      role: "inspector",
      projectName: "Alder Yard Parking",
      hasAccount: false,
    });
    await expect(acceptInvitation(t.db, { token })).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { name: expect.any(Array), password: expect.any(Array) },
    });
    // The failed attempt wrote nothing: the invitation is still open.
    expect(await previewInvitation(t.db, token)).toMatchObject({ email });

    const accepted = await acceptInvitation(t.db, { token, name: "Ines Falk", password: "a-long-enough-password" });
    expect(accepted).toMatchObject({ email, newAccount: true, projectId });
    const { members } = await listMembers(t.db, projectId);
    expect(members.find((m) => m.email === email)?.role).toBe("inspector");
    await expect(
      acceptInvitation(t.db, { token, name: "Again", password: "a-long-enough-password" }),
    ).rejects.toMatchObject({ code: "GONE" });
  });

  it("refuse an address that is already on the project", async () => {
    await expect(
      inviteMember(t.db, { projectId, email: "crew@demo.tautline.test", role: "crew", invitedBy: admin }),
    ).rejects.toMatchObject({
      code: "CONFLICT",
    });
  });

  it("stop working once revoked", async () => {
    const email = `revoked-${Date.now()}@demo.tautline.test`;
    const { invitationId } = await inviteMember(t.db, { projectId, email, role: "crew", invitedBy: admin });
    const token = tokenFrom((await mailTo(email)).text, "/invite/");
    await revokeInvitation(t.db, { projectId, invitationId, by: admin.id });
    await expect(previewInvitation(t.db, token)).rejects.toBeInstanceOf(AppError);
    await expect(revokeInvitation(t.db, { projectId, invitationId, by: admin.id })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });
  });

  it("cannot be revoked through another project's id", async () => {
    const email = `scoped-${Date.now()}@demo.tautline.test`;
    const { invitationId } = await inviteMember(t.db, { projectId, email, role: "crew", invitedBy: admin });
    const other = await t.db.selectFrom("projects").select("id").where("code", "=", "QHM").executeTakeFirstOrThrow();
    await expect(revokeInvitation(t.db, { projectId: other.id, invitationId, by: admin.id })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });
  });
});

describe("members", () => {
  it("keep at least one admin on a project", async () => {
    await expect(
      changeMemberRole(t.db, { projectId, userId: admin.id, role: "crew", by: admin.id }),
    ).rejects.toMatchObject({ code: "CONFLICT" });
    await expect(removeMember(t.db, { projectId, userId: admin.id, by: admin.id })).rejects.toMatchObject({
      code: "CONFLICT",
    });
  });

  it("change role and removal are written to the audit trail", async () => {
    const crew = await demoPerson(t.db, "crew@demo.tautline.test");
    await changeMemberRole(t.db, { projectId, userId: crew.id, role: "inspector", by: admin.id });
    await changeMemberRole(t.db, { projectId, userId: crew.id, role: "crew", by: admin.id });
    const events = await t.db
      .selectFrom("audit_events")
      .select(["action", "detail"])
      .where("project_id", "=", projectId)
      .where("action", "=", "member.role-change")
      .orderBy("id")
      .execute();
    expect(events.map((e) => e.detail)).toEqual([
      { from: "crew", to: "inspector" },
      { from: "inspector", to: "crew" },
    ]);
  });
});

describe("password reset", () => {
  it("sends a link only to an account, and the link sets the password once", async () => {
    await requestPasswordReset(t.db, { email: "nobody@nowhere.tautline.test", ip: "127.0.0.1" });
    expect(await t.db.selectFrom("password_resets").select("id").execute()).toEqual([]);

    await requestPasswordReset(t.db, { email: "engineer@demo.tautline.test", ip: "127.0.0.1" });
    const token = tokenFrom((await mailTo("engineer@demo.tautline.test")).text, "/reset-password/");
    const before = await t.db
      .selectFrom("users")
      .select("password_hash")
      .where("email", "=", "engineer@demo.tautline.test")
      .executeTakeFirstOrThrow();
    await resetPassword(t.db, { token, password: "a-new-password-99" });
    const after = await t.db
      .selectFrom("users")
      .select("password_hash")
      .where("email", "=", "engineer@demo.tautline.test")
      .executeTakeFirstOrThrow();
    expect(after.password_hash).not.toBe(before.password_hash);
    await expect(resetPassword(t.db, { token, password: "yet-another-one-1" })).rejects.toMatchObject({ code: "GONE" });
  });
});

describe("audit_events", () => {
  it("is append-only: the database refuses UPDATE, DELETE and TRUNCATE", async () => {
    await recordAudit(t.db, { action: "test.event", outcome: "success", detail: { n: 1 } });
    await expect(sql`update audit_events set action = 'changed'`.execute(t.db)).rejects.toThrow(/append-only/);
    await expect(sql`delete from audit_events`.execute(t.db)).rejects.toThrow(/append-only/);
    await expect(sql`truncate audit_events`.execute(t.db)).rejects.toThrow(/append-only/);
    const rows = await t.db.selectFrom("audit_events").select("action").where("action", "=", "test.event").execute();
    expect(rows).toHaveLength(1);
  });
});
