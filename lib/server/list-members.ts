import "server-only";
import type { Db } from "@/db/connect";
import type { Role } from "@/lib/schemas/domain";

export interface MemberRow {
  userId: string;
  name: string;
  email: string;
  role: Role;
  since: Date;
}

export interface InvitationRow {
  id: string;
  email: string;
  role: Role;
  expiresAt: Date;
  sentCount: number;
  expired: boolean;
}

/** The people on a project and its open invitations. Chosen columns only: no hashes leave here. */
export async function listMembers(
  db: Db,
  projectId: string,
): Promise<{ members: MemberRow[]; invitations: InvitationRow[] }> {
  const [members, invitations] = await Promise.all([
    db
      .selectFrom("project_members")
      .innerJoin("users", "users.id", "project_members.user_id")
      .select([
        "users.id as userId",
        "users.name as name",
        "users.email as email",
        "project_members.role as role",
        "project_members.created_at as since",
      ])
      .where("project_members.project_id", "=", projectId)
      .orderBy("users.name")
      .execute(),
    db
      .selectFrom("invitations")
      .select(["id", "email", "role", "expires_at as expiresAt", "sent_count as sentCount"])
      .where("project_id", "=", projectId)
      .where("accepted_at", "is", null)
      .where("revoked_at", "is", null)
      .orderBy("created_at", "desc")
      .execute(),
  ]);
  const now = Date.now();
  return {
    members,
    invitations: invitations.map((i) => ({ ...i, expired: new Date(i.expiresAt).getTime() < now })),
  };
}
