import { ForceProfileChart } from "@/components/review/force-profile-chart";
import { LineIcon } from "@/components/ui/mark";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import {
  showAngle,
  showArea,
  showBandPct,
  showComputedLength,
  showForce,
  showLength,
  showModulus,
  showNumber,
  showPct,
  showPressure,
  showWobble,
} from "@/lib/format/quantities";
import type { TendonCase } from "@/lib/server/get-tendon-case";
import { showBandEdge, specifiedForceSourceWords } from "@/lib/stressing/display";

function Row({ label, value, source }: { label: string; value: string; source?: string }) {
  return (
    <tr className="border-b border-concrete-200">
      <th scope="row" className="py-2 pr-4 text-left font-normal text-ink-soft">
        {label}
      </th>
      <td className="py-2 pr-4 text-right font-semibold tabular-nums">{value}</td>
      <td className="py-2 text-label text-ink-faint">{source}</td>
    </tr>
  );
}

/**
 * One part of the sheet, folded with <details> so it opens and closes without JavaScript; the
 * heading stays in the summary, so the sheet's outline reads the same open or closed.
 */
function Section({
  id,
  title,
  open,
  children,
}: {
  id: string;
  title: string;
  open?: boolean;
  children: React.ReactNode;
}) {
  return (
    <details open={open} className="group rounded-md border-2 border-concrete-300 bg-white" data-sheet-section={id}>
      <summary className="flex min-h-touch cursor-pointer items-center gap-2 px-4 py-2">
        <LineIcon
          d="M9 5l7 7-7 7"
          className="h-5 w-5 shrink-0 transition-transform group-open:rotate-90"
          weight={2.5}
        />
        <h3 id={`${id}-heading`} className="text-lead font-bold">
          {title}
        </h3>
      </summary>
      <div className="px-4 pb-4">{children}</div>
    </details>
  );
}

/** One end's force both ways: the gauge's, the elongation's, and their difference against the band. */
function ForceRows({
  p,
  e,
}: {
  p: TendonCase["basis"]["project"];
  e: NonNullable<TendonCase["figures"]>["ends"][number];
}) {
  const band = e.forceBandPct !== null ? showBandPct(e.forceBandPct) : null;
  const agrees =
    e.forceDifferencePct !== null && band !== null ? Math.abs(e.forceDifferencePct) <= e.forceBandPct! + 1e-9 : null;
  return (
    <>
      <Row
        label={`Force from the gauge, end ${e.end}`}
        value={showForce(p, e.gaugeForceN!)}
        source="Calibration line at the final pressure"
      />
      <Row
        label={`Force implied by the elongation, end ${e.end}`}
        value={showForce(p, e.impliedForceN!)}
        source="Pj · (m + set)/gross on net; Pj · m/(gross + grip) on gross"
      />
      {e.forceDifferencePct !== null && (
        <Row
          label={`Difference, end ${e.end}`}
          value={`${showPct(e.forceDifferencePct)}${agrees === null ? "" : agrees ? `, within ${band}` : `, outside ${band}`}`}
          source="(elongation − gauge)/gauge; both determinations, ACI 318-11 §18.20.1 (from memory)"
        />
      )}
    </>
  );
}

/** One end's gauge steps and their least-squares line, and a final pressure kept off its target. */
function GaugeRows({
  p,
  e,
}: {
  p: TendonCase["basis"]["project"];
  e: NonNullable<TendonCase["figures"]>["ends"][number];
}) {
  const fit = e.stepFit;
  const off = e.offTargetPct !== null && Math.abs(e.offTargetPct) > p.tolerancePct + 1e-9;
  return (
    <>
      {fit && (
        <>
          <Row
            label={`Gauge steps, end ${e.end}`}
            value={fit.steps.map((s) => `${showPressure(p, s.pressureMPa)}: ${showLength(p, s.readingMm)}`).join("; ")}
            source="As read on the way up, pressure: reading"
          />
          <Row
            label={`Steps' line, end ${e.end}`}
            value={`r² ${showNumber(fit.r2, 4)}; adds ${showComputedLength(p, fit.belowReferenceMm)} below ${
              e.initialPressureMPa !== null ? showPressure(p, e.initialPressureMPa) : "zero"
            }`}
            source="Least squares of force on reading; force ÷ slope below the initial pressure"
          />
        </>
      )}
      {(off || e.gaugeOffTarget) && e.targetPressureMPa !== null && e.offTargetPct !== null && (
        <Row
          label={`Final pressure off target, end ${e.end}`}
          value={`${showPct(e.offTargetPct)} from ${showPressure(p, e.targetPressureMPa)}`}
          source={
            e.gaugeOffTarget ? `Kept by the crew: “${e.gaugeOffTarget.reason}”` : "No reason came with the record"
          }
        />
      )}
    </>
  );
}

