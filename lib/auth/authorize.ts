import "server-only";
import { headers } from "next/headers";
import { db } from "@/db";
import type { Role } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/server/record-audit";
import { can, type Action } from "./permissions";
import { requireUser, type SessionUser } from "./session";

export interface ProjectAccess {
  user: SessionUser;
  projectId: string;
  role: Role;
}

async function ip(): Promise<string | null> {
  try {
    return (await headers()).get("x-forwarded-for")?.split(",")[0]?.trim() ?? null;
  } catch {
    return null;
  }
}

/**
 * The one access check. Deny by default: the caller must be signed in (401), a member of the
 * project (404, so other projects' ids reveal nothing), and hold a role the permission table
 * allows for the action (403). Every denial is written to the audit trail.
 */
export async function authorize(action: Action, projectId: string): Promise<ProjectAccess> {
  const user = await requireUser();
  const membership = user.memberships.find((m) => m.projectId === projectId);
  if (!membership) {
    await recordAudit(db, {
      action,
      outcome: "denied",
      actorUserId: user.id,
      target: projectId,
      ip: await ip(),
      detail: { reason: "not a member" },
    });
    throw new AppError("NOT_FOUND", "No such project among yours.");
  }
  if (!can(membership.role, action)) {
    await recordAudit(db, {
      action,
      outcome: "denied",
      actorUserId: user.id,
      projectId,
      ip: await ip(),
      detail: { reason: "role", role: membership.role },
    });
    throw new AppError("FORBIDDEN", `Your role on this project (${membership.role}) does not allow this.`);
  }
  return { user, projectId, role: membership.role };
}

/** Site operators only: creating projects and their first admin. */
export async function authorizeOperator(): Promise<SessionUser> {
  const user = await requireUser();
  if (!user.isOperator) {
    await recordAudit(db, { action: "project.create", outcome: "denied", actorUserId: user.id, ip: await ip() });
    throw new AppError("FORBIDDEN", "Only a site operator can create projects.");
  }
  return user;
}
