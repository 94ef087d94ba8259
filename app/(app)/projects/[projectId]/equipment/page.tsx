import { CalibrationChart } from "@/components/equipment/calibration-chart";
import { CalibrationForm, EquipmentSetForm } from "@/components/equipment/equipment-forms";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { db } from "@/db";
import { CALIBRATION_STATE_LABELS } from "@/lib/schemas/calibration";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listEquipmentSets } from "@/lib/server/list-equipment-sets";
import { pageAccess } from "../page-access";

export const metadata = { title: "Equipment sets" };

const MPA_PER_PSI = 0.006894757293168;
const N_PER_KIP = 4448.2216152605;

export default async function EquipmentPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("equipment.manage", projectId);
  const [sets, project] = await Promise.all([listEquipmentSets(db, projectId), getProjectSettings(db, projectId)]);
  const us = project.unitSystem === "us";
  const p = (mpa: number) => (us ? mpa / MPA_PER_PSI : mpa);
  const f = (n: number) => (us ? n / N_PER_KIP : n / 1000);
  const pu = us ? "psi" : "MPa";
  const fu = us ? "kip" : "kN";
  return (
    <main className="space-y-6">
      <SetupTabs projectId={projectId} projectName={access.projectName} current="equipment" />
      <h1 className="text-figure font-bold">Equipment sets</h1>
      <p className="text-ink-soft">A jack, its gauge and pump, calibrated together. A record on an expired set raises a flag; sets that run out within 14 days are marked.</p>
      {sets.length === 0 && <p className="card">No equipment sets yet. Add the first one below.</p>}
      <ul className="grid gap-4 lg:grid-cols-2">
        {sets.map((s) => {
          const c = s.current;
          const tone = s.state === "valid" ? "border-concrete-300" : s.state === "expiring" ? "border-signal-long" : "border-signal-stop";
          return (
            <li key={s.id} className={`card border-2 ${tone}`}>
              <h2 className="text-lead font-semibold">{s.name}</h2>
              <p>
                Jack {s.jackSerial} · gauge {s.gaugeSerial}
                {s.pumpSerial ? ` · pump ${s.pumpSerial}` : ""}
              </p>
              <p className={`mt-2 font-semibold ${s.state === "valid" ? "" : s.state === "expiring" ? "text-signal-long" : "text-signal-stop"}`}>
                <span aria-hidden="true">{s.state === "valid" ? "✓ " : s.state === "expiring" ? "⚠ " : "⚠ "}</span>
                {CALIBRATION_STATE_LABELS[s.state]}
                {c ? `: calibrated ${c.calibratedOn}, valid to ${c.validUntil}` : ""}
              </p>
              {c && (
                <>
                  <p className="mt-1">
                    Line: force = {f(c.slope * (us ? MPA_PER_PSI : 1)).toFixed(us ? 5 : 4)} {fu}/{pu} × pressure {c.intercept >= 0 ? "+" : "−"} {Math.abs(f(c.intercept)).toFixed(2)} {fu} · r² = {c.r2.toFixed(5)} · {c.points.length} points,{" "}
                    {p(c.minPressureMPa).toFixed(0)}–{p(c.maxPressureMPa).toFixed(0)} {pu}
                    {c.laboratory ? ` · ${c.laboratory}` : ""}
                  </p>
                  <CalibrationChart
                    label={`Calibration of ${s.name}: ${c.points.length} points and the fitted line`}
                    pressureUnit={pu}
                    forceUnit={fu}
                    points={c.points.map((x) => ({ p: p(x.pressureMPa), f: f(x.forceN) }))}
                    line={[0, c.maxPressureMPa].map((x) => ({ p: p(x), f: f(c.slope * x + c.intercept) }))}
                  />
                  {c.certificateAttachmentId ? (
                    <a href={`/api/projects/${projectId}/attachments/${c.certificateAttachmentId}`} className="inline-flex min-h-touch items-center">
                      Calibration certificate
                    </a>
                  ) : (
                    <p className="font-semibold">
                      <span aria-hidden="true">⚠ </span>No certificate file on record.
                    </p>
                  )}
                  {s.history.length > 1 && <p className="text-label text-ink-faint">{s.history.length - 1} earlier calibration(s) kept.</p>}
                </>
              )}
            </li>
          );
        })}
      </ul>
      <CalibrationForm projectId={projectId} us={us} sets={sets.map((s) => ({ id: s.id, name: s.name }))} validityDays={project.calibrationValidityDays} />
      <EquipmentSetForm projectId={projectId} us={us} />
    </main>
  );
}
