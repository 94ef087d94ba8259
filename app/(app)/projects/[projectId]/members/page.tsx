import { notFound, redirect } from "next/navigation";
import { MembersPanel } from "@/components/members/members-panel";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { isAppError } from "@/lib/errors";
import { projectParamsSchema } from "@/lib/schemas/member";
import { getProjectTimeZone } from "@/lib/server/get-project-time-zone";
import { listMembers } from "@/lib/server/list-members";

export const metadata = { title: "People and invitations" };

export default async function MembersPage({ params }: { params: Promise<{ projectId: string }> }) {
  const parsed = projectParamsSchema.safeParse(await params);
  if (!parsed.success) notFound();
  const { projectId } = parsed.data;
  const access = await authorize("members.view", projectId).catch((e: unknown) => {
    if (!isAppError(e)) throw e;
    if (e.code === "UNAUTHENTICATED") redirect("/sign-in");
    notFound();
  });
  const [{ members, invitations }, timeZone] = await Promise.all([
    listMembers(db, projectId),
    getProjectTimeZone(db, projectId),
  ]);
  const project = access.user.memberships.find((m) => m.projectId === projectId);
  return (
    <main>
      <p className="field-label">{project?.projectName}</p>
      <h1 className="text-figure font-bold">People and invitations</h1>
      <MembersPanel
        projectId={projectId}
        currentUserId={access.user.id}
        timeZone={timeZone}
        members={members.map((m) => ({ ...m, since: new Date(m.since).toISOString() }))}
        invitations={invitations.map((i) => ({ ...i, expiresAt: new Date(i.expiresAt).toISOString() }))}
      />
    </main>
  );
}
