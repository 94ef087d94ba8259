import "server-only";
import { randomUUID } from "node:crypto";
import {
  expressionBuilder,
  sql,
  type Compilable,
  type Insertable,
  type Kysely,
  type QueryCreator,
  type RawBuilder,
} from "kysely";
import { jsonArrayFrom } from "kysely/helpers/postgres";
import type { Database, EvaluationsTable, FlagsTable, NotificationsTable } from "@/db/types";
import type { Decision, FlagKind, ReadingMethod, StressingOrder, TendonEnd, Verdict } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { ENGINE_VERSION, findStrandSize } from "@/lib/elongation";
import { env } from "@/lib/env";
import { flagReferenceToken } from "@/lib/format/references";
import { flagMail } from "@/lib/mail/templates";
import type { JudgeInput, JudgeRecord } from "@/lib/stressing/judge";
import { flagRecipientsNow } from "@/lib/stressing/flag-mail";
import { judgeAndFlag } from "@/lib/stressing/rules";
import { forceAgreement, forceAgreementWords } from "@/lib/stressing/rules/force-disagreement";
import { WIRES_PER_STRAND } from "@/lib/stressing/rules/member-wire-loss";
import { answeredOrder } from "@/lib/stressing/rules/stressed-twice";
import { showLength, showPct, showWobble } from "@/lib/format/quantities";
import { governsLine } from "@/lib/stressing/display";
import { RECORD_COLUMNS, storedGaugeOffTarget, storedGaugeSteps, storedWireBreaks } from "@/lib/schemas/record";
import { CALIBRATION_COLUMNS, calibrationFromRow, type CalibrationRow } from "@/lib/schemas/calibration";
import { selectTendonBasis, toLoadedTendon, type LoadedTendon } from "./load-tendon-basis";

/**
 * The server's authoritative evaluation of one tendon, written together with the record that
 * caused it (in the sync push's own statement, or in the transaction of a correction or the
 * seed). It reads the latest revision of each end's current stressing, computes on the
 * project's basis, stores the evaluation with every input used, raises flags by rule and queues
 * one e-mail for the new flags: a replayed sync stores nothing new and so sends nothing twice.
 *
 * It is three steps so that the sync push can fold them into its own statements: one query
 * reads the tendon's state (`selectTendonState`), a pure function decides (`planEvaluation`),
 * and one statement writes the evaluation, its flags, the e-mail and any closures
 * (`evaluationWrites`, sent by `writeTogether`). Every write that stores a record and evaluates
 * raises the tendon's version (`tendon_versions`): here first, which holds the row until the
 * transaction ends; in the push optimistically, only from the version it read. Two ends stored
 * at the same moment are so never judged each without the other.
 */

export interface EvaluationOutcome {
  evaluationId: string;
  verdict: Verdict;
  provisional: boolean;
  deviationPct: number | null;
  flagKinds: FlagKind[];
}

export interface EvaluatedRecord {
  id: string;
  chain_id: string;
  revision: number;
  tendon_end: TendonEnd;
  device_time: Date;
  received_at: Date;
  restress_of_disposition_id: string | null;
  equipment_set_id: string;
  calibration_id: string | null;
  expired_calibration_reason: string | null;
  /** The crew's reason to stress before the concrete was confirmed; absent where the record has none to give. */
  concrete_go_ahead?: string | null;
  initial_pressure_mpa: number | null;
  final_pressure_mpa: number;
  measured_mm: number;
  reading_method: ReadingMethod;
  /** The values as typed; the judge counts the strokes from it. */
  entered: unknown;
  seating_mm: number | null;
  draw_in_mm: number | null;
  stressing_order: StressingOrder | null;
  wire_breaks: number;
  /** The first reading when the elongation was read again finer; absent before it was asked. */
  first_reading_mm?: number | null;
  reread_declined_reason?: string | null;
  wire_break_details?: unknown;
}

/** A record as it comes out of a JSON aggregate: its instants as text. */
type RecordJson = Omit<EvaluatedRecord, "device_time" | "received_at"> & {
  device_time: string | Date;
  received_at: string | Date;
};

