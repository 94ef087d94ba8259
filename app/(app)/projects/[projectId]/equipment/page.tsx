import { CalibrationForm, EquipmentSetForm } from "@/components/equipment/equipment-forms";
import { EquipmentList } from "@/components/equipment/equipment-list";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listEquipmentSets } from "@/lib/server/list-equipment-sets";
import { pageAccess } from "../page-access";

export const metadata = { title: "Equipment sets" };

export default async function EquipmentPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("equipment.manage", projectId);
  const [sets, project] = await Promise.all([listEquipmentSets(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  const initial = { equipmentSets: sets };
  return (
    <main className="space-y-6">
      <SetupTabs projectId={projectId} projectName={access.projectName} current="equipment" />
      <h1 className="text-figure font-bold">Equipment sets</h1>
      <p className="text-ink-soft">
        A jack, its gauge and pump, calibrated together. A record on an expired set raises a flag; sets that run out
        within 14 days are marked.
      </p>
      <EquipmentList projectId={projectId} us={us} initial={initial} />
      <CalibrationForm projectId={projectId} us={us} initial={initial} validityDays={project.calibrationValidityDays} />
      <EquipmentSetForm projectId={projectId} us={us} />
    </main>
  );
}
