import "server-only";
import { db } from "@/db";
import { can } from "@/lib/auth/permissions";
import { requireUser, type SessionUser } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { recordAudit } from "./record-audit";

/** The projects on which the person may record stressing (the permission table's record.create). */
export function recordingProjectIds(user: Pick<SessionUser, "memberships">): string[] {
  return user.memberships.filter((m) => can(m.role, "record.create")).map((m) => m.projectId);
}

/**
 * Access for the sync and download routes: signed in (401) and on the stressing crew of at least
 * one project (403). Each operation and each pour is then checked against its own project.
 */
export async function requireRecorder(): Promise<SessionUser> {
  const user = await requireUser();
  if (!recordingProjectIds(user).length) {
    await recordAudit(db, {
      action: "record.create",
      outcome: "denied",
      actorUserId: user.id,
      detail: { reason: "not on any stressing crew" },
    });
    throw new AppError("FORBIDDEN", "Only a stressing crew member can use the field log.");
  }
  return user;
}