/** What one evaluation reads about a tendon. */
export interface TendonState {
  basis: LoadedTendon;
  /** Every revision of every record of the tendon, by device time then revision. */
  records: EvaluatedRecord[];
  openFlagKinds: FlagKind[];
  /** Whether the tendon's pour already has an open concrete flag (on any tendon): one per pour. */
  pourConcreteFlagOpen?: boolean;
  /** The project's equipment sets used on the tendon, one row per calibration (or one with none). */
  sets: StateRow["sets"];
  dispositions: { id: string; flag_id: string; decision: Decision; created_at: Date }[];
  /** The tendon's version as read with the rest (0 before its first record). */
  version: number;
  /** The other tendons of the tendon's member, or of its pour when it names none (read when the project sets a group band). */
  group?: { id: string; tag: string; deviation_pct: number | null; last_stressed_at: string | Date | null }[];
  /** The member's strands by size and lot area (this tendon's included), for the wire-break ledger; empty when no record of the tendon reports a broken wire. */
  memberSteel?: { strand_size: string; lot_area_mm2: number | null; strands: number | string }[];
  /** Wires broken and not replaced on the member's other tendons, per tendon end. */
  memberBreaks?: { tag: string; strand_size: string; lot_area_mm2: number | null; tendon_end: string; wires: number }[];
}

/**
 * One query for the whole state of a tendon: its basis, records, open flags, the equipment sets
 * its records name (and `alsoSetId`, for a record about to be stored) with their calibrations,
 * its dispositions and its version.
 *
 * The member's wire-break ledger sums every tendon of the member (a whole pour when the schedule
 * names no member), so it is read only when it can matter: when a record of the tendon reports a
 * broken wire, stored or about to be (`addingWireBreaks`, that record's count). The ledger's rule
 * raises nothing for a tendon with no broken wire of its own, whatever the ledger says.
 */
