import "server-only";
import type { Kysely } from "kysely";
import { z } from "zod";
import type { Database } from "@/db/types";
import { forceProfile, segmentBeta, type ForceProfile } from "@/lib/elongation";
import { predictTendon, type TendonPrediction } from "@/lib/stressing/basis";
import { clockSkew, type ClockSkew } from "@/lib/stressing/clock-skew";
import { qualified } from "@/lib/schemas/columns";
import { RECORD_COLUMNS, recordFromRow, type StressingRecord } from "@/lib/schemas/record";
import { awaitingRestress } from "@/lib/stressing/tail-clearance";
import { findFlagTrail } from "./find-flag-trail";
import { findStandingRelease } from "./find-standing-release";
import { listDetensions } from "./list-detensions";
import { listLiftoffChecks } from "./list-liftoff-checks";
import { loadTendonBasis, type LoadedTendon } from "./load-tendon-basis";

/** A record as the review page lists it: the DTO with its set and the clock skew of a tablet's own record. */
export interface CaseRecord extends StressingRecord {
  equipmentSet: string;
  equipmentGripMm: number | null;
  /** Against the project's threshold; null within it, and on paperwork corrections. */
  skew: ClockSkew | null;
}

/**
 * Everything the review and decision page shows for one tendon: the basis and its sources, the
 * prediction with the force profile, every record (all revisions) with photos, the latest
 * evaluation, the flags with their review trail and dispositions, the lift-off checks the
 * dispositions ordered, and the pour's release.
 */
export async function getTendonCase(db: Kysely<Database>, input: { projectId: string; tendonId: string }) {
  const basis: LoadedTendon = await loadTendonBasis(db, input);

  const [rows, evaluation, { flags, reviews, dispositions }, photos, release] = await Promise.all([
    db
      .selectFrom("records")
      .innerJoin("users", "users.id", "records.author_user_id")
      .innerJoin("equipment_sets", "equipment_sets.id", "records.equipment_set_id")
      .innerJoin("projects", "projects.id", "records.project_id")
      .select([
        ...qualified("records", RECORD_COLUMNS),
        "users.name as author_name",
        "projects.clock_skew_minutes",
        "equipment_sets.name as equipmentSet",
        "equipment_sets.jack_grip_mm as equipmentGripMm",
      ])
      .where("records.project_id", "=", input.projectId)
      .where("records.tendon_id", "=", input.tendonId)
      .orderBy("records.device_time")
      .orderBy("records.revision")
      .execute(),
    db
      .selectFrom("evaluations")
      .selectAll()
      .where("project_id", "=", input.projectId)
      .where("tendon_id", "=", input.tendonId)
      .orderBy("created_at", "desc")
      .limit(1)
      .executeTakeFirst(),
    findFlagTrail(db, input),
    db
      .selectFrom("attachments")
      .innerJoin("records", "records.id", "attachments.record_id")
      .select(["attachments.id", "attachments.record_id", "attachments.original_name"])
      .where("attachments.project_id", "=", input.projectId)
      .where("records.tendon_id", "=", input.tendonId)
      .where("attachments.status", "=", "stored")
      .where("attachments.purpose", "=", "record_photo")
      .execute(),
    findStandingRelease(db, { projectId: input.projectId, pourId: basis.pour.id }),
  ]);

  // Each record with its clock skew against the project's threshold (null when within it). Only
  // the tablet's own records: a paperwork correction keeps the original's device time and is
  // received when the office writes it (as findClockSkews).
  const records = rows.map((row): CaseRecord => {
    const r = recordFromRow(row);
    return {
      ...r,
      equipmentSet: row.equipmentSet,
      equipmentGripMm: row.equipmentGripMm,
      skew: r.revision === 1 ? clockSkew(r.deviceTime, r.receivedAt, row.clock_skew_minutes) : null,
    };
  });
  const equipmentGripMm = records.find((r) => r.equipmentGripMm !== null)?.equipmentGripMm ?? null;
  let predicted: TendonPrediction | null = null;
  let profile: ForceProfile | null = null;
  let computationError: string | null = null;
  try {
    predicted = predictTendon({ project: basis.project, tendon: basis.tendon, lot: basis.lot, equipmentGripMm });
    profile = forceProfile(predicted.engineInput, { samplesPerSegment: 6 });
  } catch (error) {
    computationError = error instanceof Error ? error.message : String(error);
  }

  // Segment by segment, from end A: β = K·L + μ·α, and the running sums.
  let x = 0;
  let alpha = 0;
  const segments = basis.tendon.segments.map((s, i) => {
    const beta = segmentBeta(s.lengthMm, s.angleRad, basis.project.wobblePerM, basis.project.frictionMu);
    x += s.lengthMm;
    alpha += s.angleRad;
    return { index: i + 1, lengthMm: s.lengthMm, angleRad: s.angleRad, beta, endMm: x, cumulativeAngleRad: alpha };
  });

  const [liftoffChecks, detensions] = await Promise.all([listLiftoffChecks(db, input), listDetensions(db, input)]);
  // The ends stressed again since the latest detension: until every stressed end has one, the tendon is held.
  const awaiting = awaitingRestress({
    ends: basis.tendon.ends,
    detensionedAt: detensions.map((d) => d.detensionedAt),
    records: records.map((r) => ({ tendonEnd: r.tendonEnd, stressedAt: r.deviceTime })),
  });

  return {
    basis,
    predicted,
    profile,
    computationError,
    segments,
    records,
    evaluation: evaluation ?? null,
    figures: evaluation ? evaluationFigures(evaluation) : null,
    flags,
    reviews,
    dispositions,
    liftoffChecks,
    detensions,
    awaitingRestress: awaiting,
    photos,
    release: release ?? null,
  };
}

