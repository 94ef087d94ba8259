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
import { Section } from "@/components/ui/section";

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
        <Section id="signatures-heading" title="Signed stressing report">
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
        </Section>
      )}

      <Section id="progress-heading" title="Progress of the pour">
        <ProgressChart {...progress} />
      </Section>

      {points.length === 0 ? (
        <p className="card">
          No tendon on this pour has been stressed yet. The charts appear here once the crew&apos;s records reach the
          server.
        </p>
      ) : (
        <div className="grid gap-8 xl:grid-cols-2">
          <Section id="deviation-heading" title="Deviation per tendon against the band">
            <DeviationChart points={points} tolerancePct={insight.project.tolerancePct} />
          </Section>
          <Section id="scatter-heading" title="Measured against predicted">
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
          </Section>
        </div>
      )}

      <Section id="drift-heading" title="Equipment sets: is one drifting?" className="space-y-4">
        <p className="text-ink-soft">
          Elongation follows force, so a gauge or jack out of calibration moves every tendon it stresses the same way. A
          set is marked when its mean differs from the other sets&apos; pooled mean by at least{" "}
          {DRIFT_RULE.minDifferencePct} points, with at least {DRIFT_RULE.minSamples} complete tendons on each side, and
          by at least {DRIFT_RULE.minT} standard errors (Welch&apos;s two-sample comparison).
          {insight.mixedSets > 0 ? ` ${insight.mixedSets} tendons stressed with two different sets are left out.` : ""}
        </p>
        <DriftTable caption="On this pour" sets={insight.driftOnPour} />
        <DriftTable caption="Across the project" sets={insight.driftOnProject} />
      </Section>

      <Section id="modulus-heading" title="Apparent modulus from gauge steps">
        <p className="text-ink-soft">
          Where the crew read the elongation at several gauge pressures, the slope of force against reading gives the
          modulus the tendon behaved as if it had. Friction alone puts it above the mill value; a ratio far from the
          neighbours&apos; is worth a look.
        </p>
        <ModulusTable moduli={insight.moduli} project={insight.project} />
      </Section>

      <Section id="resolution-heading" title="Verdicts the reading division could change">
        <ResolutionSummary
          resolution={insight.resolution}
          division={readingResolution(insight.project.readingResolution)}
        />
      </Section>

      <Caution />
    </main>
  );
}
