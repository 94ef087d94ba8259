import Link from "next/link";
import { FlagChip, VerdictBadge } from "@/components/ui/verdict-badge";
import type { FlaggedTendon } from "@/lib/server/find-flags";

const age = (d: Date) => {
  const hours = (Date.now() - new Date(d).getTime()) / 3600_000;
  if (hours < 1) return `${Math.max(1, Math.round(hours * 60))} min`;
  if (hours < 48) return `${Math.round(hours)} h`;
  return `${Math.round(hours / 24)} days`;
};

const flagsHref = (t: FlaggedTendon) => `/projects/${t.projectId}/tendons/${t.tendonId}/flags`;

/**
 * Flagged tendons, one card each, oldest first. The cards' links are not prefetched: a queue of
 * dozens would have Next.js fetch every tendon's page after the load, on the inspector's phone too,
 * for the one or two opened.
 */
export function FlagQueue({ tendons, empty }: { tendons: FlaggedTendon[]; empty: string }) {
  if (!tendons.length) return <p className="card">{empty}</p>;
  return (
    <ul className="space-y-3">
      {tendons.map((t) => (
        <li key={t.tendonId} className="card flex flex-wrap items-center gap-4">
          <div className="min-w-48 flex-1">
            <p className="text-label uppercase text-ink-faint">
              {t.projectName} · {t.pourName} · oldest flag {age(t.oldest)} ago
            </p>
            <Link href={flagsHref(t)} prefetch={false} className="text-lead font-bold">
              Tendon {t.tag}
            </Link>
            <div className="mt-2 flex flex-wrap gap-2">
              {t.flags.map((f) => (
                <span key={f.id} className="inline-flex items-center gap-2">
                  <span className="font-bold tabular-nums">{f.reference}</span>
                  <FlagChip kind={f.kind} status={f.status} />
                </span>
              ))}
            </div>
            {t.clockSkewRecords > 0 && (
              <p className="mt-2 border-l-4 border-signal-stop pl-2 font-bold" data-clock-skew>
                Check the time: {t.clockSkewRecords === 1 ? "1 record has" : `${t.clockSkewRecords} records have`} a
                tablet time far from when the server received it (both times on the tendon page).
              </p>
            )}
          </div>
          {t.verdict && (
            <div className="flex flex-col items-start gap-1">
              <span className="text-label uppercase text-ink-faint">Latest verdict</span>
              <VerdictBadge verdict={t.verdict} deviationPct={t.deviationPct} provisional={t.provisional} />
            </div>
          )}
          <Link href={flagsHref(t)} prefetch={false} className="btn-primary">
            Open
          </Link>
        </li>
      ))}
    </ul>
  );
}