export type TendonCase = Awaited<ReturnType<typeof getTendonCase>>;

// Read defensively: evaluations of every engine version are kept. Since the per-record judge the
// comparison sits in `result.comparison` and the ends in `inputs.readings`; before it, in
// `result.judgement`. The force figures of an end are absent on evaluations older than them.
const comparisonSchema = z.object({
  deviationPct: z.number(),
  lowerMm: z.number(),
  upperMm: z.number(),
});
const resultSchema = z.object({
  comparison: comparisonSchema.nullable().catch(null),
  judgement: z.object({ measuredMm: z.number(), comparison: comparisonSchema }).nullable().catch(null),
});
const endSchema = z.object({
  end: z.enum(["A", "B"]),
  role: z.string().catch(""),
  gaugeForceN: z.number().nullable().catch(null),
  impliedForceN: z.number().nullable().catch(null),
  forceDifferencePct: z.number().nullable().catch(null),
  forceBandPct: z.number().nullable().catch(null),
  /** The gauge steps' line as judged; absent on records without steps and on older evaluations. */
  stepFit: z
    .object({
      steps: z.array(z.object({ pressureMPa: z.number(), readingMm: z.number(), forceN: z.number() })),
      r2: z.number(),
      belowReferenceMm: z.number(),
    })
    .nullable()
    .catch(null),
  initialPressureMPa: z.number().nullable().catch(null),
  finalPressureMPa: z.number().nullable().catch(null),
  targetPressureMPa: z.number().nullable().catch(null),
  offTargetPct: z.number().nullable().catch(null),
  /** The crew's confirmation of a final pressure off its target by more than the band. */
  gaugeOffTarget: z.object({ pct: z.number(), reason: z.string() }).nullable().catch(null),
});
const inputsSchema = z.object({
  jackingForceN: z.number().nullable().catch(null),
  /** Absent on evaluations stored before the schedule could give the force: the project's factor. */
  jackingForceSource: z.enum(["schedule", "project"]).nullable().catch(null),
  jackingForceFactor: z.number().nullable().catch(null),
  readings: z.array(z.unknown()).catch([]),
});

export interface EvaluationFigures {
  measuredMm: number;
  deviationPct: number;
  lowerMm: number;
  upperMm: number;
  specifiedForceN: number | null;
  /** Where the specified force came from: the schedule, or the project's factor (null: stored before it was said). */
  specifiedForceSource: "schedule" | "project" | null;
  specifiedForceFactor: number | null;
  /** Per end read: the gauge force and the force the elongation implies, with their difference. */
  ends: z.infer<typeof endSchema>[];
}

/** The few numbers of the latest evaluation the decision and the sheet show; null when it has none. */
export function evaluationFigures(e: { result: unknown; inputs: unknown; measured_mm: number | null }) {
  const result = resultSchema.safeParse(e.result);
  const inputs = inputsSchema.safeParse(e.inputs);
  const comparison = result.success ? (result.data.comparison ?? result.data.judgement?.comparison ?? null) : null;
  const measuredMm = e.measured_mm ?? (result.success ? (result.data.judgement?.measuredMm ?? null) : null);
  if (!comparison || measuredMm === null) return null;
  const readings = inputs.success ? inputs.data.readings : [];
  return {
    measuredMm,
    deviationPct: comparison.deviationPct,
    lowerMm: comparison.lowerMm,
    upperMm: comparison.upperMm,
    specifiedForceN: inputs.success ? inputs.data.jackingForceN : null,
    specifiedForceSource: inputs.success ? inputs.data.jackingForceSource : null,
    specifiedForceFactor: inputs.success ? inputs.data.jackingForceFactor : null,
    ends: readings.flatMap((r) => {
      const end = endSchema.safeParse(r);
      return end.success ? [end.data] : [];
    }),
  } satisfies EvaluationFigures;
}
