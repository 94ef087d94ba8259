import Link from "next/link";
import { redirect } from "next/navigation";
import { DeviceOutbox } from "@/components/home/device-outbox";
import { FlagQueue } from "@/components/review/flag-queue";
import { ReleaseList } from "@/components/review/release-list";
import { Caution } from "@/components/ui/caution";
import { db } from "@/db";
import { can, ROLE_LABELS } from "@/lib/auth/permissions";
import { getSessionUser } from "@/lib/auth/session";
import { getHomeSummary } from "@/lib/server/get-home-summary";

export const metadata = { title: "Today" };
export const dynamic = "force-dynamic";

function Section({ id, title, children }: { id: string; title: string; children: React.ReactNode }) {
  return (
    <section aria-labelledby={id} className="space-y-3">
      <h2 id={id} className="text-lead font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default async function HomePage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const roles = new Set(user.memberships.map((m) => m.role));
  // Each project's "today" is its site's, in the project's time zone (getHomeSummary).
  const summary = await getHomeSummary(db, { memberships: user.memberships });

  return (
    <main className="space-y-10">
      <header>
        <h1 className="text-figure font-bold">Today</h1>
        <p className="mt-1 text-ink-soft">
          {user.name} ·{" "}
          {user.memberships.length
            ? user.memberships.map((m) => `${ROLE_LABELS[m.role]} on ${m.projectName}`).join(" · ")
            : "not on any project yet: a project admin adds people by invitation."}
        </p>
      </header>

      {(roles.has("crew") || roles.has("inspector")) && (
        <Section id="pours-today" title="Pours stressing today">
          {roles.has("crew") && <DeviceOutbox />}
          {summary.poursToday.length ? (
            <ul className="grid gap-4 md:grid-cols-2">
              {summary.poursToday.map((p) => (
                <li key={p.pourId} className="card">
                  <p className="text-label uppercase text-ink-faint">{p.projectName}</p>
                  <h3 className="text-lead font-bold">{p.pourName}</h3>
                  <p className="mt-1 tabular-nums">
                    {p.stressed} of {p.tendons} tendons stressed
                  </p>
                  <div className="mt-3 flex flex-wrap gap-2">
                    {roles.has("crew") && (
                      <Link href="/field" className="btn-primary">
                        Open the field log
                      </Link>
                    )}
                    <Link href={`/projects/${p.projectId}/pours/${p.pourId}/insight`} className="btn-quiet">
                      Pour overview
                    </Link>
                  </div>
                </li>
              ))}
            </ul>
          ) : (
            <p className="card">No pour is planned for stressing today.</p>
          )}
        </Section>
      )}

      {user.memberships.some((m) => can(m.role, "report.download")) && (
        <Section id="daily-reports" title="Daily inspection reports">
          <ul className="flex flex-wrap gap-2">
            {user.memberships
              .filter((m) => can(m.role, "report.download"))
              .map((m) => (
                <li key={m.projectId}>
                  <Link href={`/projects/${m.projectId}/daily`} className="btn-quiet">
                    {m.projectName}: {m.role === "inspector" ? "write and sign the day's report" : "the day's report"}
                  </Link>
                </li>
              ))}
          </ul>
        </Section>
      )}

      {roles.has("inspector") && (
        <Section id="open-flags" title={`Open flags (${summary.openFlags.length} tendons)`}>
          <FlagQueue
            tendons={summary.openFlags.slice(0, 6)}
            empty="No open flag. Records that pass every check do not appear here."
          />
          {summary.openFlags.length > 6 && <Link href="/review">All {summary.openFlags.length} flagged tendons</Link>}
        </Section>
      )}

      {roles.has("engineer") && (
        <>
          <Section
            id="awaiting-disposition"
            title={`Flags awaiting your disposition (${summary.waitingDisposition.length} tendons)`}
          >
            <FlagQueue
              tendons={summary.waitingDisposition.slice(0, 6)}
              empty="Nothing is waiting for your disposition."
            />
            {summary.waitingDisposition.length > 6 && <Link href="/decisions">All of them</Link>}
            <p>
              How flags reach you:{" "}
              {user.memberships
                .filter((m) => m.role === "engineer")
                .map((m, i) => (
                  <span key={m.projectId}>
                    {i > 0 && " · "}
                    <Link href={`/projects/${m.projectId}/flag-mail`}>your flag e-mails on {m.projectName}</Link>
                  </span>
                ))}
            </p>
          </Section>
          <Section id="awaiting-release" title="Pours awaiting release">
            <ReleaseList pours={summary.awaitingRelease} canRelease={() => false} />
            <p>
              <Link href="/decisions">Release from the decisions page</Link>
            </p>
          </Section>
        </>
      )}

      {roles.has("admin") && (
        <Section id="setup-gaps" title="Set-up gaps">
          {summary.gaps.length ? (
            <ul className="space-y-2">
              {summary.gaps.map((g) => (
                <li key={`${g.projectId}-${g.text}`} className="card flex flex-wrap items-center justify-between gap-3">
                  <span>
                    <span className="text-label uppercase text-ink-faint">{g.projectName}</span>
                    <br />
                    {g.text}
                  </span>
                  <Link href={g.href} className="btn-quiet">
                    Fix it
                  </Link>
                </li>
              ))}
            </ul>
          ) : (
            <p className="card">Nothing is missing: every tendon has a strand lot and every calibration is current.</p>
          )}
        </Section>
      )}

      {(roles.has("inspector") || roles.has("engineer")) && <Caution />}
    </main>
  );
}