export function selectTendonState(
  qc: QueryCreator<Database>,
  input: { projectId: string; tendonId: string; alsoSetId?: string; addingWireBreaks?: string },
) {
  const { projectId, tendonId } = input;
  const w = expressionBuilder<Database, never>();
  const ledgerWanted = w.or([
    w.exists(
      w
        .selectFrom("records as lb")
        .select("lb.id")
        .where("lb.project_id", "=", projectId)
        .where("lb.tendon_id", "=", tendonId)
        .where("lb.wire_breaks", ">", 0),
    ),
    ...(input.addingWireBreaks === undefined ? [] : [sql<boolean>`${input.addingWireBreaks}::int > 0`]),
  ]);
  return selectTendonBasis(qc, input).select((eb) => [
    jsonArrayFrom(
      eb
        .selectFrom("records")
        // The record DTO's columns; the judge takes its part of them (`judgeInputFromState`).
        .select(RECORD_COLUMNS)
        .where("records.project_id", "=", projectId)
        .where("records.tendon_id", "=", tendonId),
    ).as("records"),
    jsonArrayFrom(
      eb
        .selectFrom("flags")
        .select("flags.kind")
        .where("flags.project_id", "=", projectId)
        .where("flags.tendon_id", "=", tendonId)
        .where("flags.status", "!=", "closed"),
    ).as("openFlags"),
    eb
      .exists(
        eb
          .selectFrom("flags")
          .select("flags.id")
          .where("flags.project_id", "=", projectId)
          .whereRef("flags.pour_id", "=", "tendons.pour_id")
          .where("flags.kind", "=", "concrete_unconfirmed")
          .where("flags.status", "!=", "closed"),
      )
      .as("pourConcreteFlagOpen"),
    jsonArrayFrom(
      eb
        .selectFrom("equipment_sets")
        .leftJoin("calibrations", (j) =>
          j
            .onRef("calibrations.equipment_set_id", "=", "equipment_sets.id")
            .onRef("calibrations.project_id", "=", "equipment_sets.project_id"),
        )
        .select([
          "equipment_sets.id as setId",
          "equipment_sets.name",
          "equipment_sets.jack_grip_mm",
          "equipment_sets.max_force_n",
          "equipment_sets.draw_in_mm",
          ...CALIBRATION_COLUMNS.map((c) => `calibrations.${c}` as const),
        ])
        .where("equipment_sets.project_id", "=", projectId)
        .where((w) =>
          w.or([
            w(
              "equipment_sets.id",
              "in",
              w
                .selectFrom("records")
                .select("records.equipment_set_id")
                .where("records.project_id", "=", projectId)
                .where("records.tendon_id", "=", tendonId),
            ),
            ...(input.alsoSetId ? [w("equipment_sets.id", "=", input.alsoSetId)] : []),
          ]),
        ),
    ).as("sets"),
    jsonArrayFrom(
      eb
        .selectFrom("dispositions")
        .select(["dispositions.id", "dispositions.flag_id", "dispositions.decision", "dispositions.created_at"])
        .where("dispositions.project_id", "=", projectId)
        .where("dispositions.tendon_id", "=", tendonId),
    ).as("dispositions"),
    // The other tendons of the pour, for the group-average band (read only when the project sets
    // one): the deviation of each one's latest evaluation when complete, and when it was stressed last.
    jsonArrayFrom(
      eb
        .selectFrom("tendons as g")
        .select((g) => [
          "g.id",
          "g.tag",
          g
            .selectFrom("evaluations as ev")
            .select(
              sql<
                number | null
              >`case when ev.provisional or ev.verdict = 'incomplete' then null else ev.deviation_pct end`.as("d"),
            )
            .where("ev.project_id", "=", projectId)
            .whereRef("ev.tendon_id", "=", "g.id")
            .orderBy("ev.created_at", "desc")
            .limit(1)
            .as("deviation_pct"),
          g
            .selectFrom("records as gr")
            .select((m) => m.fn.max("gr.device_time").as("t"))
            .where("gr.project_id", "=", projectId)
            .whereRef("gr.tendon_id", "=", "g.id")
            .as("last_stressed_at"),
        ])
        .where("g.project_id", "=", projectId)
        .whereRef("g.pour_id", "=", "tendons.pour_id")
        .where(sql<boolean>`g.member is not distinct from tendons.member`)
        .where("g.id", "!=", tendonId)
        .where(sql<boolean>`projects.group_tolerance_pct is not null`),
    ).as("group"),
    // The wire-break ledger of the tendon's member (the tendons of its pour naming the same member,
    // or none): the member's strands by size and lot, this tendon's included ...
    jsonArrayFrom(
      eb
        .selectFrom("tendons as m")
        .leftJoin("strand_lots as ml", (j) =>
          j.onRef("ml.id", "=", "m.strand_lot_id").onRef("ml.project_id", "=", "m.project_id"),
        )
        .select((m) => [
          "m.strand_size",
          "ml.area_mm2 as lot_area_mm2",
          m.fn.sum<number>("m.strand_count").as("strands"),
        ])
        .where("m.project_id", "=", projectId)
        .whereRef("m.pour_id", "=", "tendons.pour_id")
        .where(sql<boolean>`m.member is not distinct from tendons.member`)
        .where(ledgerWanted)
        .groupBy(["m.strand_size", "ml.area_mm2"]),
    ).as("memberSteel"),
    // ... and the wires broken on its other tendons: per end, the most any current record reports.
    jsonArrayFrom(
      eb
        .selectFrom("records as wr")
        .innerJoin("tendons as wt", "wt.id", "wr.tendon_id")
        .leftJoin("strand_lots as wl", (j) =>
          j.onRef("wl.id", "=", "wt.strand_lot_id").onRef("wl.project_id", "=", "wt.project_id"),
        )
        .select((w) => [
          "wt.tag",
          "wt.strand_size",
          "wl.area_mm2 as lot_area_mm2",
          "wr.tendon_end",
          w.fn.max("wr.wire_breaks").as("wires"),
        ])
        .where("wr.project_id", "=", projectId)
        .whereRef("wr.pour_id", "=", "tendons.pour_id")
        .where("wr.wire_breaks", ">", 0)
        .where("wr.tendon_id", "!=", tendonId)
        .where(sql<boolean>`wt.member is not distinct from tendons.member`)
        .where(ledgerWanted)
        .where(({ not, exists, selectFrom }) =>
          not(
            exists(
              selectFrom("records as wn")
                .select("wn.id")
                .whereRef("wn.chain_id", "=", "wr.chain_id")
                .whereRef("wn.revision", ">", "wr.revision"),
            ),
          ),
        )
        .groupBy(["wt.tag", "wt.strand_size", "wl.area_mm2", "wr.tendon_end"]),
    ).as("memberBreaks"),
    eb
      .selectFrom("tendon_versions")
      .select("tendon_versions.version")
      .where("tendon_versions.tendon_id", "=", tendonId)
      .as("version"),
  ]);
}

type StateRow = Awaited<ReturnType<ReturnType<typeof selectTendonState>["executeTakeFirstOrThrow"]>>;

