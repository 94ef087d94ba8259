import "server-only";
import { notFound, redirect } from "next/navigation";
import type { ReactNode } from "react";
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

/**
 * A segment's layout that runs `pageAccess` for `action` before anything below it renders: above
 * the segment's loading state, so a refusal answers a real 404 (or the sign-in) rather than a
 * streamed 200, which a page under a loading state can no longer change.
 */
export function accessLayout(action: Action) {
  return async function AccessLayout({
    children,
    params,
  }: {
    children: ReactNode;
    params: Promise<{ projectId: string }>;
  }) {
    await pageAccess(action, (await params).projectId);
    return children;
  };
}
