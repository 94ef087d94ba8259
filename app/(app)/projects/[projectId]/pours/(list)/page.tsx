import { PourForm } from "@/components/setup/pour-form";
import { PourTable } from "@/components/setup/pour-table";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listPours } from "@/lib/server/list-pours";
import { pageAccess } from "../../page-access";

export const metadata = { title: "Pours and tendons" };

export default async function PoursPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("schedule.manage", projectId);
  const [pours, project] = await Promise.all([listPours(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  return (
    <main>
      <SetupTabs projectId={projectId} projectName={access.projectName} current="pours" />
      <h1 className="text-figure font-bold">Pours and tendons</h1>
      <PourTable projectId={projectId} us={us} initial={{ pours }} />
      <div className="mt-8">
        <PourForm projectId={projectId} us={us} />
      </div>
    </main>
  );
}
