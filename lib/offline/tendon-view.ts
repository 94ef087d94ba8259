import { predictTendon, stressedEnds, targetPressureMPa, type CalibrationLine } from "@/lib/stressing/basis";
import { governsLine, specifiedForceSourceWords } from "@/lib/stressing/display";
import { judgeAndFlag } from "@/lib/stressing/rules";
import { forceAgreement } from "@/lib/stressing/rules/force-disagreement";
import { stressingDay, type JudgeInput, type JudgeRecord } from "@/lib/stressing/judge";
import type {
  FieldCalibration,
  FieldEquipmentSet,
  FieldEvaluation,
  FieldFlag,
  FieldProject,
  FieldStrandLot,
  FieldTendon,
} from "@/lib/schemas/sync";
import { pickCalibration } from "@/lib/schemas/pick-calibration";
import { storedGaugeOffTarget, storedGaugeSteps } from "@/lib/schemas/stored-entered";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import type { TendonEnd } from "@/lib/schemas/domain";
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
export function currentEnds(records: LocalRecord[]): Partial<Record<TendonEnd, LocalRecord>> {
  const heads = records.filter((r) => !r.supersededBy);
  const out: Partial<Record<TendonEnd, LocalRecord>> = {};
  for (const r of heads.sort((a, b) => a.deviceTime.localeCompare(b.deviceTime))) out[r.tendonEnd] = r;
  return out;
}

export function tendonState(
  tendon: FieldTendon,
  records: LocalRecord[],
  flags: FieldFlag[],
  latest: FieldEvaluation | undefined,
): TendonState {
  const ends = currentEnds(records);
  const wanted = stressedEnds(tendon.ends);
  const done = wanted.filter((e) => ends[e]).length;
  const localOut = Object.values(ends).some((r) => r?.local && r.local.verdict !== "in band");
  const serverOut = latest !== undefined && latest.verdict !== "in band" && latest.verdict !== "incomplete";
  if (flags.some((f) => f.status !== "closed")) return "flagged";
  // Once the server has judged every current record, its judgement governs: an out-of-band verdict
  // whose flags are all closed (the engineer accepted it) no longer holds the tendon, and the tablet's
  // own provisional check gives way. Before that, either verdict out of band holds it; so does the
  // server's when its flags have not arrived yet.
  const judged = latest !== undefined && Object.values(ends).every((r) => r?.syncState === "synced");
  if (judged ? serverOut && flags.length === 0 : serverOut || localOut) return "flagged";
  if (done === 0) return "not stressed";
  return done < wanted.length ? "one end done" : "done";
}

/** Calibration in force for a set on a day, and whether it has expired by then. */
export function calibrationFor(
  calibrations: FieldCalibration[],
  setId: string,
  day: string,
): { calibration: FieldCalibration | null; expired: boolean } {
  const calibration = pickCalibration(
    calibrations.filter((c) => c.equipmentSetId === setId),
    day,
  );
  return { calibration, expired: !calibration || calibration.validUntil < day };
}

export interface TendonContext {
  project: FieldProject;
  tendon: FieldTendon;
  lot: FieldStrandLot | null;
  set: FieldEquipmentSet | null;
  calibrations: FieldCalibration[];
}

const lotBasis = (lot: FieldStrandLot | null) =>
  lot ? { areaMm2: lot.areaMm2, modulusMPa: lot.modulusMPa, breakingLoadN: lot.breakingLoadN } : null;

/** The gauge pressure to pull to on the set's calibration, MPa; null without a calibration. */
export function targetFor(ctx: TendonContext, calibration: FieldCalibration | null): number | null {
  if (!calibration) return null;
  const predicted = predictTendon({
    project: ctx.project,
    tendon: ctx.tendon,
    lot: lotBasis(ctx.lot),
    equipmentGripMm: ctx.set?.jackGripMm,
  });
  return targetPressureMPa(calibrationLine(calibration), predicted.jackingForceN);
}

/** The stressing day now (or at an instant), in the project's time zone: the same day the server uses. */
export function fieldDay(project: FieldProject, at: Date | string = new Date()): string {
  return stressingDay(at, project.timeZone);
}

/** When a record was stressed, as the tablet shows it: on the site's clock (the project's zone), not the tablet's. */
export function fieldTime(project: Pick<FieldProject, "timeZone">, at: Date | string): string {
  return formatDateTime(at, projectTimeZone(project));
}

