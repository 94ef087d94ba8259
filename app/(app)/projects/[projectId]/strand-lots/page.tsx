import { SetupTabs } from "@/components/setup/setup-tabs";
import { StrandLotForm } from "@/components/setup/strand-lot-form";
import { StrandLotTable } from "@/components/setup/strand-lot-table";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listStrandLots } from "@/lib/server/list-strand-lots";
import { pageAccess } from "../page-access";

export const metadata = { title: "Strand lots" };

export default async function StrandLotsPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ edit?: string | string[] }>;
}) {
  const { projectId } = await params;
  const { edit } = await searchParams;
  const access = await pageAccess("schedule.manage", projectId);
  const [lots, project] = await Promise.all([listStrandLots(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  const editing = typeof edit === "string" ? lots.find((l) => l.id === edit) : undefined;
  return (
    <main>
      <SetupTabs projectId={projectId} projectName={access.projectName} current="strand-lots" />
      <h1 className="text-figure font-bold">Strand lots</h1>
      <p className="mt-2 text-ink-soft">
        Tendons that use a lot are computed with its mill-certificate area and modulus. The change against nominal
        values (ASTM A416 area, 28,500 ksi modulus) is shown beside each.
      </p>
      {edit !== undefined && !editing && (
        <p role="status" className="mt-4 rounded-md border-2 border-ink bg-concrete-100 p-3">
          The lot in the link is not on this project; nothing is open for editing.
        </p>
      )}
      {editing && (
        <div className="mt-6">
          {/* Keyed by the lot, so opening another lot starts from its own stored values. */}
          <StrandLotForm key={editing.id} projectId={projectId} us={us} lot={editing} />
        </div>
      )}
      <StrandLotTable projectId={projectId} us={us} initial={{ strandLots: lots }} />
      <div className="mt-8">
        <StrandLotForm projectId={projectId} us={us} />
      </div>
    </main>
  );
}
