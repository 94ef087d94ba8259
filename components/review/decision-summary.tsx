import { FlagChip, VerdictBadge } from "@/components/ui/verdict-badge";
import type { Verdict } from "@/db/types";
import { formatDateTime } from "@/lib/format/dates";
import type { TendonCase } from "@/lib/server/get-tendon-case";
import { showComputedLength, showLength, showPct } from "@/lib/format/quantities";
import { inWords } from "./flag-trail";

interface Judgement {
  measuredMm: number;
  comparison: { deviationPct: number; verdict: Verdict; lowerMm: number; upperMm: number };
}

/**
 * What a decision needs at a glance: the flag in question with its reason, the verdict, and the
 * few numbers that matter (predicted, measured, the band, the deviation). The full sheet is below.
 */
export function DecisionSummary({
  c,
  flagId,
  timeZone,
}: {
  c: TendonCase;
  flagId: string | undefined;
  timeZone: string;
}) {
  const p = c.basis.project;
  const flag = c.flags.find((f) => f.id === flagId) ?? c.flags.find((f) => f.status !== "closed") ?? c.flags.at(-1);
  const judgement = (c.evaluation?.result as { judgement?: Judgement | null } | undefined)?.judgement ?? null;
  // Which prediction governed, with the shop drawing's value beside Tautline's (evaluations since the project chooses).
  const governs = (c.evaluation?.result as { governsLine?: unknown } | undefined)?.governsLine;
  const figures: [string, string][] = [];
  if (c.predicted)
    figures.push([
      `Predicted (${p.comparisonBasis === "net" ? "net" : "gross"})`,
      showComputedLength(p, c.predicted.predictedMm),
    ]);
  if (judgement) {
    figures.push(["Measured", showLength(p, judgement.measuredMm)]);
    figures.push([
      `Band ±${p.tolerancePct} %`,
      `${showComputedLength(p, judgement.comparison.lowerMm)} to ${showComputedLength(p, judgement.comparison.upperMm)}`,
    ]);
    figures.push(["Deviation", showPct(judgement.comparison.deviationPct)]);
  }
  return (
    <section aria-labelledby="decision-summary-heading" className="card space-y-3 p-3" data-flag-id={flag?.id}>
      <h2 id="decision-summary-heading" className="sr-only">
        The flag in question
      </h2>
      <div className="flex flex-wrap items-center gap-3">
        {flag ? (
          <>
            <span className="font-bold tabular-nums">{flag.reference}</span>
            <FlagChip kind={flag.kind} status={flag.status} />
          </>
        ) : (
          <span className="text-ink-soft">No flag on this tendon</span>
        )}
        {c.evaluation ? (
          <VerdictBadge
            verdict={c.evaluation.verdict}
            deviationPct={c.evaluation.deviation_pct}
            provisional={c.evaluation.provisional}
          />
        ) : (
          <span className="text-ink-soft">Not stressed yet</span>
        )}
      </div>
      {/* An out-of-band flag's reason repeats the figures below; other flags say what happened. */}
      {flag && (flag.kind !== "out_of_band" || figures.length === 0) && (
        <p>{inWords(flag.reason, c, (d) => formatDateTime(d, timeZone))}</p>
      )}
      {figures.length > 0 && (
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-4">
          {figures.map(([label, value]) => (
            <div key={label}>
              <dt className="field-label">{label}</dt>
              <dd className="font-bold tabular-nums">{value}</dd>
            </div>
          ))}
        </dl>
      )}
      {typeof governs === "string" && <p data-testid="governs">{governs}</p>}
    </section>
  );
}
