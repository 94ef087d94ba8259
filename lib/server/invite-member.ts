import "server-only";
import type { Db } from "@/db/connect";
import type { Role } from "@/lib/schemas/domain";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { newToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send-mail";
import { invitationMail } from "@/lib/mail/templates";
import { projectTimeZone } from "@/lib/format/dates";
import { recordAudit } from "./record-audit";

export const INVITATION_DAYS = 7;

export const invitationUrl = (token: string) => `${env.APP_URL}/invite/${token}`;

/**
 * Invites a person to a project with a role. The e-mail carries a single-use link; only the
 * token's hash is stored. An address that is already a member is refused; an open invitation
 * to the same address is replaced by the new one.
 */
export async function inviteMember(
  db: Db,
  input: { projectId: string; email: string; role: Role; invitedBy: { id: string; name: string } },
): Promise<{ invitationId: string }> {
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);

  const { invitationId, projectName, timeZone } = await db.transaction().execute(async (trx) => {
    const project = await trx
      .selectFrom("projects")
      .select(["name", "time_zone"])
      .where("id", "=", input.projectId)
      .executeTakeFirstOrThrow();
    const member = await trx
      .selectFrom("project_members")
      .innerJoin("users", "users.id", "project_members.user_id")
      .select("users.id")
      .where("project_members.project_id", "=", input.projectId)
      .where("users.email", "=", input.email)
      .executeTakeFirst();
    if (member)
      throw new AppError("CONFLICT", `${input.email} is already on this project.`, { email: ["Already a member."] });

    await trx
      .updateTable("invitations")
      .set({ revoked_at: new Date() })
      .where("project_id", "=", input.projectId)
      .where("email", "=", input.email)
      .where("accepted_at", "is", null)
      .where("revoked_at", "is", null)
      .execute();
    const row = await trx
      .insertInto("invitations")
      .values({
        project_id: input.projectId,
        email: input.email,
        role: input.role,
        token_hash: hash,
        invited_by: input.invitedBy.id,
        expires_at: expiresAt,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await recordAudit(trx, {
      action: "invitation.create",
      outcome: "success",
      actorUserId: input.invitedBy.id,
      projectId: input.projectId,
      target: input.email,
      detail: { role: input.role },
    });
    return { invitationId: row.id, projectName: project.name, timeZone: projectTimeZone(project) };
  });

  await sendMail(
    invitationMail({
      to: input.email,
      url: invitationUrl(token),
      projectName,
      roleLabel: ROLE_LABELS[input.role],
      invitedBy: input.invitedBy.name,
      expiresAt,
      timeZone,
    }),
  );
  return { invitationId };
}
