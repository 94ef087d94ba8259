import "server-only";
import type { Kysely } from "kysely";
import { z } from "zod";
import type { Database, TendonSegment } from "@/db/types";
import type { StressingEnds, TendonEnd, Verdict } from "@/lib/schemas/domain";
import { forceFromPressure } from "@/lib/elongation";
import { endTotalMm } from "@/lib/stressing/basis";
import { qualified } from "@/lib/schemas/columns";
import { RECORD_COLUMNS, recordFromRow } from "@/lib/schemas/record";

/**
 * Each tendon of a pour (or of the whole project) with its latest evaluation and the records that
 * evaluation used, the force each end reached on the calibration the evaluation used, and any
 * gauge steps the crew read. The report, the CSV and the insight page all read this one list.
 */

export interface EndResult {
  recordId: string;
  end: TendonEnd;
  revision: number;
  equipmentSetId: string;
  equipmentSetName: string;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  /** Force at the final pressure on the calibration the evaluation used; null without one. */
  forceN: number | null;
  measuredMm: number;
  /** The end's elongation brought to full force (readings from an initial pressure extrapolated). */
  totalMm: number;
  deviceTime: Date;
  author: string;
  wireBreaks: number;
  remarks: string | null;
  calibration: { slope: number; intercept: number } | null;
  gaugeSteps: { pressureMPa: number; readingMm: number }[];
}

export interface TendonResult {
  tendonId: string;
  pourId: string;
  pourName: string;
  tag: string;
  strandSize: string;
  strandCount: number;
  ends: StressingEnds;
  lengthMm: number;
  /** Length of each stressed end's friction path: to the meeting point when both ends are stressed. */
  pathMm: { A?: number; B?: number };
  lotNumber: string | null;
  /** The schedule's own specified jacking force, N; null: the project's factor of fpu·A. */
  jackingForceN: number | null;
  /** Area and modulus the evaluation used, and where they came from. */
  strand: { areaMm2: number; modulusMPa: number; source: string } | null;
  evaluation: {
    id: string;
    verdict: Verdict;
    provisional: boolean;
    deviationPct: number | null;
    predictedMm: number | null;
    measuredMm: number | null;
    createdAt: Date;
    engineVersion: string;
  } | null;
  endResults: EndResult[];
}

const resultSchema = z.object({
  prediction: z.object({ meetingPointMm: z.number().nullable() }).catch({ meetingPointMm: null }),
});
const calibrationUsed = z.object({ recordId: z.string(), slope_n_per_mpa: z.number(), intercept_n: z.number() });
const judgedEnd = z.object({ recordId: z.string(), basis: z.string(), totalMm: z.number().nullable() });
const inputsSchema = z.object({
  readings: z.array(judgedEnd.passthrough()).catch([]),
  calibrations: z.array(calibrationUsed).catch([]),
  strand: z.object({ areaMm2: z.number(), modulusMPa: z.number(), source: z.string() }).nullable().catch(null),
  lot: z.object({ lotNumber: z.string() }).nullable().catch(null),
});
const gaugeStepsSchema = z.object({
  gaugeSteps: z.array(z.object({ pressureMPa: z.number().positive(), readingMm: z.number() })).catch([]),
});

