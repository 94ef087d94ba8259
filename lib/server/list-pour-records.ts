import { stressingDay } from "@/lib/stressing/judge";
import {
  RECORD_COLUMNS,
  recordFromRow,
  storedGaugeOffTarget,
  type GaugeOffTarget,
  type WireBreak,
} from "@/lib/schemas/record";
import { qualified } from "@/lib/schemas/columns";
import "server-only";
import type { Kysely } from "kysely";
import { z } from "zod";
import type { Database } from "@/db/types";
import type { ReadingMethod, TendonEnd, Verdict } from "@/lib/schemas/domain";
import { forceFromPressure, pressureForForce } from "@/lib/elongation";
import { pickCalibration } from "@/lib/schemas/calibration";
import { equipmentNamedFromRow, type EquipmentNamed } from "@/lib/schemas/equipment";

/**
 * Every stressing of every tendon end of a pour, in the order it happened: the original and each
 * restress or lift-off, never only the latest. A stressing (a chain) shows its current revision with
 * the corrections that led to it. Each carries who stressed it, the equipment set with the
 * calibration in force that day and its certificate, the pressures, the readings exactly as typed,
 * the target pressure and the force on that calibration, both predictions, and the verdict of the
 * latest evaluation that used it. All in SI as stored; `lib/reports/record-rows.ts` formats it.
 */

export interface PourRecord {
  recordId: string;
  tendonId: string;
  tag: string;
  end: TendonEnd;
  /** 1 for the first stressing of the end, 2 for the next (a restress or a lift-off), … */
  stressing: number;
  restressOrdered: boolean;
  revision: number;
  corrections: { revision: number; reason: string }[];
  deviceTime: Date;
  deviceTimeZone: string;
  operator: string;
  equipment: EquipmentNamed;
  calibration: {
    calibratedOn: string;
    validUntil: string;
    laboratory: string | null;
    certificate: string | null;
    inForce: boolean;
  } | null;
  expiredCalibrationReason: string | null;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  targetPressureMPa: number | null;
  forceN: number | null;
  /**
   * The force the elongation implies and its difference from the gauge force, % of the gauge's, as
   * the evaluation that used the record judged them (absent on evaluations older than the check).
   */
  elongationForce: { forceN: number; differencePct: number | null } | null;
  method: ReadingMethod;
  entered: {
    marks: { before: string; after: string } | null;
    strokes: string[] | null;
    seating: string | null;
    initialPressure: string | null;
    finalPressure: string | null;
    /** The finer second reading as typed (marks: the mark after; strokes: each stroke). */
    reread: { marksAfter: string | null; strokes: string[] | null } | null;
  };
  measuredMm: number;
  /** The first reading when the elongation was read again finer (measuredMm is the re-read). */
  firstReadingMm: number | null;
  rereadDeclinedReason: string | null;
  seatingMm: number | null;
  /** Gauge steps as typed (text when the tablet kept it, else null) with their SI values. */
  gaugeSteps: { pressure: string | null; reading: string | null; pressureMPa: number; readingMm: number }[] | null;
  /** The steps' least-squares line as the evaluation used it: r² and what it put below the initial pressure. */
  stepFit: { r2: number; belowReferenceMm: number } | null;
  /** The crew's confirmation of a final pressure off its target by more than the band. */
  gaugeOffTarget: GaugeOffTarget | null;
  /** Ram travel over several strokes: the draw-in per re-grip the evaluation deducted, and whose it was. */
  drawIn: { usedMm: number; source: "record" | "equipment set"; deductedMm: number } | null;
  wireBreaks: number;
  /** Which strand and where, per broken wire; null on records made before it was asked. */
  wireBreakDetails: WireBreak[] | null;
  remarks: string | null;
  photos: number[];
  shopElongationMm: number | null;
  evaluation: {
    verdict: Verdict;
    provisional: boolean;
    deviationPct: number | null;
    predictedMm: number | null;
    measuredMm: number | null;
    basis: "gross" | "net";
    /** Whose predicted elongation the verdict was judged against. */
    governs: "tautline" | "shop drawing";
    at: Date;
    current: boolean;
  } | null;
}

