import "server-only";
import type { Db } from "@/db/connect";
import type { Role } from "@/lib/schemas/domain";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  isOperator: boolean;
  memberships: { projectId: string; projectName: string; projectCode: string; role: Role }[];
}

/**
 * The person a session cookie names, as the database sees them now: null when the account is
 * switched off or the cookie was minted under an older session version (signed out, password
 * reset, removed from a project or given another role since).
 */
export async function loadSessionUser(
  db: Db,
  session: { id: string; sessionVersion: number },
): Promise<SessionUser | null> {
  const user = await db
    .selectFrom("users")
    .select(["id", "email", "name", "is_operator"])
    .where("id", "=", session.id)
    .where("is_active", "=", true)
    .where("session_version", "=", session.sessionVersion)
    .executeTakeFirst();
  if (!user) return null;
  const memberships = await db
    .selectFrom("project_members")
    .innerJoin("projects", "projects.id", "project_members.project_id")
    .select([
      "project_members.project_id as projectId",
      "projects.name as projectName",
      "projects.code as projectCode",
      "project_members.role as role",
    ])
    .where("project_members.user_id", "=", user.id)
    .orderBy("projects.name")
    .execute();
  return { id: user.id, email: user.email, name: user.name, isOperator: user.is_operator, memberships };
}