export async function listTendonResults(
  db: Kysely<Database>,
  input: { projectId: string; pourId?: string },
): Promise<TendonResult[]> {
  let tendonQuery = db
    .selectFrom("tendons")
    .innerJoin("pours", "pours.id", "tendons.pour_id")
    .leftJoin("strand_lots", "strand_lots.id", "tendons.strand_lot_id")
    .select([
      "tendons.id",
      "tendons.pour_id",
      "pours.name as pourName",
      "tendons.tag",
      "tendons.strand_size",
      "tendons.strand_count",
      "tendons.ends",
      "tendons.segments",
      "tendons.jacking_force_n",
      "strand_lots.lot_number",
    ])
    .where("tendons.project_id", "=", input.projectId)
    .where("pours.project_id", "=", input.projectId);
  if (input.pourId) tendonQuery = tendonQuery.where("tendons.pour_id", "=", input.pourId);
  const tendons = await tendonQuery.orderBy("pours.name").orderBy("tendons.tag").execute();
  if (!tendons.length) return [];

  let evaluationQuery = db
    .selectFrom("evaluations")
    .innerJoin("tendons", "tendons.id", "evaluations.tendon_id")
    .distinctOn("evaluations.tendon_id")
    .select([
      "evaluations.id",
      "evaluations.tendon_id",
      "evaluations.record_ids",
      "evaluations.verdict",
      "evaluations.provisional",
      "evaluations.deviation_pct",
      "evaluations.predicted_mm",
      "evaluations.measured_mm",
      "evaluations.created_at",
      "evaluations.engine_version",
      "evaluations.inputs",
      "evaluations.result",
    ])
    .where("evaluations.project_id", "=", input.projectId)
    .where("tendons.project_id", "=", input.projectId);
  if (input.pourId) evaluationQuery = evaluationQuery.where("tendons.pour_id", "=", input.pourId);
  const evaluations = await evaluationQuery
    .orderBy("evaluations.tendon_id")
    .orderBy("evaluations.created_at", "desc")
    .orderBy("evaluations.id", "desc")
    .execute();

  const recordIds = evaluations.flatMap((e) => e.record_ids);
  const records = recordIds.length
    ? await db
        .selectFrom("records")
        .innerJoin("equipment_sets", "equipment_sets.id", "records.equipment_set_id")
        .innerJoin("users", "users.id", "records.author_user_id")
        .select([
          ...qualified("records", RECORD_COLUMNS),
          "users.name as author_name",
          "equipment_sets.name as setName",
        ])
        .where("records.project_id", "=", input.projectId)
        .where("equipment_sets.project_id", "=", input.projectId)
        .where("records.id", "in", recordIds)
        .execute()
    : [];
  const recordById = new Map(records.map((row) => [row.id, { ...recordFromRow(row), setName: row.setName }]));

  const evaluationByTendon = new Map(evaluations.map((e) => [e.tendon_id, e]));
  return tendons.map((t) => {
    const e = evaluationByTendon.get(t.id);
    const inputs = e ? inputsSchema.safeParse(e.inputs) : null;
    const used = inputs?.success ? inputs.data : { calibrations: [], strand: null, lot: null, readings: [] };
    const endResults: EndResult[] = (e?.record_ids ?? [])
      .map((id) => recordById.get(id))
      .filter((r): r is NonNullable<typeof r> => Boolean(r))
      .sort((a, b) => a.tendonEnd.localeCompare(b.tendonEnd))
      .map((r) => {
        const c = used.calibrations.find((x) => x.recordId === r.id);
        const line = c ? { slope: c.slope_n_per_mpa, intercept: c.intercept_n } : null;
        const steps = gaugeStepsSchema.safeParse(r.entered);
        return {
          recordId: r.id,
          end: r.tendonEnd,
          revision: r.revision,
          equipmentSetId: r.equipmentSetId,
          equipmentSetName: r.setName,
          initialPressureMPa: r.initialPressureMPa,
          finalPressureMPa: r.finalPressureMPa,
          forceN: line ? forceFromPressure(line, r.finalPressureMPa) : null,
          measuredMm: r.measuredMm,
          // The evaluation's own total on the end's basis; older evaluations are recomputed as before.
          totalMm:
            used.readings.find((x) => x.recordId === r.id)?.totalMm ??
            endTotalMm({
              end: r.tendonEnd,
              measuredMm: r.measuredMm,
              initialPressureMPa: r.initialPressureMPa,
              finalPressureMPa: r.finalPressureMPa,
              calibration: line ? { ...line, minPressureMPa: 0, maxPressureMPa: Infinity } : null,
            }),
          deviceTime: new Date(r.deviceTime),
          author: r.authorName,
          wireBreaks: r.wireBreaks,
          remarks: r.remarks,
          calibration: line,
          gaugeSteps: steps.success ? steps.data.gaugeSteps : [],
        };
      });
    const segments = t.segments as TendonSegment[];
    const lengthMm = segments.reduce((sum, s) => sum + s.lengthMm, 0);
    const stored = e ? resultSchema.safeParse(e.result) : null;
    const meeting = stored?.success ? stored.data.prediction.meetingPointMm : null;
    const pathMm =
      t.ends === "both"
        ? meeting === null
          ? { A: lengthMm / 2, B: lengthMm / 2 }
          : { A: meeting, B: lengthMm - meeting }
        : { [t.ends]: lengthMm };
    return {
      tendonId: t.id,
      pourId: t.pour_id,
      pourName: t.pourName,
      tag: t.tag,
      strandSize: t.strand_size,
      strandCount: t.strand_count,
      ends: t.ends,
      lengthMm,
      pathMm,
      lotNumber: t.lot_number,
      jackingForceN: t.jacking_force_n,
      strand: used.strand
        ? {
            ...used.strand,
            source:
              used.strand.source === "strand lot" && used.lot ? `strand lot ${used.lot.lotNumber}` : used.strand.source,
          }
        : null,
      evaluation: e
        ? {
            id: e.id,
            verdict: e.verdict,
            provisional: e.provisional,
            deviationPct: e.deviation_pct,
            predictedMm: e.predicted_mm,
            measuredMm: e.measured_mm,
            createdAt: new Date(e.created_at),
            engineVersion: e.engine_version,
          }
        : null,
      endResults,
    };
  });
}