const enteredSchema = z.object({
  marks: z.object({ before: z.string(), after: z.string() }).nullable().catch(null),
  strokes: z.array(z.string()).nullable().catch(null),
  seating: z.string().nullable().catch(null),
  initialPressure: z.string().nullable().catch(null),
  finalPressure: z.string().nullable().catch(null),
  reread: z
    .object({ marksAfter: z.string().nullable().catch(null), strokes: z.array(z.string()).nullable().catch(null) })
    .nullable()
    .catch(null),
});
const stepsSchema = z.object({
  gaugeSteps: z
    .array(
      z.object({
        pressure: z.string().optional(),
        reading: z.string().optional(),
        pressureMPa: z.number(),
        readingMm: z.number(),
      }),
    )
    .min(1),
});
const noEntered = {
  marks: null,
  strokes: null,
  seating: null,
  initialPressure: null,
  finalPressure: null,
  reread: null,
};

// Read defensively: evaluations written before a per-record basis or both predictions were stored
// fall back to the project's basis and to Tautline's prediction governing.
const inputsSchema = z.object({
  project: z
    .object({ comparisonBasis: z.enum(["gross", "net"]) })
    .partial()
    .catch({}),
  jackingForceN: z.number().nullable().catch(null),
  basis: z.enum(["gross", "net"]).optional().catch(undefined),
  governs: z.enum(["tautline", "shop drawing", "shop"]).optional().catch(undefined),
  calibrations: z
    .array(z.object({ recordId: z.string(), slope_n_per_mpa: z.number(), intercept_n: z.number() }).passthrough())
    .catch([]),
  readings: z
    .array(
      z
        .object({
          recordId: z.string(),
          drawInSource: z.enum(["record", "equipment set", "none"]).optional(),
          drawInUsedMm: z.number().nullable().optional(),
          drawInDeductedMm: z.number().optional(),
          impliedForceN: z.number().nullable().optional(),
          forceDifferencePct: z.number().nullable().optional(),
          stepFit: z.object({ r2: z.number(), belowReferenceMm: z.number() }).nullable().optional().catch(null),
        })
        .passthrough(),
    )
    .catch([]),
});

const day = (d: Date | string) => (typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10));

