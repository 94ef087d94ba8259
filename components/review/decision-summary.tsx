import { FlagChip, VerdictBadge } from "@/components/ui/verdict-badge";
import { formatDateTime } from "@/lib/format/dates";
import type { TendonCase } from "@/lib/server/get-tendon-case";
import { showComputedLength, showLength, showPct } from "@/lib/format/quantities";
import { showBandEdge } from "@/lib/stressing/display";
import { inWords } from "./flag-trail";

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
  // Read from the evaluation as stored (every judge's layout), as the calculation sheet reads it.
  const f = c.figures;
  // Which prediction governed, with the shop drawing's value beside Tautline's (evaluations since the project chooses).
  const governs = (c.evaluation?.result as { governsLine?: unknown } | undefined)?.governsLine;
  const figures: [string, string][] = [];
  if (c.predicted)
    figures.push([
      `Predicted (${p.comparisonBasis === "net" ? "net" : "gross"})`,
      showComputedLength(p, c.predicted.predictedMm),
    ]);
  if (f) {
    figures.push(["Measured", showLength(p, f.measuredMm)]);
    figures.push([
      `Band ±${p.tolerancePct} %`,
      `${showBandEdge(p, f.lowerMm, "lower")} to ${showBandEdge(p, f.upperMm, "upper")}`,
    ]);
    figures.push(["Deviation", showPct(f.deviationPct)]);
  }
  return (
    <section aria-labelledby="decision-summary-heading" className="card space-y-2 p-3" data-flag-id={flag?.id}>
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
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-[1fr_1fr_1.7fr_1fr]">
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
