import "server-only";
import type { Db } from "@/db/connect";
import type { Role } from "@/lib/schemas/domain";
import { hashPassword } from "@/lib/auth/passwords";
import { hashToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { recordAudit } from "./record-audit";

export interface InvitationPreview {
  email: string;
  role: Role;
  projectName: string;
  hasAccount: boolean;
}

const GONE =
  "This invitation link has expired, was already used or was withdrawn. Ask the project admin to send a new one.";

/** What an invitation link offers, for the page that accepts it. */
export async function previewInvitation(db: Db, token: string): Promise<InvitationPreview> {
  const row = await db
    .selectFrom("invitations")
    .innerJoin("projects", "projects.id", "invitations.project_id")
    .leftJoin("users", "users.email", "invitations.email")
    .select(["invitations.email", "invitations.role", "projects.name as projectName", "users.id as userId"])
    .where("invitations.token_hash", "=", hashToken(token))
    .where("invitations.accepted_at", "is", null)
    .where("invitations.revoked_at", "is", null)
    .where("invitations.expires_at", ">", new Date())
    .executeTakeFirst();
  if (!row) throw new AppError("GONE", GONE);
  return { email: row.email, role: row.role, projectName: row.projectName, hasAccount: Boolean(row.userId) };
}

/**
 * Accepts an invitation once. A new person gives a name and password; someone who already has
 * an account joins the project and signs in as usual.
 */
export async function acceptInvitation(
  db: Db,
  input: { token: string; name?: string; password?: string },
): Promise<{ email: string; projectId: string; newAccount: boolean }> {
  const passwordHash = input.password ? await hashPassword(input.password) : undefined;
  return db.transaction().execute(async (trx) => {
    const invitation = await trx
      .updateTable("invitations")
      .set({ accepted_at: new Date() })
      .where("token_hash", "=", hashToken(input.token))
      .where("accepted_at", "is", null)
      .where("revoked_at", "is", null)
      .where("expires_at", ">", new Date())
      .returning(["id", "project_id", "email", "role"])
      .executeTakeFirst();
    if (!invitation) throw new AppError("GONE", GONE);

    let user = await trx
      .selectFrom("users")
      .select(["id", "is_active"])
      .where("email", "=", invitation.email)
      .executeTakeFirst();
    const newAccount = !user;
    if (!user) {
      const fields: Record<string, string[]> = {};
      if (!input.name) fields.name = ["Enter your name as it should appear on records."];
      if (!passwordHash) fields.password = ["Choose a password of at least 10 characters."];
      if (Object.keys(fields).length)
        throw new AppError("INVALID_INPUT", "Enter your name and a password to finish.", fields);
      user = await trx
        .insertInto("users")
        .values({
          email: invitation.email,
          name: input.name ?? invitation.email,
          password_hash: passwordHash,
          email_verified: new Date(),
        })
        .returning(["id", "is_active"])
        .executeTakeFirstOrThrow();
    } else if (!user.is_active) {
      throw new AppError("FORBIDDEN", "This account is switched off. Ask the project admin.");
    }
    await trx
      .insertInto("project_members")
      .values({ project_id: invitation.project_id, user_id: user.id, role: invitation.role })
      .onConflict((oc) => oc.columns(["project_id", "user_id"]).doUpdateSet({ role: invitation.role }))
      .execute();
    await recordAudit(trx, {
      action: "invitation.accept",
      outcome: "success",
      actorUserId: user.id,
      actorEmail: invitation.email,
      projectId: invitation.project_id,
      detail: { role: invitation.role, newAccount },
    });
    return { email: invitation.email, projectId: invitation.project_id, newAccount };
  });
}