const asRecord = (r: RecordJson): EvaluatedRecord => ({
  ...r,
  device_time: new Date(r.device_time),
  received_at: new Date(r.received_at),
});

/** The state from a row of `selectTendonState`, with a record about to be stored added. */
export function stateFromRow(row: StateRow, adding?: EvaluatedRecord): TendonState {
  const records = [...(row.records as RecordJson[]).map(asRecord), ...(adding ? [adding] : [])].sort(
    (a, b) => +a.device_time - +b.device_time || a.revision - b.revision,
  );
  return {
    basis: toLoadedTendon(row),
    records,
    openFlagKinds: row.openFlags.map((f) => f.kind),
    pourConcreteFlagOpen: Boolean(row.pourConcreteFlagOpen),
    sets: row.sets,
    dispositions: row.dispositions
      .map((d) => ({ ...d, created_at: new Date(d.created_at) }))
      .sort((a, b) => +a.created_at - +b.created_at),
    version: row.version ?? 0,
    group: row.group,
    memberSteel: row.memberSteel,
    memberBreaks: row.memberBreaks,
  };
}

/** What one evaluation will write, and what it answers. */
export interface EvaluationPlan {
  outcome: EvaluationOutcome;
  evaluation: Insertable<EvaluationsTable> & { id: string };
  flags: (Insertable<FlagsTable> & { id: string })[];
  notification: Insertable<NotificationsTable> | null;
  closures: { flagId: string; reason: string }[];
  /**
   * The crew's reasons to go ahead before the concrete was confirmed, on records of a pour whose one
   * concrete flag another evaluation raised: each is added to that flag's reason once.
   */
  concreteNotes?: { pourId: string; goAhead: string; note: string }[];
}

/** How many strokes a record's typed values sum (1 for marks). */
function strokeCount(r: EvaluatedRecord): number {
  const strokes = (r.entered as { strokes?: unknown } | null)?.strokes;
  return r.reading_method === "strokes" && Array.isArray(strokes) ? Math.max(1, strokes.length) : 1;
}

/** The judge's facts from the state read in one query. */
export function judgeInputFromState(state: TendonState): JudgeInput {
  const { project, tendon, pour, lot } = state.basis;
  const sets = new Map<string, JudgeInput["sets"][number]>();
  for (const row of state.sets) {
    const set = sets.get(row.setId) ?? {
      id: row.setId,
      name: row.name,
      jackGripMm: row.jack_grip_mm,
      maxForceN: row.max_force_n,
      drawInMm: row.draw_in_mm,
      calibrations: [],
    };
    // The left join: a row with a calibration id carries the whole calibration.
    if (row.id !== null) set.calibrations.push(calibrationFromRow(row as CalibrationRow));
    sets.set(row.setId, set);
  }
  const records: JudgeRecord[] = state.records.map((r) => ({
    id: r.id,
    chainId: r.chain_id,
    revision: r.revision,
    end: r.tendon_end,
    deviceTime: r.device_time,
    receivedAt: r.received_at,
    equipmentSetId: r.equipment_set_id,
    calibrationId: r.calibration_id,
    expiredCalibrationReason: r.expired_calibration_reason,
    concreteGoAhead: r.concrete_go_ahead ?? null,
    readingMethod: r.reading_method,
    initialPressureMPa: r.initial_pressure_mpa,
    finalPressureMPa: r.final_pressure_mpa,
    measuredMm: r.measured_mm,
    strokeCount: strokeCount(r),
    drawInMm: r.draw_in_mm,
    seatingMm: r.seating_mm,
    stressingOrder: r.stressing_order,
    wireBreaks: r.wire_breaks,
    restressOfDispositionId: r.restress_of_disposition_id,
    firstReadingMm: r.first_reading_mm ?? null,
    rereadDeclinedReason: r.reread_declined_reason ?? null,
    wireBreakDetails: storedWireBreaks(r.wire_break_details),
    gaugeSteps: storedGaugeSteps(r.entered),
    gaugeOffTarget: storedGaugeOffTarget(r.entered),
  }));
  for (const r of records)
    if (!sets.has(r.equipmentSetId))
      throw new Error(`equipment set ${r.equipmentSetId} of record ${r.id} is not on the project`);
  return {
    project,
    tendon,
    lot,
    pour: { concreteStrengthMPa: pour.concreteStrengthMPa, concreteFlagOpen: state.pourConcreteFlagOpen ?? false },
    sets: [...sets.values()],
    records,
    dispositions: state.dispositions.map((d) => ({
      id: d.id,
      flagId: d.flag_id,
      decision: d.decision,
      createdAt: d.created_at,
    })),
    ...(state.memberSteel && { member: memberLedger(state) }),
    group: {
      label: groupLabel(state.basis),
      tendons: (state.group ?? []).map((g) => ({
        tendonId: g.id,
        tag: g.tag,
        deviationPct: g.deviation_pct,
        lastStressedAt: g.last_stressed_at,
      })),
    },
  };
}

