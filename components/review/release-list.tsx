import { ReleaseForm, ReopenForm } from "@/components/review/release-card";
import { formatDateTime } from "@/lib/format/dates";
import type { ReleaseCandidate } from "@/lib/server/find-release-candidates";
import { countOf } from "@/lib/format/count";

const STATUS_WORDS: Record<ReleaseCandidate["status"], string> = {
  planned: "Planned: no record yet",
  stressing: "Stressing: records coming in",
  stressed: "Stressed: every end recorded",
  released: "Released",
};

export function ReleaseList({
  pours,
  canRelease,
  canReopen = () => false,
}: {
  pours: ReleaseCandidate[];
  canRelease: (pour: ReleaseCandidate) => boolean;
  canReopen?: (pour: ReleaseCandidate) => boolean;
}) {
  if (!pours.length) return <p className="card">No pour is waiting on you.</p>;
  return (
    <ul className="grid gap-4 md:grid-cols-2">
      {pours.map((p) => {
        const openTendons = [...new Set(p.blockers.openFlags.map((f) => f.tendonTag))];
        const clear = !p.blockers.noSchedule && !openTendons.length && !p.blockers.unstressed.length;
        return (
          <li key={p.pourId} className="card" data-pour={p.pourName}>
            <p className="text-label uppercase text-ink-faint">{p.projectName}</p>
            <h3 className="text-lead font-bold">{p.pourName}</h3>
            <p className="font-semibold" data-testid="pour-status">
              {STATUS_WORDS[p.status]}
            </p>
            <a className="btn-quiet mt-2" href={`/projects/${p.projectId}/pours/${p.pourId}/insight`}>
              Charts, insight and report
            </a>
            {p.reopened && (
              <p className="mt-2 rounded-md bg-concrete-100 p-2" data-testid="pour-reopened">
                Reopened by {p.reopened.by} on {formatDateTime(p.reopened.at, p.timeZone)}: {p.reopened.reason}
              </p>
            )}
            {p.releasedBy ? (
              <>
                <p className="mt-2 font-semibold">
                  ✓ Released by {p.releasedBy} on {p.releasedAt ? formatDateTime(p.releasedAt, p.timeZone) : ""}
                </p>
                {p.releaseStatement && <p className="mt-1 text-ink-soft">“{p.releaseStatement}”</p>}
                {p.releaseSignature && (
                  <p className="mt-1 text-label text-ink-soft" data-testid="release-signature">
                    Signed by {p.releaseSignature.signerName}, licence {p.releaseSignature.licence}. Report sha256 at
                    signing: <span className="break-all font-mono">{p.releaseSignature.contentSha256}</span>
                  </p>
                )}
                {canReopen(p) && (
                  <details className="mt-3">
                    <summary className="btn-quiet w-fit cursor-pointer">Reopen this pour…</summary>
                    <ReopenForm projectId={p.projectId} pourId={p.pourId} pourName={p.pourName} />
                  </details>
                )}
              </>
            ) : (
              <>
                <p className="mt-2">
                  {countOf(p.tendonCount, "tendon")} · {openTendons.length} with open flags ·{" "}
                  {p.blockers.unstressed.length} with ends not recorded
                </p>
                {p.blockers.noSchedule && (
                  <p className="mt-1 text-ink-soft">No tendon schedule yet: nothing to release.</p>
                )}
                {openTendons.length > 0 && (
                  <p className="mt-1 text-ink-soft">
                    Open flags on {openTendons.slice(0, 8).join(", ")}
                    {openTendons.length > 8 ? "…" : ""}
                  </p>
                )}
                {clear && canRelease(p) ? (
                  <ReleaseForm projectId={p.projectId} pourId={p.pourId} pourName={p.pourName} />
                ) : (
                  <p className="mt-2 font-semibold">
                    {clear
                      ? `Ready for release: the ${p.releaseBy === "engineer" ? "engineer of record" : "special inspector"} releases it.`
                      : "Cannot be released yet."}
                  </p>
                )}
              </>
            )}
          </li>
        );
      })}
    </ul>
  );
}
