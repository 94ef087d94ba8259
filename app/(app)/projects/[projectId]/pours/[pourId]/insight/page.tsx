import { notFound } from "next/navigation";
import { DeviationChart } from "@/components/insight/deviation-chart";
import { DriftTable, ModulusTable, ResolutionSummary } from "@/components/insight/insight-tables";
import { MeasuredPredictedChart } from "@/components/insight/measured-predicted-chart";
import { ProgressChart } from "@/components/insight/progress-chart";
import { ReportSigning } from "@/components/reports/report-signing";
import { ConcreteResults } from "@/components/concrete/concrete-results";
import { Caution } from "@/components/ui/caution";
import { db, momentOld } from "@/db";
import { can } from "@/lib/auth/permissions";
import { isAppError } from "@/lib/errors";
import { DRIFT_RULE } from "@/lib/insights";
import { formatDateTime } from "@/lib/format/dates";
import { DEFAULT_POUR_STATEMENT } from "@/lib/schemas/report-signature";
import { getPourInsight } from "@/lib/server/get-pour-insight";
import { getProjectTimeZone } from "@/lib/server/get-project-time-zone";
import { listConcreteResults } from "@/lib/server/list-concrete-results";
import { listReportRevisions } from "@/lib/server/list-report-revisions";
import { displayUnit, inDisplayUnit, readingResolution, showComputedLength } from "@/lib/format/quantities";
import { isUuid, pageAccess } from "../../../page-access";

export const metadata = { title: "Pour insight" };

export default async function PourInsightPage({ params }: { params: Promise<{ projectId: string; pourId: string }> }) {
  const { projectId, pourId } = await params;
  const access = await pageAccess("record.view", projectId);
  if (!isUuid(pourId)) notFound();
  const insight = await getPourInsight(momentOld, { projectId, pourId }).catch((e: unknown) => {
    if (isAppError(e) && e.code === "NOT_FOUND") notFound();
    throw e;
  });
  const us = insight.project.unitSystem === "us";
  const lengthUnit = displayUnit(insight.project, "length");
  const points = insight.points.map((p, i) => ({
    index: i + 1,
    tag: p.tag,
    deviationPct: p.deviationPct,
    verdict: p.verdict,
    provisional: p.provisional,
  }));
  const api = `/api/projects/${projectId}/pours/${pourId}/report`;
  const signatures = can(access.role, "report.download") ? await listReportRevisions(db, { projectId, pourId }) : null;
  const { progress } = insight;
  const [concrete, timeZone] = await Promise.all([
    listConcreteResults(db, { projectId, pourId }),
    getProjectTimeZone(db, projectId),
  ]);

  return (
    <main className="space-y-10">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-label uppercase text-ink-faint">{access.projectName}</p>
          <h1 className="text-figure font-bold">{insight.pour.name}: what the records show</h1>
          <p className="mt-1 text-ink-soft">
            {progress.stressed} of {progress.tendons} tendons complete
            {progress.provisional ? `, ${progress.provisional} with an end still to read` : ""}; pour{" "}
            {insight.pour.status}.
          </p>
        </div>
        {can(access.role, "report.download") && (
          <div className="flex flex-wrap gap-2">
            <a className="btn-primary" href={`${api}/pdf`} download>
              Stressing report (PDF)
            </a>
            <a className="btn-quiet" href={`${api}/csv`} download>
              Records as CSV
            </a>
          </div>
        )}
      </header>

      <ConcreteResults
        projectId={projectId}
        pourId={pourId}
        us={us}
        timeZone={timeZone}
        canEnter={can(access.role, "concrete.confirm")}
        initial={concrete}
      />

      {signatures && (
        <section aria-labelledby="signatures-heading" className="space-y-3">
          <h2 id="signatures-heading" className="text-lead font-bold">
            Signed stressing report
          </h2>
          <ReportSigning
            projectId={projectId}
            pourId={pourId}
            pourName={insight.pour.name}
            revisions={signatures.revisions.map((r) => ({
              revision: r.revision,
              signerName: r.signerName,
              licence: r.licence,
              signedAt: formatDateTime(r.signedAt, signatures.timeZone),
              fileSha256: r.fileSha256,
              changes: r.changes,
            }))}
            current={signatures.current}
            canSign={can(access.role, "report.sign")}
            signerName={access.user.name}
            defaultStatement={DEFAULT_POUR_STATEMENT}
          />
        </section>
      )}

      <section aria-labelledby="progress-heading" className="space-y-3">
        <h2 id="progress-heading" className="text-lead font-bold">
          Progress of the pour
        </h2>
        <ProgressChart {...progress} />
      </section>

      {points.length === 0 ? (
        <p className="card">
          No tendon on this pour has been stressed yet. The charts appear here once the crew&apos;s records reach the
          server.
        </p>
      ) : (
        <div className="grid gap-8 xl:grid-cols-2">
          <section aria-labelledby="deviation-heading" className="space-y-3">
            <h2 id="deviation-heading" className="text-lead font-bold">
              Deviation per tendon against the band
            </h2>
            <DeviationChart points={points} tolerancePct={insight.project.tolerancePct} />
          </section>
          <section aria-labelledby="scatter-heading" className="space-y-3">
            <h2 id="scatter-heading" className="text-lead font-bold">
              Measured against predicted
            </h2>
            <MeasuredPredictedChart
              points={insight.points.map((p) => ({
                tag: p.tag,
                predicted: inDisplayUnit(insight.project, "length", p.predictedMm),
                measured: inDisplayUnit(insight.project, "length", p.measuredMm),
                predictedText: showComputedLength(insight.project, p.predictedMm),
                measuredText: showComputedLength(insight.project, p.measuredMm),
                verdict: p.verdict,
              }))}
              tolerancePct={insight.project.tolerancePct}
              unit={lengthUnit}
            />
          </section>
        </div>
      )}

      <section aria-labelledby="drift-heading" className="space-y-4">
        <h2 id="drift-heading" className="text-lead font-bold">
          Equipment sets: is one drifting?
        </h2>
        <p className="text-ink-soft">
          Elongation follows force, so a gauge or jack out of calibration moves every tendon it stresses the same way. A
          set is marked when its mean differs from the other sets&apos; pooled mean by at least{" "}
          {DRIFT_RULE.minDifferencePct} points, with at least {DRIFT_RULE.minSamples} complete tendons on each side, and
          by at least {DRIFT_RULE.minT} standard errors (Welch&apos;s two-sample comparison).
          {insight.mixedSets > 0 ? ` ${insight.mixedSets} tendons stressed with two different sets are left out.` : ""}
        </p>
        <DriftTable caption="On this pour" sets={insight.driftOnPour} />
        <DriftTable caption="Across the project" sets={insight.driftOnProject} />
      </section>

      <section aria-labelledby="modulus-heading" className="space-y-3">
        <h2 id="modulus-heading" className="text-lead font-bold">
          Apparent modulus from gauge steps
        </h2>
        <p className="text-ink-soft">
          Where the crew read the elongation at several gauge pressures, the slope of force against reading gives the
          modulus the tendon behaved as if it had. Friction alone puts it above the mill value; a ratio far from the
          neighbours&apos; is worth a look.
        </p>
        <ModulusTable moduli={insight.moduli} project={insight.project} />
      </section>

      <section aria-labelledby="resolution-heading" className="space-y-3">
        <h2 id="resolution-heading" className="text-lead font-bold">
          Verdicts the reading division could change
        </h2>
        <ResolutionSummary
          resolution={insight.resolution}
          division={readingResolution(insight.project.readingResolution)}
        />
      </section>

      <Caution />
    </main>
  );
}