/** What the group and the ledger call the tendon's member: the schedule's member, else its pour. */
const groupLabel = ({ tendon, pour }: LoadedTendon) =>
  tendon.member ? `member ${tendon.member}` : `pour ${pour.name}`;

/** The area of one strand: the lot's mill certificate when the tendon names a lot, else nominal. */
function strandArea(size: string, lotAreaMm2: number | null): number {
  const area = lotAreaMm2 ?? findStrandSize(size)?.areaMm2;
  if (area === undefined) throw new Error(`Unknown strand size "${size}"`);
  return area;
}

/** The member's steel and its other tendons' broken wires, for the ledger rule. */
function memberLedger(state: TendonState): NonNullable<JudgeInput["member"]> {
  const byTag = new Map<string, { tag: string; wires: number; wireAreaMm2: number }>();
  for (const b of state.memberBreaks ?? []) {
    const entry = byTag.get(b.tag) ?? {
      tag: b.tag,
      wires: 0,
      wireAreaMm2: strandArea(b.strand_size, b.lot_area_mm2) / WIRES_PER_STRAND,
    };
    entry.wires += Number(b.wires);
    byTag.set(b.tag, entry);
  }
  return {
    label: groupLabel(state.basis),
    steelMm2: (state.memberSteel ?? []).reduce(
      (s, m) => s + Number(m.strands) * strandArea(m.strand_size, m.lot_area_mm2),
      0,
    ),
    otherBreaks: [...byTag.values()].sort((a, b) => a.tag.localeCompare(b.tag)),
  };
}

