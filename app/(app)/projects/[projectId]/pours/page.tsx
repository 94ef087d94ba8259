import Link from "next/link";
import { PourForm } from "@/components/setup/pour-form";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listPours } from "@/lib/server/list-pours";
import { pageAccess } from "../page-access";

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
      {pours.length === 0 ? (
        <p className="card mt-6">No pours yet. Add the first one below, then import its tendon schedule.</p>
      ) : (
        <table className="mt-6 w-full border-collapse text-left">
          <thead>
            <tr className="border-b-2 border-ink">
              <th className="p-3">Pour</th>
              <th className="p-3">Level</th>
              <th className="p-3 text-right">Area, {us ? "ft²" : "m²"}</th>
              <th className="p-3">Planned stressing</th>
              <th className="p-3">Status</th>
              <th className="p-3 text-right">Tendons</th>
            </tr>
          </thead>
          <tbody>
            {pours.map((p) => (
              <tr key={p.id} className="border-b border-concrete-300">
                <td className="p-3">
                  <Link href={`/projects/${projectId}/pours/${p.id}`} className="inline-flex min-h-touch items-center font-semibold">
                    {p.name}
                  </Link>
                </td>
                <td className="p-3">{p.level ?? "—"}</td>
                <td className="p-3 text-right">{p.areaM2 === null ? "—" : Math.round(us ? p.areaM2 * 10.7639104167 : p.areaM2).toLocaleString("en-US")}</td>
                <td className="p-3">{p.plannedStressingDate ?? "—"}</td>
                <td className="p-3">{p.status}</td>
                <td className="p-3 text-right">{p.tendonCount === 0 ? <strong>none yet</strong> : p.tendonCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <div className="mt-8">
        <PourForm projectId={projectId} us={us} />
      </div>
    </main>
  );
}
