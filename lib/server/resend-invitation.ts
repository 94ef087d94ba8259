import "server-only";
import type { Db } from "@/db/connect";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { newToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send-mail";
import { invitationMail } from "@/lib/mail/templates";
import { INVITATION_DAYS, invitationUrl } from "./invite-member";
import { projectTimeZone } from "@/lib/format/dates";
import { recordAudit } from "./record-audit";

/** Sends an open invitation again with a fresh link; the old link stops working. */
export async function resendInvitation(
  db: Db,
  input: { projectId: string; invitationId: string; by: { id: string; name: string } },
): Promise<void> {
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000);
  const invitation = await db
    .updateTable("invitations")
    .set((eb) => ({ token_hash: hash, expires_at: expiresAt, sent_count: eb("sent_count", "+", 1) }))
    .where("id", "=", input.invitationId)
    .where("project_id", "=", input.projectId)
    .where("accepted_at", "is", null)
    .where("revoked_at", "is", null)
    .returning(["email", "role"])
    .executeTakeFirst();
  if (!invitation) throw new AppError("NOT_FOUND", "No open invitation with this id on this project.");
  const project = await db
    .selectFrom("projects")
    .select(["name", "time_zone"])
    .where("id", "=", input.projectId)
    .executeTakeFirstOrThrow();
  await recordAudit(db, {
    action: "invitation.resend",
    outcome: "success",
    actorUserId: input.by.id,
    projectId: input.projectId,
    target: invitation.email,
  });
  await sendMail(
    invitationMail({
      to: invitation.email,
      url: invitationUrl(token),
      projectName: project.name,
      roleLabel: ROLE_LABELS[invitation.role],
      invitedBy: input.by.name,
      expiresAt,
      timeZone: projectTimeZone(project),
    }),
  );
}