/** Decides the evaluation of a tendon from its state: no database, no clock but the mail's. */
export function planEvaluation(
  state: TendonState,
  input: { projectId: string; tendonId: string; reason: string },
): EvaluationPlan {
  const { basis } = state;
  const { project, tendon, pour } = basis;

  // Read → judge (pure, the same function the tablet calls) → write.
  const judgeInput = judgeInputFromState(state);
  const { judgement, findings } = judgeAndFlag(judgeInput);
  const current = judgement.ends.map((e) => e.record);
  const verdict: Verdict = judgement.verdict;
  const provisional = judgement.provisional;
  const deviationPct = judgement.comparison?.deviationPct ?? null;
  const measuredMm = judgement.measuredMm;
  // Per end, the gauge force against the force the elongation implies (the force-agreement rule's figures).
  const agreementOf = (e: (typeof judgement.ends)[number]) =>
    forceAgreement(e, judgeInput.project, judgement.specifiedForceN);
  const readings = judgement.ends.map((e) => ({
    end: e.end,
    recordId: e.record.id,
    method: e.method,
    basis: e.basis,
    role: e.role,
    day: e.day,
    measuredMm: e.record.measuredMm,
    firstReadingMm: e.record.firstReadingMm ?? null,
    rereadDeclinedReason: e.record.rereadDeclinedReason ?? null,
    strokeCount: e.record.strokeCount,
    drawInMm: e.record.drawInMm,
    drawInUsedMm: e.drawInUsedMm,
    drawInSource: e.drawInSource,
    drawInDeductedMm: e.drawInDeductedMm,
    seatingMm: e.record.seatingMm,
    initialPressureMPa: e.record.initialPressureMPa,
    finalPressureMPa: e.record.finalPressureMPa,
    totalMm: e.totalMm,
    predictedGrossMm: e.predictedGrossMm,
    gripMm: e.gripMm,
    setMm: e.setMm,
    setSource: e.setSource,
    predictedMm: e.predictedMm,
    gaugeForceN: e.gaugeForceN,
    impliedForceN: e.impliedForceN,
    forceBasisMm: e.forceBasisMm,
    forceDifferencePct: agreementOf(e)?.differencePct ?? null,
    forceBandPct: agreementOf(e)?.bandPct ?? null,
    // The gauge steps' line as judged (r², what it put below the initial pressure), and the target.
    stepFit: e.stepFit,
    targetPressureMPa: e.targetPressureMPa,
    offTargetPct: e.offTargetPct,
    gaugeOffTarget: e.record.gaugeOffTarget ?? null,
    incomplete: e.incomplete,
  }));
  const usedCalibrations = judgement.ends
    .filter((e) => e.calibration)
    .map((e) => ({
      recordId: e.record.id,
      equipmentSet: state.sets.find((s) => s.setId === e.record.equipmentSetId)?.name ?? null,
      id: e.calibration!.id,
      calibrated_on: e.calibration!.calibratedOn,
      valid_until: e.calibration!.validUntil,
      slope_n_per_mpa: e.calibration!.slope,
      intercept_n: e.calibration!.intercept,
      min_pressure_mpa: e.calibration!.minPressureMPa,
      max_pressure_mpa: e.calibration!.maxPressureMPa,
    }));
  const predictedMm =
    judgement.predictedMm ?? (project.comparisonBasis === "net" ? judgement.netMm : judgement.grossMm);

  const evaluationId = randomUUID();
  const evaluation: EvaluationPlan["evaluation"] = {
    id: evaluationId,
    project_id: input.projectId,
    tendon_id: input.tendonId,
    record_ids: current.map((r) => r.id),
    reason: input.reason,
    engine_version: ENGINE_VERSION,
    inputs: JSON.stringify({
      project,
      tendon,
      strand: judgement.strand,
      lot: basis.lot,
      jackingForceN: judgement.specifiedForceN,
      // The tendon's schedule row, or the project's factor of fpu·A (with the factor).
      jackingForceSource: judgement.specifiedForceSource,
      jackingForceFactor: judgement.specifiedForceFactor,
      order: judgement.order,
      governs: judgement.governs,
      pour: {
        id: pour.id,
        concreteStrengthMPa: pour.concreteStrengthMPa,
        concreteFlagOpen: state.pourConcreteFlagOpen ?? false,
      },
      readings,
      calibrations: usedCalibrations,
    }),
    result: JSON.stringify({
      basis: judgement.basisLabel,
      prediction: { meetingPointMm: judgement.meetingPointMm },
      grossMm: judgement.grossMm,
      netMm: judgement.netMm,
      shopDrawing: judgement.shopDrawing,
      governs: judgement.governs,
      governsNote: judgement.governsNote,
      governsLine: governsLine(project, judgement),
      predictedMm,
      comparison: judgement.comparison,
      incomplete: judgement.incomplete,
      missingEnds: judgement.missingEnds,
      divisionCouldFlip: judgement.divisionCouldFlip,
      rereadWanted: judgement.rereadWanted,
      findings,
    }),
    verdict,
    provisional,
    deviation_pct: deviationPct,
    predicted_mm: predictedMm,
    measured_mm: measuredMm,
  };

  // A rule already flagged and still open on this tendon is not raised again.
  const fresh = findings.filter((f) => !state.openFlagKinds.includes(f.kind));
  const unique = fresh.filter((f, i) => fresh.findIndex((g) => g.kind === f.kind) === i);
  const flags: EvaluationPlan["flags"] = unique.map((f) => ({
    id: randomUUID(),
    project_id: input.projectId,
    pour_id: pour.id,
    tendon_id: input.tendonId,
    record_id: f.recordId,
    evaluation_id: evaluationId,
    kind: f.kind,
    reason: f.reason,
  }));

  // A restress ordered by a disposition closes the flag it answered once the tendon, evaluated
  // again with that record, is complete and in band. Out of band again, the rules above raise a
  // new flag and the old one stays with the engineer.
  const answered = new Set(current.map((r) => answeredOrder(judgeInput, r)).filter((id): id is string => Boolean(id)));
  const closures =
    provisional || verdict !== "in band"
      ? []
      : state.dispositions
          .filter((d) => answered.has(d.id))
          .map((d) => ({
            flagId: d.flag_id,
            reason: `Restressed as ordered by disposition ${d.id}; evaluation ${evaluationId} is in band.`,
          }));

  let notification: EvaluationPlan["notification"] = null;
  // Members who take a digest get these flags at the shift's end, unless one must go at once.
  const recipients = flagRecipientsNow(
    project,
    project.digestEmails ?? [],
    flags.map((f) => f.kind),
  );
  if (flags.length && recipients.length) {
    const mail = flagMail({
      to: recipients,
      projectName: project.name,
      pourName: pour.name,
      tendonTag: tendon.tag,
      flags: flags.map((f) => ({
        id: f.id,
        kind: f.kind,
        reason: f.reason,
        reference: flagReferenceToken(f.id),
      })),
      verdictLine:
        deviationPct === null
          ? judgement.incomplete.length
            ? `Incomplete: ${judgement.incomplete.join(" ")}`
            : "No elongation reading yet."
          : `${verdict}${provisional ? " (provisional: not every end read)" : ""}, ${showPct(deviationPct)}`,
      basisLine:
        `Compared ${judgement.basisLabel}, ±${project.tolerancePct} % band, ` +
        `μ ${project.frictionMu}, K ${showWobble(project, project.wobblePerM)}, anchor set ${showLength(project, project.anchorSetMm)}, ` +
        `${judgement.strand.source === "strand lot" ? `strand lot ${basis.lot?.lotNumber}` : "nominal strand values"}. ` +
        governsLine(project, judgement),
      forcesLine: judgement.ends
        .map(agreementOf)
        .filter((f) => f !== null)
        .map((f) => forceAgreementWords(project, f))
        .join("; "),
      url: `${env.APP_URL}/projects/${input.projectId}/tendons/${input.tendonId}/flags`,
    });
    notification = {
      project_id: input.projectId,
      flag_id: flags[0]!.id,
      dedupe_key: `evaluation:${evaluationId}`,
      to_emails: recipients,
      subject: mail.subject,
      text_body: mail.text,
      html_body: mail.html,
    };
  }

  // The pour's concrete flag is already open: the reasons of this tendon's records are added to it.
  const concreteNotes = judgeInput.pour?.concreteFlagOpen
    ? judgement.ends.flatMap((e) => {
        const goAhead = e.record.concreteGoAhead?.trim();
        return goAhead
          ? [{ pourId: pour.id, goAhead, note: ` Crew's reason to go ahead on ${tendon.tag} end ${e.end}: ${goAhead}` }]
          : [];
      })
    : [];

  return {
    outcome: { evaluationId, verdict, provisional, deviationPct, flagKinds: flags.map((f) => f.kind) },
    evaluation,
    flags,
    notification,
    closures,
    concreteNotes,
  };
}

