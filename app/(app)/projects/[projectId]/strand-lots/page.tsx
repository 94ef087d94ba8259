import { SetupTabs } from "@/components/setup/setup-tabs";
import { StrandLotForm } from "@/components/setup/strand-lot-form";
import { db } from "@/db";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listStrandLots } from "@/lib/server/list-strand-lots";
import { pageAccess } from "../page-access";

export const metadata = { title: "Strand lots" };

const signed = (pct: number) => `${pct > 0 ? "+" : ""}${pct.toFixed(1)} %`;

export default async function StrandLotsPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("schedule.manage", projectId);
  const [lots, project] = await Promise.all([listStrandLots(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  return (
    <main>
      <SetupTabs projectId={projectId} projectName={access.projectName} current="strand-lots" />
      <h1 className="text-figure font-bold">Strand lots</h1>
      <p className="mt-2 text-ink-soft">Tendons that use a lot are computed with its mill-certificate area and modulus. The change against nominal values (ASTM A416 area, 28,500 ksi modulus) is shown beside each.</p>
      {lots.length === 0 ? (
        <p className="card mt-6">No strand lots yet. Register each reel or pack with its mill certificate below.</p>
      ) : (
        <div className="mt-6 overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-ink">
                <th className="p-2">Lot</th>
                <th className="p-2">Size</th>
                <th className="p-2 text-right">Area</th>
                <th className="p-2 text-right">Modulus</th>
                <th className="p-2 text-right">Breaking load</th>
                <th className="p-2 text-right">A·E against nominal</th>
                <th className="p-2 text-right">Tendons</th>
                <th className="p-2">Certificate</th>
              </tr>
            </thead>
            <tbody>
              {lots.map((l) => (
                <tr key={l.id} className="border-b border-concrete-300">
                  <td className="p-2 font-semibold">{l.lotNumber}</td>
                  <td className="p-2">{l.strandSize}</td>
                  <td className="p-2 text-right">
                    {us ? `${(l.areaMm2 / 645.16).toFixed(4)} in²` : `${l.areaMm2.toFixed(1)} mm²`}
                    {l.againstNominal && <span className="block text-label text-ink-soft">{signed(l.againstNominal.areaPct)}</span>}
                  </td>
                  <td className="p-2 text-right">
                    {us ? `${(l.modulusMPa / 6.894757293168).toFixed(0)} ksi` : `${(l.modulusMPa / 1000).toFixed(1)} GPa`}
                    {l.againstNominal && <span className="block text-label text-ink-soft">{signed(l.againstNominal.modulusPct)}</span>}
                  </td>
                  <td className="p-2 text-right">
                    {us ? `${(l.breakingLoadN / 4448.2216152605).toFixed(1)} kip` : `${(l.breakingLoadN / 1000).toFixed(1)} kN`}
                    {l.againstNominal && <span className="block text-label text-ink-soft">{signed(l.againstNominal.breakingPct)}</span>}
                  </td>
                  <td className="p-2 text-right font-semibold">{l.againstNominal ? signed(l.againstNominal.areaTimesModulusPct) : "—"}</td>
                  <td className="p-2 text-right">{l.tendonCount}</td>
                  <td className="p-2">
                    {l.certificateAttachmentId ? (
                      <a href={`/api/projects/${projectId}/attachments/${l.certificateAttachmentId}`} className="inline-flex min-h-touch items-center">
                        {l.certificateName ?? "certificate"}
                      </a>
                    ) : (
                      <strong>
                        <span aria-hidden="true">⚠ </span>none on file
                      </strong>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="mt-8">
        <StrandLotForm projectId={projectId} us={us} />
      </div>
    </main>
  );
}
