import { SetupTabs } from "@/components/setup/setup-tabs";
import { StrandLotForm } from "@/components/setup/strand-lot-form";
import { StrandLotTable } from "@/components/setup/strand-lot-table";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listStrandLots } from "@/lib/server/list-strand-lots";
import { pageAccess } from "../page-access";

export const metadata = { title: "Strand lots" };

export default async function StrandLotsPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("schedule.manage", projectId);
  const [lots, project] = await Promise.all([listStrandLots(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  return (
    <main>
      <SetupTabs projectId={projectId} projectName={access.projectName} current="strand-lots" />
      <h1 className="text-figure font-bold">Strand lots</h1>
      <p className="mt-2 text-ink-soft">
        Tendons that use a lot are computed with its mill-certificate area and modulus. The change against nominal
        values (ASTM A416 area, 28,500 ksi modulus) is shown beside each.
      </p>
      <StrandLotTable projectId={projectId} us={us} initial={{ strandLots: lots }} />
      <div className="mt-8">
        <StrandLotForm projectId={projectId} us={us} />
      </div>
    </main>
  );
}