export async function listPourRecords(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; projectBasis: "gross" | "net"; timeZone: string },
): Promise<PourRecord[]> {
  const rows = await db
    .selectFrom("records")
    .innerJoin("tendons", "tendons.id", "records.tendon_id")
    .innerJoin("equipment_sets", "equipment_sets.id", "records.equipment_set_id")
    .innerJoin("users", "users.id", "records.author_user_id")
    .select([
      ...qualified("records", RECORD_COLUMNS),
      "users.name as author_name",
      "tendons.tag",
      "tendons.shop_elongation_mm",
      "equipment_sets.name",
      "equipment_sets.jack_serial",
      "equipment_sets.gauge_serial",
      "equipment_sets.pump_serial",
    ])
    .where("records.project_id", "=", input.projectId)
    .where("tendons.project_id", "=", input.projectId)
    .where("equipment_sets.project_id", "=", input.projectId)
    .where("records.pour_id", "=", input.pourId)
    .orderBy("tendons.tag")
    .orderBy("records.tendon_end")
    .orderBy("records.device_time")
    .orderBy("records.revision")
    .execute();
  if (!rows.length) return [];
  const records = rows.map((row) => ({
    ...recordFromRow(row),
    tag: row.tag,
    shopElongationMm: row.shop_elongation_mm,
    equipment: equipmentNamedFromRow(row),
  }));

  const recordIds = records.map((r) => r.id);
  const setIds = [...new Set(records.map((r) => r.equipmentSetId))];
  const tendonIds = [...new Set(records.map((r) => r.tendonId))];
  const [calibrations, photos, evaluations] = await Promise.all([
    db
      .selectFrom("calibrations")
      .leftJoin("attachments", (j) =>
        j
          .onRef("attachments.id", "=", "calibrations.certificate_attachment_id")
          .on("attachments.project_id", "=", input.projectId),
      )
      .select([
        "calibrations.id",
        "calibrations.equipment_set_id",
        "calibrations.calibrated_on",
        "calibrations.valid_until",
        "calibrations.laboratory",
        "attachments.original_name",
        "attachments.status as certificateStatus",
      ])
      .where("calibrations.project_id", "=", input.projectId)
      .where("calibrations.equipment_set_id", "in", setIds)
      .execute(),
    db
      .selectFrom("attachments")
      .select(["id", "record_id"])
      .where("project_id", "=", input.projectId)
      .where("purpose", "=", "record_photo")
      .where("status", "=", "stored")
      .where("record_id", "in", recordIds)
      .orderBy("created_at")
      .orderBy("id")
      .execute(),
    db
      .selectFrom("evaluations")
      .select([
        "id",
        "tendon_id",
        "record_ids",
        "verdict",
        "provisional",
        "deviation_pct",
        "predicted_mm",
        "measured_mm",
        "inputs",
        "created_at",
      ])
      .where("project_id", "=", input.projectId)
      .where("tendon_id", "in", tendonIds)
      .orderBy("created_at")
      .orderBy("id")
      .execute(),
  ]);

  // Photos are numbered through the pour in the order they were stored, as the report lists them.
  const photoNumbers = new Map<string, number[]>();
  photos.forEach((p, i) => {
    if (!p.record_id) return;
    photoNumbers.set(p.record_id, [...(photoNumbers.get(p.record_id) ?? []), i + 1]);
  });
  const latestEvaluationOf = new Map<string, (typeof evaluations)[number]>();
  const latestOfTendon = new Map<string, string>();
  for (const e of evaluations) {
    latestOfTendon.set(e.tendon_id, e.id);
    for (const id of e.record_ids) latestEvaluationOf.set(id, e);
  }

  // The current revision of each chain, with the corrections before it.
  const chains = new Map<string, typeof records>();
  for (const r of records) chains.set(r.chainId, [...(chains.get(r.chainId) ?? []), r]);
  const current = [...chains.values()].map((revisions) => {
    const sorted = [...revisions].sort((a, b) => a.revision - b.revision);
    return { row: sorted.at(-1)!, first: sorted[0]!, corrections: sorted.slice(1) };
  });
  current.sort(
    (a, b) =>
      a.row.tag.localeCompare(b.row.tag) ||
      a.row.tendonEnd.localeCompare(b.row.tendonEnd) ||
      new Date(a.first.deviceTime).getTime() - new Date(b.first.deviceTime).getTime(),
  );

  const stressingCount = new Map<string, number>();
  return current.map(({ row: r, corrections }) => {
    const endKey = `${r.tendonId}/${r.tendonEnd}`;
    const stressing = (stressingCount.get(endKey) ?? 0) + 1;
    stressingCount.set(endKey, stressing);
    // The stressing day in the project's time zone, the same day the judge used (stressingDay).
    const stressedOn = stressingDay(r.deviceTime, input.timeZone);
    const ofSet = calibrations
      .filter((c) => c.equipment_set_id === r.equipmentSetId)
      .map((c) => ({ ...c, calibratedOn: day(c.calibrated_on) }));
    const cal = r.calibrationId
      ? (ofSet.find((c) => c.id === r.calibrationId) ?? null)
      : pickCalibration(ofSet, stressedOn);
    const e = latestEvaluationOf.get(r.id);
    const inputs = e ? inputsSchema.safeParse(e.inputs) : null;
    const used = inputs?.success ? inputs.data : null;
    const line = used?.calibrations.find((c) => c.recordId === r.id);
    const calibrationLine = line ? { slope: line.slope_n_per_mpa, intercept: line.intercept_n } : null;
    const reading = used?.readings.find((x) => x.recordId === r.id);
    const drawIn =
      reading &&
      (reading.drawInSource === "record" || reading.drawInSource === "equipment set") &&
      typeof reading.drawInUsedMm === "number"
        ? { usedMm: reading.drawInUsedMm, source: reading.drawInSource, deductedMm: reading.drawInDeductedMm ?? 0 }
        : null;
    const entered = enteredSchema.safeParse(r.entered);
    return {
      recordId: r.id,
      tendonId: r.tendonId,
      tag: r.tag,
      end: r.tendonEnd,
      stressing,
      restressOrdered: r.restressOfDispositionId !== null,
      revision: r.revision,
      corrections: corrections.map((c) => ({ revision: c.revision, reason: c.revisionReason ?? "no reason given" })),
      deviceTime: new Date(r.deviceTime),
      deviceTimeZone: r.deviceTimeZone,
      operator: r.authorName,
      equipment: r.equipment,
      calibration: cal
        ? {
            calibratedOn: cal.calibratedOn,
            validUntil: day(cal.valid_until),
            laboratory: cal.laboratory,
            certificate: cal.certificateStatus === "stored" ? (cal.original_name ?? "certificate on file") : null,
            inForce: cal.calibratedOn <= stressedOn && stressedOn <= day(cal.valid_until),
          }
        : null,
      expiredCalibrationReason: r.expiredCalibrationReason,
      initialPressureMPa: r.initialPressureMPa,
      finalPressureMPa: r.finalPressureMPa,
      targetPressureMPa:
        calibrationLine && used?.jackingForceN ? pressureForForce(calibrationLine, used.jackingForceN) : null,
      forceN: calibrationLine ? forceFromPressure(calibrationLine, r.finalPressureMPa) : null,
      elongationForce:
        typeof reading?.impliedForceN === "number"
          ? { forceN: reading.impliedForceN, differencePct: reading.forceDifferencePct ?? null }
          : null,
      method: r.readingMethod,
      entered: entered.success ? entered.data : noEntered,
      measuredMm: r.measuredMm,
      firstReadingMm: r.firstReadingMm,
      rereadDeclinedReason: r.rereadDeclinedReason,
      seatingMm: r.seatingMm,
      gaugeSteps: (() => {
        const steps = stepsSchema.safeParse(r.entered);
        return steps.success
          ? steps.data.gaugeSteps.map((st) => ({
              pressure: st.pressure ?? null,
              reading: st.reading ?? null,
              pressureMPa: st.pressureMPa,
              readingMm: st.readingMm,
            }))
          : null;
      })(),
      stepFit: reading?.stepFit ? { r2: reading.stepFit.r2, belowReferenceMm: reading.stepFit.belowReferenceMm } : null,
      gaugeOffTarget: storedGaugeOffTarget(r.entered),
      drawIn,
      wireBreaks: r.wireBreaks,
      wireBreakDetails: r.wireBreakDetails,
      remarks: r.remarks,
      photos: photoNumbers.get(r.id) ?? [],
      shopElongationMm: r.shopElongationMm,
      evaluation: e
        ? {
            verdict: e.verdict,
            provisional: e.provisional,
            deviationPct: e.deviation_pct,
            predictedMm: e.predicted_mm,
            measuredMm: e.measured_mm,
            basis: used?.basis ?? used?.project.comparisonBasis ?? input.projectBasis,
            governs: used?.governs === "shop drawing" || used?.governs === "shop" ? "shop drawing" : "tautline",
            at: new Date(e.created_at),
            current: latestOfTendon.get(r.tendonId) === e.id,
          }
        : null,
    };
  });
}
