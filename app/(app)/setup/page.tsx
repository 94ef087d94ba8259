import Link from "next/link";
import { redirect } from "next/navigation";
import { db } from "@/db";
import { getSessionUser } from "@/lib/auth/session";
import { findSetupGaps } from "@/lib/server/find-setup-gaps";

export const metadata = { title: "Project setup" };

export default async function SetupPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const projects = user.memberships.filter((m) => m.role === "admin");
  const gaps = await Promise.all(projects.map((p) => findSetupGaps(db, p.projectId)));
  return (
    <main>
      <h1 className="text-figure font-bold">Project setup</h1>
      <p className="mt-2 text-ink-soft">
        The projects you administer, and what each still needs before the crew goes out.
      </p>
      {projects.length === 0 ? (
        <p className="card mt-6">
          You are not an admin on any project. A site operator creates projects and their first admin.
        </p>
      ) : (
        <ul className="mt-6 grid gap-4 md:grid-cols-2">
          {projects.map((p, i) => {
            const g = gaps[i]!;
            return (
              <li key={p.projectId} className="card">
                <h2 className="text-lead font-semibold">{p.projectName}</h2>
                <p className="text-label uppercase text-ink-faint">
                  {p.projectCode} · {g.counts.pours} pours · {g.counts.tendons} tendons · {g.counts.lots} lots ·{" "}
                  {g.counts.sets} equipment sets
                </p>
                {g.gaps.length ? (
                  <>
                    <p className="mt-3 font-semibold">
                      <span aria-hidden="true">⚠ </span>
                      {g.gaps.length} thing{g.gaps.length === 1 ? "" : "s"} to set up
                    </p>
                    <ul className="mt-1 list-disc pl-6">
                      {g.gaps.slice(0, 4).map((x) => (
                        <li key={x.what}>{x.what}</li>
                      ))}
                      {g.gaps.length > 4 && <li>and {g.gaps.length - 4} more</li>}
                    </ul>
                  </>
                ) : (
                  <p className="mt-3 font-semibold">
                    <span aria-hidden="true">✓ </span>Ready: nothing missing.
                  </p>
                )}
                <ul className="mt-3 flex flex-wrap gap-2">
                  <li>
                    <Link href={`/projects/${p.projectId}/setup`} className="btn-primary">
                      Set up {p.projectCode}
                    </Link>
                  </li>
                  <li>
                    <Link href={`/projects/${p.projectId}/pours`} className="btn-quiet">
                      Pours and tendons
                    </Link>
                  </li>
                  <li>
                    <Link href={`/projects/${p.projectId}/members`} className="btn-quiet">
                      People and invitations
                    </Link>
                  </li>
                </ul>
              </li>
            );
          })}
        </ul>
      )}
    </main>
  );
}
