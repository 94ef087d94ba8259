import { notFound } from "next/navigation";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { ScheduleImport } from "@/components/tendons/schedule-import";
import { TendonForm } from "@/components/tendons/tendon-form";
import { TendonTable } from "@/components/tendons/tendon-table";
import { Caution } from "@/components/ui/caution";
import { db } from "@/db";
import { columnGuide } from "@/lib/csv/tendon-schedule";
import { isAppError } from "@/lib/errors";
import { displayUnits } from "@/lib/schemas/project-settings";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listStrandLots } from "@/lib/server/list-strand-lots";
import { listTendons } from "@/lib/server/list-tendons";
import { isUuid, pageAccess } from "../../../page-access";

export const metadata = { title: "Pour schedule" };

export default async function PourPage({ params }: { params: Promise<{ projectId: string; pourId: string }> }) {
  const { projectId, pourId } = await params;
  const access = await pageAccess("schedule.manage", projectId);
  if (!isUuid(pourId)) notFound();
  const [list, project, lots] = await Promise.all([
    listTendons(db, { projectId, pourId }).catch((e: unknown) => {
      if (isAppError(e) && e.code === "NOT_FOUND") notFound();
      throw e;
    }),
    getProjectSettings(db, projectId),
    listStrandLots(db, projectId),
  ]);
  const u = displayUnits(project);
  const us = u.system === "US";
  const base = `/projects/${projectId}/pours/${pourId}`;
  return (
    <main className="space-y-8">
      <SetupTabs projectId={projectId} projectName={access.projectName} current="pours" />
      <div className="flex flex-wrap items-end justify-between gap-4">
        <h1 className="text-figure font-bold">{list.pour.name}</h1>
        <div className="flex flex-wrap gap-2">
          <a className="btn-quiet" href={`${base}/insight`}>
            Charts, insight and report
          </a>
          <a className="btn-quiet" href={`/api/projects/${projectId}/pours/${pourId}/tendons/export`} download>
            Export this schedule (CSV)
          </a>
          <a className="btn-quiet" href={`/api/projects/${projectId}/tendon-template`} download>
            Download the template
          </a>
        </div>
      </div>
      <TendonTable
        base={base}
        projectId={projectId}
        pourId={pourId}
        initial={list}
        lots={lots.map((l) => l.lotNumber)}
        us={us}
        resolution={u.resolution}
      />
      <Caution />
      <div className="grid gap-6 lg:grid-cols-2">
        <ScheduleImport projectId={projectId} pourId={pourId} />
        <section aria-labelledby="layout-heading" className="card">
          <h2 id="layout-heading" className="text-lead font-semibold">
            The file&apos;s columns
          </h2>
          <p className="mt-1">A header row with these names; units in brackets as shown. Column order is free.</p>
          <dl className="mt-2 space-y-1">
            {columnGuide(u.system).map((c) => (
              <div key={c.header}>
                <dt className="inline font-semibold">
                  {c.header}
                  {c.required ? "" : " (optional)"}
                </dt>
                <dd className="inline">: {c.hint}</dd>
              </div>
            ))}
          </dl>
        </section>
      </div>
      <TendonForm
        projectId={projectId}
        pourId={pourId}
        us={us}
        lots={lots.map((l) => ({ id: l.id, lotNumber: l.lotNumber, strandSize: l.strandSize }))}
      />
    </main>
  );
}