/** The computation, read top to bottom like a calculation sheet: inputs, steps, result. */
export function ComputationSheet({ c }: { c: TendonCase }) {
  const { basis, predicted, profile, segments } = c;
  const p = basis.project;
  if (!predicted || !profile) {
    return <p className="card">The prediction could not be computed: {c.computationError}</p>;
  }
  const e = predicted.prediction;
  const judgement = c.figures;
  const totalLength = segments.at(-1)?.endMm ?? 0;
  return (
    <div className="space-y-3">
      <Section id="inputs" title="1. Inputs" open>
        <table className="mt-2 w-full">
          <tbody>
            <Row
              label="Strand"
              value={`${basis.tendon.strandCount} × ${basis.tendon.strandSize}`}
              source="Tendon schedule"
            />
            <Row
              label="Area per strand"
              value={showArea(p, predicted.strand.areaMm2)}
              source={
                predicted.strand.source === "strand lot"
                  ? `Mill certificate, lot ${basis.lot?.lotNumber}`
                  : "ASTM A416 nominal"
              }
            />
            <Row
              label="Modulus E"
              value={showModulus(p, predicted.strand.modulusMPa)}
              source={
                predicted.strand.source === "strand lot"
                  ? `Mill certificate, lot ${basis.lot?.lotNumber}`
                  : "28,500 ksi default (AASHTO LRFD 5.4.4.2)"
              }
            />
            <Row
              label="Jacking force Pj"
              value={`${showForce(p, predicted.jackingForceN)}, ${specifiedForceSourceWords(
                predicted.jackingForceSource === "schedule" ? "schedule" : "project",
                predicted.jackingForceFactor,
              )}`}
              source={
                predicted.jackingForceSource === "schedule"
                  ? "The tendon's schedule row (at most 0.80·fpu·A, ACI 318-19 Table 20.3.2.5.1)"
                  : "Project setting: its factor × specified breaking load of the nominal strand (at most 0.80, ACI 318-19 Table 20.3.2.5.1)"
              }
            />
            <Row
              label="Tendon length"
              value={showComputedLength(p, totalLength)}
              source={`${segments.length} segments, schedule profile`}
            />
            <Row label="Curvature friction μ" value={String(p.frictionMu)} source="Project setting" />
            <Row
              label="Wobble K"
              value={`${showWobble({ unitSystem: "si" }, p.wobblePerM, 5)} (${showWobble({ unitSystem: "us" }, p.wobblePerM, 5)})`}
              source="Project setting"
            />
            <Row label="Anchor set" value={showComputedLength(p, p.anchorSetMm)} source="Project setting" />
            <Row
              label="Strand inside the jack"
              value={predicted.gripMm ? showComputedLength(p, predicted.gripMm) : "not counted"}
              source="Project basis"
            />
            <Row
              label="Stressed from"
              value={basis.tendon.ends === "both" ? "both ends" : `end ${basis.tendon.ends}`}
              source="Tendon schedule"
            />
          </tbody>
        </table>
      </Section>

      <Section id="steps" title="2. Friction, segment by segment">
        <p className="mt-1 text-ink-soft">
          P(x) = Pj·e<sup>−(K·x + μ·α)</sup>; each segment stretches Δ = P·L·(1 − e<sup>−β</sup>)/(β·A·E) with β = K·L +
          μ·α.
        </p>
        <div className="mt-2 overflow-x-auto" tabIndex={0} role="region" aria-label="Segments, scrolls sideways">
          <table className="w-full min-w-[560px]">
            <thead>
              <tr className="border-b-2 border-ink text-left text-label uppercase">
                <th className="py-2">Segment</th>
                <th className="py-2 text-right">Length</th>
                <th className="py-2 text-right">Angle change α</th>
                <th className="py-2 text-right">β</th>
                <th className="py-2 text-right">Ends at</th>
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {segments.map((s) => (
                <tr key={s.index} className="border-b border-concrete-200">
                  <td className="py-1">{s.index}</td>
                  <td className="py-1 text-right">{showComputedLength(p, s.lengthMm)}</td>
                  <td className="py-1 text-right">{showAngle(s.angleRad)}</td>
                  <td className="py-1 text-right">{showNumber(s.beta, 5)}</td>
                  <td className="py-1 text-right">{showComputedLength(p, s.endMm)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="card mt-4">
          <ForceProfileChart profile={profile} project={p} formatLength={(mm) => showComputedLength(p, mm)} />
        </div>
      </Section>

      <Section id="set" title="3. Elongation and anchor set">
        <table className="mt-2 w-full">
          <tbody>
            {e.perEndMm.A !== undefined && <Row label="From end A" value={showComputedLength(p, e.perEndMm.A)} />}
            {e.perEndMm.B !== undefined && <Row label="From end B" value={showComputedLength(p, e.perEndMm.B)} />}
            <Row
              label="Gross at jacking"
              value={showComputedLength(p, e.grossMm)}
              source="Σ segments (+ strand in jack)"
            />
            <Row
              label="Net of anchor set"
              value={showComputedLength(p, e.netMm)}
              source="Gross − anchor set at each stressed end"
            />
            <Row label="Force at the far end / meeting point" value={showForce(p, e.farEndForceN)} />
            <Row label="Average force" value={showForce(p, e.averageForceN)} />
            {e.seating && (
              <>
                <Row
                  label="Anchor-set influence length"
                  value={showComputedLength(p, e.seating.influenceMm)}
                  source="√(Δset·A·E/p)"
                />
                <Row
                  label="Force at the anchor after seating"
                  value={showForce(p, e.seating.anchorForceAfterN)}
                  source="Check: ≤ 0.70·fpu·A"
                />
              </>
            )}
          </tbody>
        </table>
      </Section>

      <Section id="result" title="4. Result" open>
        <table className="mt-2 w-full">
          <tbody>
            <Row
              label={`Predicted, ${p.comparisonBasis === "net" ? "net of anchor set" : "gross at jacking"}`}
              value={showComputedLength(p, predicted.predictedMm)}
              source="Project comparison basis"
            />
            {judgement && (
              <>
                <Row
                  label="Measured (sum of ends read)"
                  value={showLength(p, judgement.measuredMm)}
                  source="Stressing records, latest revisions"
                />
                <Row
                  label={`Band ±${p.tolerancePct} %${p.shortTendonFloorMm ? `, at least ±${showComputedLength(p, p.shortTendonFloorMm)}` : ""}`}
                  value={`${showBandEdge(p, judgement.lowerMm, "lower")} to ${showBandEdge(p, judgement.upperMm, "upper")}`}
                  source="ACI 318 §26.10 practice; project rule"
                />
                <Row
                  label="Deviation"
                  value={showPct(judgement.deviationPct)}
                  source="(measured − predicted)/predicted"
                />
                {judgement.ends.map((e) =>
                  e.gaugeForceN !== null && e.impliedForceN !== null ? <ForceRows key={e.end} p={p} e={e} /> : null,
                )}
                {judgement.ends.map((e) => (
                  <GaugeRows key={`gauge-${e.end}`} p={p} e={e} />
                ))}
              </>
            )}
          </tbody>
        </table>
        <div className="mt-4">
          {c.evaluation ? (
            <VerdictBadge
              verdict={c.evaluation.verdict}
              deviationPct={c.evaluation.deviation_pct}
              provisional={c.evaluation.provisional}
            />
          ) : (
            <p className="text-ink-soft">No stressing record has reached the server for this tendon yet.</p>
          )}
        </div>
      </Section>
    </div>
  );
}