/**
 * The writes of a plan: the evaluation, its flags, the e-mail and the closures, to be sent as one
 * statement by `writeTogether`. The evaluation is stamped with the clock at the write, not the
 * transaction's start, so that of two evaluations of a tendon the later one is also the latest.
 */
export function evaluationWrites(db: Kysely<Database>, plan: EvaluationPlan): Record<string, Compilable> {
  const writes: Record<string, Compilable> = {
    evaluation: db.insertInto("evaluations").values({ ...plan.evaluation, created_at: sql`clock_timestamp()` }),
  };
  if (plan.flags.length) writes.flags = db.insertInto("flags").values(plan.flags).returning(["id", "number"]);
  if (plan.notification) {
    // The e-mail names each new flag by the number the insert above gave it ("F-0012"): within
    // this statement `flags` is that insert's RETURNING.
    const withReferences = (body: string) =>
      plan.flags.reduce<RawBuilder<string>>(
        (text, f) =>
          sql<string>`replace(${text}, ${flagReferenceToken(f.id!)}, (select 'F-' || lpad(number::text, greatest(4, length(number::text)), '0') from flags where id = ${f.id!}))`,
        sql<string>`${body}::text`,
      );
    writes.notification = db.insertInto("notifications").values({
      ...plan.notification,
      text_body: withReferences(plan.notification.text_body),
      html_body: withReferences(plan.notification.html_body),
    });
  }
  plan.closures.forEach((c, i) => {
    writes[`closure_${i}`] = db
      .updateTable("flags")
      .set({ status: "closed", closed_at: new Date(), close_reason: c.reason })
      .where("project_id", "=", plan.evaluation.project_id)
      .where("id", "=", c.flagId)
      .where("status", "!=", "closed");
  });
  // Each reason once: a reason the flag already quotes (from the record that raised it, or an
  // earlier delivery or revision) is not added again.
  (plan.concreteNotes ?? []).forEach((n, i) => {
    writes[`concrete_note_${i}`] = db
      .updateTable("flags")
      .set({ reason: sql`reason || ${n.note}` })
      .where("project_id", "=", plan.evaluation.project_id)
      .where("pour_id", "=", n.pourId)
      .where("kind", "=", "concrete_unconfirmed")
      .where("status", "!=", "closed")
      .where(sql<boolean>`strpos(reason, ${n.goAhead}) = 0`);
  });
  return writes;
}

