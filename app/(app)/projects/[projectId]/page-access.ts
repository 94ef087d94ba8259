import "server-only";
import { notFound, redirect } from "next/navigation";
import { z } from "zod";
import { authorize, type ProjectAccess } from "@/lib/auth/authorize";
import type { Action } from "@/lib/auth/permissions";
import { isAppError } from "@/lib/errors";

/** For pages: the same check as the route handlers; sign-in when anonymous, not found otherwise. */
export async function pageAccess(action: Action, projectId: string): Promise<ProjectAccess & { projectName: string }> {
  if (!z.uuid().safeParse(projectId).success) notFound();
  const access = await authorize(action, projectId).catch((e: unknown) => {
    if (!isAppError(e)) throw e;
    if (e.code === "UNAUTHENTICATED") redirect("/sign-in");
    notFound();
  });
  const projectName = access.user.memberships.find((m) => m.projectId === projectId)?.projectName ?? "";
  return { ...access, projectName };
}

export const isUuid = (value: string) => z.uuid().safeParse(value).success;
