import { judgeTendon, predictTendon, stressedEnds, targetPressureMPa, type CalibrationLine, type EndReading } from "@/lib/stressing/basis";
import type { FieldCalibration, FieldEquipmentSet, FieldEvaluation, FieldFlag, FieldProject, FieldStrandLot, FieldTendon } from "@/lib/schemas/sync";
import { pickCalibration } from "@/lib/schemas/calibration";
import type { LocalRecord, LocalVerdict } from "./db";

/**
 * What the tablet shows about a tendon, computed from what it holds: its state in the list, the
 * current revision of each end, the target gauge pressure on a set's calibration, and the
 * provisional verdict, all through lib/stressing so the numbers match the server's.
 */

export type TendonState = "not stressed" | "one end done" | "done" | "flagged";

export const calibrationLine = (c: FieldCalibration): CalibrationLine => ({
  slope: c.slope,
  intercept: c.intercept,
  minPressureMPa: c.minPressureMPa,
  maxPressureMPa: c.maxPressureMPa,
});

/** The newest revision of each record chain of the tendon; per end, the chain stressed last. */
export function currentEnds(records: LocalRecord[]): Partial<Record<"A" | "B", LocalRecord>> {
  const heads = records.filter((r) => !r.supersededBy);
  const out: Partial<Record<"A" | "B", LocalRecord>> = {};
  for (const r of heads.sort((a, b) => a.deviceTime.localeCompare(b.deviceTime))) out[r.tendonEnd] = r;
  return out;
}

export function tendonState(tendon: FieldTendon, records: LocalRecord[], flags: FieldFlag[], latest: FieldEvaluation | undefined): TendonState {
  const ends = currentEnds(records);
  const wanted = stressedEnds(tendon.ends);
  const done = wanted.filter((e) => ends[e]).length;
  const localOut = Object.values(ends).some((r) => r?.local && r.local.verdict !== "in band");
  const serverOut = latest && latest.verdict !== "in band" && latest.verdict !== "incomplete";
  if (flags.some((f) => f.status !== "closed") || serverOut || localOut) return "flagged";
  if (done === 0) return "not stressed";
  return done < wanted.length ? "one end done" : "done";
}

/** Calibration in force for a set on a day, and whether it has expired by then. */
export function calibrationFor(calibrations: FieldCalibration[], setId: string, day: string): { calibration: FieldCalibration | null; expired: boolean } {
  const calibration = pickCalibration(calibrations.filter((c) => c.equipmentSetId === setId), day);
  return { calibration, expired: !calibration || calibration.validUntil < day };
}

export interface TendonContext {
  project: FieldProject;
  tendon: FieldTendon;
  lot: FieldStrandLot | null;
  set: FieldEquipmentSet | null;
  calibrations: FieldCalibration[];
}

const lotBasis = (lot: FieldStrandLot | null) => (lot ? { areaMm2: lot.areaMm2, modulusMPa: lot.modulusMPa, breakingLoadN: lot.breakingLoadN } : null);

/** The gauge pressure to pull to on the set's calibration, MPa; null without a calibration. */
export function targetFor(ctx: TendonContext, calibration: FieldCalibration | null): number | null {
  if (!calibration) return null;
  const predicted = predictTendon({ project: ctx.project, tendon: ctx.tendon, lot: lotBasis(ctx.lot), equipmentGripMm: ctx.set?.jackGripMm });
  return targetPressureMPa(calibrationLine(calibration), predicted.jackingForceN);
}

/** The provisional verdict over the current reading of each end, as saved on this tablet. */
export function provisionalVerdict(ctx: TendonContext, records: LocalRecord[]): LocalVerdict | null {
  const ends = currentEnds(records);
  const readings: EndReading[] = [];
  for (const r of Object.values(ends)) {
    if (!r) continue;
    const cal = ctx.calibrations.find((c) => c.id === r.calibrationId) ?? null;
    readings.push({ end: r.tendonEnd, measuredMm: r.measuredMm, initialPressureMPa: r.initialPressureMPa, finalPressureMPa: r.finalPressureMPa, calibration: cal ? calibrationLine(cal) : null });
  }
  if (!readings.length) return null;
  const project = ctx.project;
  const predicted = predictTendon({ project, tendon: ctx.tendon, lot: lotBasis(ctx.lot), equipmentGripMm: ctx.set?.jackGripMm });
  const judged = judgeTendon({ project, tendon: ctx.tendon, predicted, readings });
  return {
    verdict: judged.comparison.verdict,
    deviationPct: judged.comparison.deviationPct,
    measuredMm: judged.measuredMm,
    predictedMm: judged.comparison.lowerMm + judged.comparison.bandMm,
    lowerMm: judged.comparison.lowerMm,
    upperMm: judged.comparison.upperMm,
    provisional: judged.provisional,
    missingEnds: judged.missingEnds,
  };
}
