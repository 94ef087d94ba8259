import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { db } from "@/db";
import { AppError } from "@/lib/errors";
import { loadSessionUser, type SessionUser } from "@/lib/server/load-session-user";
import { authOptions } from "./options";

export type { SessionUser };

/**
 * The signed-in person as the database sees them right now: an inactive account, a removed
 * membership or a session ended since (sign-out, password reset, removal, role change: the
 * session version moved on) takes effect on the next call, whatever the session cookie says.
 */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const claims = session?.user as { id?: string; sessionVersion?: number } | undefined;
  if (!claims?.id) return null;
  return loadSessionUser(db, { id: claims.id, sessionVersion: claims.sessionVersion ?? 0 });
});

export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw new AppError("UNAUTHENTICATED", "Sign in to continue.");
  return user;
}