/**
 * Sends writes as the data-modifying WITHs of one statement, named by their keys, ending in
 * `final` (which may read them and refuse the whole statement). One statement is one round
 * trip, and on its own one transaction.
 */
export async function writeTogether(
  db: Kysely<Database>,
  writes: Record<string, Compilable>,
  final: RawBuilder<unknown> = sql`select 1`,
): Promise<void> {
  const parts = Object.entries(writes).map(([name, w]) => sql`${sql.id(name)} as (${w})`);
  await sql`with ${sql.join(parts)} ${final}`.execute(db);
}

/**
 * Raises the tendon's version and so holds its row until the transaction ends: a push that read
 * the tendon before cannot then store a record of it. NOT_FOUND when the tendon is not on the
 * project.
 */
export async function raiseTendonVersion(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string },
): Promise<void> {
  const raised = await raiseTendonVersions(db, { projectId: input.projectId, tendonId: input.tendonId });
  if (!raised) throw new AppError("NOT_FOUND", "No such tendon on this project.");
}

/**
 * Raises the version of one tendon of the project, or of every tendon of one strand lot, holding
 * their rows as `raiseTendonVersion` does; answers how many it raised.
 */
export async function raiseTendonVersions(
  db: Kysely<Database>,
  input: { projectId: string } & ({ tendonId: string } | { strandLotId: string }),
): Promise<number> {
  const [which, id] =
    "tendonId" in input
      ? (["tendons.id", input.tendonId] as const)
      : (["tendons.strand_lot_id", input.strandLotId] as const);
  const rows = await db
    .insertInto("tendon_versions")
    .columns(["tendon_id", "version"])
    .expression((eb) =>
      eb
        .selectFrom("tendons")
        .select(["tendons.id", sql<number>`1`.as("version")])
        .where("tendons.project_id", "=", input.projectId)
        .where(which, "=", id),
    )
    .onConflict((oc) =>
      oc.column("tendon_id").doUpdateSet((eb) => ({ version: eb("tendon_versions.version", "+", 1) })),
    )
    .returning("version")
    .execute();
  return rows.length;
}

/**
 * Raises the version only from the one read with the state: writes nothing when another write
 * raised it since (the caller's guard then refuses its statement).
 */
export function raiseVersionFrom(db: Kysely<Database>, tendonId: string, seen: number) {
  return db
    .insertInto("tendon_versions")
    .values({ tendon_id: tendonId, version: seen + 1 })
    .onConflict((oc) =>
      oc
        .column("tendon_id")
        .doUpdateSet({ version: seen + 1 })
        .where("tendon_versions.version", "=", seen),
    )
    .returning("version");
}

/** Evaluates a tendon in the caller's transaction, after records of it were stored there. */
export async function evaluateTendon(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string; reason: string },
): Promise<EvaluationOutcome> {
  await raiseTendonVersion(db, input);
  for (let attempt = 1; ; attempt++) {
    const row = await selectTendonState(db, input).executeTakeFirstOrThrow();
    const plan = planEvaluation(stateFromRow(row), input);
    try {
      await writeTogether(db, evaluationWrites(db, plan));
      return plan.outcome;
    } catch (error) {
      // Another tendon of the pour raised the pour's concrete flag since the read: read again.
      if (!lostConcreteFlagRace(error) || attempt >= 5) throw error;
    }
  }
}

/**
 * The write raised the pour's concrete flag after another evaluation had already raised it (the
 * unique index of migration 2026-12-11T090000-one-open-concrete-flag). Nothing of the write was
 * stored; reading the state again sees the open flag and raises none.
 */
export function lostConcreteFlagRace(error: unknown): boolean {
  const e = error as { code?: unknown; constraint?: unknown } | null;
  return e?.code === "23505" && e.constraint === "flags_one_open_concrete_per_pour";
}
