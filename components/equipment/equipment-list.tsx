"use client";

import { RefreshError, useRouteData } from "@/components/setup/use-route-data";
import { showComputedLength } from "@/lib/format/quantities";
import { CALIBRATION_STATE_LABELS } from "@/lib/schemas/calibration";
import type { EquipmentSetView } from "@/lib/server/list-equipment-sets";
import { CalibrationChart } from "./calibration-chart";
import { CorrectCalibration } from "./correct-calibration";
import { RetireCalibration } from "./retire-calibration";
import { MPA_PER_PSI, mpaToPsi, nToKip, nToKN } from "@/lib/units";

export interface EquipmentSetList {
  equipmentSets: EquipmentSetView[];
}

/** The route handler that lists the project's equipment sets; also the swr key both forms refresh. */
export const equipmentSetsKey = (projectId: string) => `/api/projects/${projectId}/equipment-sets`;

/** The sets as the server last gave them (first render) or as read again after a save. */
export function useEquipmentSets(projectId: string, initial: EquipmentSetList) {
  return useRouteData(equipmentSetsKey(projectId), initial);
}

/** Each set with its calibration state, fitted line, chart and certificate. */
export function EquipmentList({
  projectId,
  us,
  initial,
}: {
  projectId: string;
  us: boolean;
  initial: EquipmentSetList;
}) {
  const { data, error } = useEquipmentSets(projectId, initial);
  const sets = data.equipmentSets;
  const p = (mpa: number) => (us ? mpaToPsi(mpa) : mpa);
  const f = (n: number) => (us ? nToKip(n) : nToKN(n));
  const pu = us ? "psi" : "MPa";
  const fu = us ? "kip" : "kN";
  return (
    <>
      <RefreshError error={error} what="list of equipment sets" />
      {sets.length === 0 && <p className="card">No equipment sets yet. Add the first one below.</p>}
      <ul className="grid gap-4 lg:grid-cols-2">
        {sets.map((s) => {
          const c = s.current;
          const tone =
            s.state === "valid"
              ? "border-concrete-300"
              : s.state === "expiring"
                ? "border-signal-long"
                : "border-signal-stop";
          return (
            <li key={s.id} className={`card border-2 ${tone}`}>
              <h2 className="text-lead font-semibold">{s.name}</h2>
              <p>
                Jack {s.jackSerial} · gauge {s.gaugeSerial}
                {s.pumpSerial ? ` · pump ${s.pumpSerial}` : ""}
              </p>
              <p className="mt-1" data-testid="set-draw-in">
                {s.drawInMm !== null
                  ? `Draw-in per re-grip: ${showComputedLength({ unitSystem: us ? "us" : "si" }, s.drawInMm)}, used for ram travel typed without its own`
                  : "No draw-in per re-grip: ram travel over several strokes deducts only what the crew types"}
              </p>
              <p
                className={`mt-2 font-semibold ${s.state === "valid" ? "" : s.state === "expiring" ? "text-signal-long" : "text-signal-stop"}`}
              >
                <span aria-hidden="true">{s.state === "valid" ? "✓ " : s.state === "expiring" ? "⚠ " : "⚠ "}</span>
                {CALIBRATION_STATE_LABELS[s.state]}
                {c ? `: calibrated ${c.calibratedOn}, valid to ${c.validUntil}` : ""}
              </p>
              {c && (
                <>
                  <p className="mt-1">
                    Line: force = {f(c.slope * (us ? MPA_PER_PSI : 1)).toFixed(us ? 5 : 4)} {fu}/{pu} × pressure{" "}
                    {c.intercept >= 0 ? "+" : "−"} {Math.abs(f(c.intercept)).toFixed(2)} {fu} · r² = {c.r2.toFixed(5)} ·{" "}
                    {c.points.length} points, {p(c.minPressureMPa).toFixed(0)}–{p(c.maxPressureMPa).toFixed(0)} {pu}
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
                    <a
                      href={`/api/projects/${projectId}/attachments/${c.certificateAttachmentId}`}
                      className="inline-flex min-h-touch items-center"
                    >
                      Calibration certificate
                    </a>
                  ) : (
                    <p className="font-semibold">
                      <span aria-hidden="true">⚠ </span>No certificate file on record.
                    </p>
                  )}
                  {s.history.length > 1 && (
                    <p className="text-label text-ink-faint">{s.history.length - 1} earlier calibration(s) kept.</p>
                  )}
                  <CorrectCalibration key={c.id} projectId={projectId} setId={s.id} calibration={c} us={us} />
                  <RetireCalibration
                    projectId={projectId}
                    setId={s.id}
                    calibrationId={c.id}
                    calibratedOn={c.calibratedOn}
                  />
                </>
              )}
              {s.history
                .filter((h) => h.retiredAt)
                .map((h) => (
                  <p key={h.id} className="mt-1 text-label text-ink-soft" data-testid="retired-calibration">
                    Calibration of {h.calibratedOn} retired: {h.retiredReason}
                  </p>
                ))}
            </li>
          );
        })}
      </ul>
    </>
  );
}
