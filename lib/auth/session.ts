import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { db } from "@/db";
import type { Role } from "@/db/types";
import { AppError } from "@/lib/errors";
import { authOptions } from "./options";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  isOperator: boolean;
  memberships: { projectId: string; projectName: string; projectCode: string; role: Role }[];
}

/**
 * The signed-in person as the database sees them right now: an inactive account or a removed
 * membership takes effect on the next call, whatever the session cookie says.
 */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  const user = await db
    .selectFrom("users")
    .select(["id", "email", "name", "is_operator"])
    .where("id", "=", id)
    .where("is_active", "=", true)
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
});

export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw new AppError("UNAUTHENTICATED", "Sign in to continue.");
  return user;
}
