import { redirect } from "next/navigation";
import { FlagQueue } from "@/components/review/flag-queue";
import { ReleaseList } from "@/components/review/release-list";
import { Caution } from "@/components/ui/caution";
import { db } from "@/db";
import { getSessionUser } from "@/lib/auth/session";
import { findFlags } from "@/lib/server/find-flags";
import { findReleaseCandidates } from "@/lib/server/find-release-candidates";

export const metadata = { title: "Decisions" };

export default async function DecisionsPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const projectIds = user.memberships.filter((m) => m.role === "engineer").map((m) => m.projectId);
  const [waiting, pours] = await Promise.all([
    findFlags(db, { projectIds, filter: { status: "any_open" } }),
    findReleaseCandidates(db, projectIds),
  ]);
  return (
    <main className="space-y-10">
      <h1 className="text-figure font-bold">Decisions</h1>
      <section aria-labelledby="waiting-heading" className="space-y-3">
        <h2 id="waiting-heading" className="text-lead font-bold">
          Flags waiting for a disposition ({waiting.length} tendons)
        </h2>
        <FlagQueue tendons={waiting} empty="No flag is waiting for you." />
      </section>
      <section aria-labelledby="release-heading" className="space-y-3">
        <h2 id="release-heading" className="text-lead font-bold">
          Pours and their release
        </h2>
        <ReleaseList pours={pours} canRelease={(pour) => pour.releaseBy === "engineer"} canReopen={() => true} />
      </section>
      <Caution />
    </main>
  );
}