const strokeCount = (r: LocalRecord): number =>
  r.readingMethod === "strokes" && Array.isArray(r.entered?.strokes) ? Math.max(1, r.entered.strokes.length) : 1;

/** The judge's facts from what the tablet holds: the same shape the server builds from its query. */
export function judgeInputFor(ctx: TendonContext & { sets?: FieldEquipmentSet[] }, records: LocalRecord[]): JudgeInput {
  const known = [...(ctx.sets ?? []), ...(ctx.set ? [ctx.set] : [])];
  const setIds = [...new Set(records.map((r) => r.equipmentSetId))];
  const sets = setIds.map((id) => {
    const s = known.find((k) => k.id === id);
    return {
      id,
      name: s?.name ?? "Equipment set",
      jackGripMm: s?.jackGripMm ?? null,
      maxForceN: s?.maxForceN ?? null,
      drawInMm: s?.drawInMm ?? null,
      calibrations: ctx.calibrations
        .filter((c) => c.equipmentSetId === id)
        .map((c) => ({
          id: c.id,
          calibratedOn: c.calibratedOn,
          validUntil: c.validUntil,
          slope: c.slope,
          intercept: c.intercept,
          minPressureMPa: c.minPressureMPa,
          maxPressureMPa: c.maxPressureMPa,
          retiredAt: c.retiredAt ?? null,
          replacedBy: c.replacedBy ?? null,
        })),
    };
  });
  const judged: JudgeRecord[] = records.map((r) => ({
    id: r.id,
    chainId: r.chainId,
    revision: r.revision,
    end: r.tendonEnd,
    deviceTime: r.deviceTime,
    equipmentSetId: r.equipmentSetId,
    calibrationId: r.calibrationId,
    expiredCalibrationReason: r.expiredCalibrationReason,
    readingMethod: r.readingMethod,
    initialPressureMPa: r.initialPressureMPa,
    finalPressureMPa: r.finalPressureMPa,
    measuredMm: r.measuredMm,
    strokeCount: strokeCount(r),
    drawInMm: r.drawInMm ?? null,
    seatingMm: r.seatingMm,
    stressingOrder: r.stressingOrder ?? null,
    wireBreaks: r.wireBreaks,
    firstReadingMm: r.firstReadingMm ?? null,
    rereadDeclinedReason: r.rereadDeclinedReason ?? null,
    wireBreakDetails: r.wireBreakDetails ?? null,
    gaugeSteps: storedGaugeSteps(r.entered),
    gaugeOffTarget: storedGaugeOffTarget(r.entered),
  }));
  return {
    project: { ...ctx.project, readingResolution: ctx.project.readingResolution },
    tendon: ctx.tendon,
    lot: lotBasis(ctx.lot),
    sets,
    records: judged,
  };
}

/** The provisional verdict over the current reading of each end, as saved on this tablet: the server's judge. */
export function provisionalVerdict(
  ctx: TendonContext & { sets?: FieldEquipmentSet[] },
  records: LocalRecord[],
): LocalVerdict | null {
  if (!records.length) return null;
  const input = judgeInputFor(ctx, records);
  const { judgement: j, findings } = judgeAndFlag(input);
  if (!j.ends.length) return null;
  const c = j.comparison;
  return {
    verdict: j.verdict,
    deviationPct: c?.deviationPct ?? null,
    measuredMm: j.measuredMm,
    predictedMm: j.predictedMm,
    lowerMm: c?.lowerMm ?? null,
    upperMm: c?.upperMm ?? null,
    provisional: j.provisional,
    missingEnds: j.missingEnds,
    basisLabel: j.basisLabel,
    incomplete: j.incomplete,
    flagKinds: findings.map((f) => f.kind),
    forces: j.ends.map((e) => ({
      end: e.end,
      gaugeForceN: e.gaugeForceN,
      impliedForceN: e.impliedForceN,
      role: e.role,
      differencePct: forceAgreement(e, input.project, j.specifiedForceN)?.differencePct ?? null,
      bandPct: forceAgreement(e, input.project, j.specifiedForceN)?.bandPct ?? null,
    })),
    specifiedForceN: j.specifiedForceN,
    specifiedForceFrom: specifiedForceSourceWords(j.specifiedForceSource, j.specifiedForceFactor),
    reread: j.rereadWanted,
    governsLine: governsLine(
      {
        unitSystem: ctx.project.unitSystem,
        readingResolution: ctx.project.readingResolution,
      },
      j,
    ),
  };
}
