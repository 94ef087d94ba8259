import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import { recordAudit } from "./record-audit";

export async function revokeInvitation(
  db: Db,
  input: { projectId: string; invitationId: string; by: string },
): Promise<void> {
  const revoked = await db
    .updateTable("invitations")
    .set({ revoked_at: new Date() })
    .where("id", "=", input.invitationId)
    .where("project_id", "=", input.projectId)
    .where("accepted_at", "is", null)
    .where("revoked_at", "is", null)
    .returning("email")
    .executeTakeFirst();
  if (!revoked) throw new AppError("NOT_FOUND", "No open invitation with this id on this project.");
  await recordAudit(db, {
    action: "invitation.revoke",
    outcome: "success",
    actorUserId: input.by,
    projectId: input.projectId,
    target: revoked.email,
  });
}
