import "server-only";
import { randomUUID } from "node:crypto";
import { sql, type Compilable, type Insertable, type Kysely, type QueryCreator, type RawBuilder } from "kysely";
import { jsonArrayFrom } from "kysely/helpers/postgres";
import type {
  CalibrationsTable,
  Database,
  Decision,
  EvaluationsTable,
  FlagKind,
  FlagsTable,
  NotificationsTable,
  TendonEnd,
  Verdict,
} from "@/db/types";
import { AppError } from "@/lib/errors";
import { ENGINE_VERSION, checkStressLimits, findStrandSize, forceFromPressure } from "@/lib/elongation";
import { env } from "@/lib/env";
import { flagMail } from "@/lib/mail/templates";
import { judgeTendon, predictTendon, type CalibrationLine, type EndReading } from "@/lib/stressing/basis";
import { pickCalibration } from "@/lib/schemas/calibration";
import { MPA_PER_PSI } from "@/lib/units";
import { showForce, showLength, showPct, showPressure } from "@/lib/stressing/display";
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

interface Finding {
  kind: FlagKind;
  reason: string;
  recordId: string | null;
}

type Calibration = Pick<
  CalibrationsTable,
  "calibrated_on" | "valid_until" | "slope_n_per_mpa" | "intercept_n" | "min_pressure_mpa" | "max_pressure_mpa"
> & { id: string };

const line = (c: Calibration): CalibrationLine => ({
  slope: c.slope_n_per_mpa,
  intercept: c.intercept_n,
  minPressureMPa: c.min_pressure_mpa,
  maxPressureMPa: c.max_pressure_mpa,
});

const isoDay = (d: Date | string) => new Date(d).toISOString().slice(0, 10);

/** Half of a 100 psi gauge graduation, in MPa. */
const HALF_GRADUATION_MPA = 50 * MPA_PER_PSI;

const RESTRESS_DECISIONS: Decision[] = ["restress", "detension_restress"];

/** The columns of a stored record that the evaluation reads. */
const EVALUATED_RECORD_COLUMNS = [
  "id",
  "chain_id",
  "revision",
  "tendon_end",
  "device_time",
  "received_at",
  "restress_of_disposition_id",
  "equipment_set_id",
  "calibration_id",
  "expired_calibration_reason",
  "initial_pressure_mpa",
  "final_pressure_mpa",
  "measured_mm",
  "wire_breaks",
] as const;

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
  initial_pressure_mpa: number | null;
  final_pressure_mpa: number;
  measured_mm: number;
  wire_breaks: number;
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
  /** The project's equipment sets used on the tendon, one row per calibration (or one with none). */
  sets: StateRow["sets"];
  dispositions: { id: string; flag_id: string; decision: Decision; created_at: Date }[];
  /** The tendon's version as read with the rest (0 before its first record). */
  version: number;
}

/**
 * One query for the whole state of a tendon: its basis, records, open flags, the equipment sets
 * its records name (and `alsoSetId`, for a record about to be stored) with their calibrations,
 * its dispositions and its version.
 */
export function selectTendonState(
  qc: QueryCreator<Database>,
  input: { projectId: string; tendonId: string; alsoSetId?: string },
) {
  const { projectId, tendonId } = input;
  return selectTendonBasis(qc, input).select((eb) => [
    jsonArrayFrom(
      eb
        .selectFrom("records")
        .select(EVALUATED_RECORD_COLUMNS)
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
          "calibrations.id",
          "calibrations.calibrated_on",
          "calibrations.valid_until",
          "calibrations.slope_n_per_mpa",
          "calibrations.intercept_n",
          "calibrations.min_pressure_mpa",
          "calibrations.max_pressure_mpa",
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
    sets: row.sets,
    dispositions: row.dispositions
      .map((d) => ({ ...d, created_at: new Date(d.created_at) }))
      .sort((a, b) => +a.created_at - +b.created_at),
    version: row.version ?? 0,
  };
}

/** What one evaluation will write, and what it answers. */
export interface EvaluationPlan {
  outcome: EvaluationOutcome;
  evaluation: Insertable<EvaluationsTable> & { id: string };
  flags: (Insertable<FlagsTable> & { id: string })[];
  notification: Insertable<NotificationsTable> | null;
  closures: { flagId: string; reason: string }[];
}

/** Decides the evaluation of a tendon from its state: no database, no clock but the mail's. */
export function planEvaluation(
  state: TendonState,
  input: { projectId: string; tendonId: string; reason: string },
): EvaluationPlan {
  const { basis } = state;
  const { project, tendon, pour } = basis;
  const all = state.records;

  // The head revision of each chain; per end, the chain stressed last is the current one.
  const heads = new Map<string, EvaluatedRecord>();
  for (const r of all) {
    const seen = heads.get(r.chain_id);
    if (!seen || r.revision > seen.revision) heads.set(r.chain_id, r);
  }
  const chainsByEnd = { A: [] as EvaluatedRecord[], B: [] as EvaluatedRecord[] };
  for (const head of heads.values()) chainsByEnd[head.tendon_end].push(head);
  for (const list of Object.values(chainsByEnd)) list.sort((a, b) => +a.device_time - +b.device_time);
  const current = (["A", "B"] as const).flatMap((end) => chainsByEnd[end].slice(-1));

  // A stressing that reached the server after an engineer ordered a restress answers that
  // order, whether or not the tablet knew of it.
  const restressOrders = state.dispositions.filter((d) => RESTRESS_DECISIONS.includes(d.decision));
  const answeredOrder = (r: EvaluatedRecord): string | null =>
    r.restress_of_disposition_id ?? restressOrders.filter((d) => d.created_at < r.received_at).at(-1)?.id ?? null;

  const findings: Finding[] = [];
  const readings: EndReading[] = [];
  const usedCalibrations: Record<string, unknown>[] = [];
  const achievedForces: number[] = [];
  let equipmentGripMm: number | null = null;

  for (const end of ["A", "B"] as const) {
    const chains = chainsByEnd[end];
    const latest = chains.at(-1);
    if (chains.length > 1 && latest && !answeredOrder(latest)) {
      findings.push({
        kind: "stressed_twice",
        reason: `End ${end} was stressed ${chains.length} times and the last stressing is not linked to an engineer's disposition.`,
        recordId: latest.id,
      });
    }
  }

  const setRows = state.sets;
  const calibrationsOf = (setId: string): Calibration[] =>
    setRows
      .filter((r): r is typeof r & Calibration => r.setId === setId && r.id !== null)
      .sort((a, b) => b.calibrated_on.localeCompare(a.calibrated_on));

  for (const record of current) {
    const set = setRows.find((r) => r.setId === record.equipment_set_id);
    if (!set) throw new Error(`equipment set ${record.equipment_set_id} of record ${record.id} is not on the project`);
    equipmentGripMm ??= set.jack_grip_mm;
    const day = isoDay(record.device_time);
    // The calibration the crew picked, else the latest one made on or before the stressing day.
    const calibration: Calibration | undefined = record.calibration_id
      ? calibrationsOf(set.setId).find((c) => c.id === record.calibration_id)
      : (pickCalibration(calibrationsOf(set.setId).map((c) => ({ ...c, calibratedOn: c.calibrated_on })), day) ?? undefined);

    if (!calibration || day > calibration.valid_until || day < calibration.calibrated_on) {
      findings.push({
        kind: "calibration_expired",
        reason: calibration
          ? `${set.name} was used on ${day}, outside its calibration (${calibration.calibrated_on} to ${calibration.valid_until}).` +
            (record.expired_calibration_reason ? ` Crew's reason: ${record.expired_calibration_reason}` : "")
          : `${set.name} had no calibration covering ${day}.`,
        recordId: record.id,
      });
    }
    if (calibration) {
      const outside = [record.initial_pressure_mpa, record.final_pressure_mpa].filter(
        (p): p is number =>
          p !== null && p > 0 && (p < calibration.min_pressure_mpa || p > calibration.max_pressure_mpa),
      );
      if (outside.length) {
        findings.push({
          kind: "calibration_range",
          reason: `Gauge reading ${outside.map((p) => showPressure(project, p)).join(", ")} at end ${record.tendon_end} is outside the calibrated range ${showPressure(project, calibration.min_pressure_mpa)} to ${showPressure(project, calibration.max_pressure_mpa)}.`,
          recordId: record.id,
        });
      }
      // A dial is read to its graduation (at most 100 psi, UFGS 02490): a reading within half a
      // graduation of the mark is at the mark, so the limits are checked on the lowest force the
      // reading allows.
      achievedForces.push(
        forceFromPressure(line(calibration), Math.max(0, record.final_pressure_mpa - HALF_GRADUATION_MPA)),
      );
      usedCalibrations.push({ recordId: record.id, equipmentSet: set.name, ...calibration });
    }
    if (record.wire_breaks > 0) {
      findings.push({
        kind: "wire_break",
        reason: `${record.wire_breaks} wire break${record.wire_breaks > 1 ? "s" : ""} reported at end ${record.tendon_end}.`,
        recordId: record.id,
      });
    }
    readings.push({
      end: record.tendon_end,
      measuredMm: record.measured_mm,
      initialPressureMPa: record.initial_pressure_mpa,
      finalPressureMPa: record.final_pressure_mpa,
      calibration: calibration ? line(calibration) : null,
    });
  }

  const predicted = predictTendon({ project, tendon, lot: basis.lot, equipmentGripMm });

  // Limits are checked on the force the gauge says was reached, against the specified strand.
  const nominal = findStrandSize(tendon.strandSize);
  if (nominal && achievedForces.length) {
    const achievedN = Math.max(...achievedForces);
    const atAchieved = predictTendon({ project, tendon, lot: basis.lot, equipmentGripMm, jackingForceN: achievedN });
    const checks = checkStressLimits({
      breakingLoadPerStrandN: nominal.minBreakingStrengthN,
      strandCount: tendon.strandCount,
      jackingForceN: achievedN,
      anchorForceAfterN: atAchieved.prediction.seating?.anchorForceAfterN,
    });
    for (const check of checks) {
      if (check.code === "jacking-over-limit") {
        findings.push({
          kind: "jacking_over_limit",
          reason: `Jacking force reached at least ${showForce(project, check.value)} (gauge reading less half a graduation), above 0.80·fpu·A = ${showForce(project, check.limit)} (ACI 318-19 Table 20.3.2.5.1).`,
          recordId: current[0]?.id ?? null,
        });
      }
      if (check.code === "anchor-over-limit") {
        findings.push({
          kind: "anchor_over_limit",
          reason: `Force at the anchor after seating ${showForce(project, check.value)} is above 0.70·fpu·A = ${showForce(project, check.limit)} (ACI 318-19 Table 20.3.2.5.1).`,
          recordId: current[0]?.id ?? null,
        });
      }
    }
  }

  let verdict: Verdict = "incomplete";
  let provisional = true;
  let deviationPct: number | null = null;
  let measuredMm: number | null = null;
  let judgement: ReturnType<typeof judgeTendon> | null = null;
  if (readings.length) {
    judgement = judgeTendon({ project, tendon, predicted, readings });
    provisional = judgement.provisional;
    verdict = judgement.comparison.verdict;
    deviationPct = judgement.comparison.deviationPct;
    measuredMm = judgement.measuredMm;
    if (!provisional && verdict !== "in band") {
      const c = judgement.comparison;
      findings.push({
        kind: "out_of_band",
        reason:
          `Measured ${showLength(project, judgement.measuredMm)} against ${showLength(project, predicted.predictedMm)} predicted ` +
          `(${project.comparisonBasis === "net" ? "net of anchor set" : "gross at jacking"}): ${showPct(c.deviationPct)}, ` +
          `${verdict} of the ±${project.tolerancePct} % band (${showLength(project, c.lowerMm)} to ${showLength(project, c.upperMm)}).`,
        recordId: current.at(-1)?.id ?? null,
      });
    }
  }

  if (current.length && project.requiredConcreteMpa !== null) {
    const strength = pour.concreteStrengthMpa;
    if (strength === null || strength < project.requiredConcreteMpa) {
      findings.push({
        kind: "concrete_unconfirmed",
        reason:
          strength === null
            ? `Stressed before the pour's concrete strength (${project.requiredConcreteMpa} MPa required) was confirmed.`
            : `Confirmed concrete strength ${strength} MPa is below the ${project.requiredConcreteMpa} MPa required before stressing.`,
        recordId: current[0]?.id ?? null,
      });
    }
  }

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
      strand: predicted.strand,
      lot: basis.lot,
      jackingForceN: predicted.jackingForceN,
      gripMm: predicted.gripMm,
      pour: { id: pour.id, concreteStrengthMpa: pour.concreteStrengthMpa },
      readings,
      calibrations: usedCalibrations,
    }),
    result: JSON.stringify({
      prediction: predicted.prediction,
      predictedMm: predicted.predictedMm,
      judgement,
      findings,
    }),
    verdict,
    provisional,
    deviation_pct: deviationPct,
    predicted_mm: predicted.predictedMm,
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
  const answered = new Set(current.map(answeredOrder).filter((id): id is string => Boolean(id)));
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
  const recipients = [
    ...new Set([project.engineerOfRecordEmail, ...project.notifyEmails].filter((e): e is string => Boolean(e))),
  ];
  if (flags.length && recipients.length) {
    const mail = flagMail({
      to: recipients,
      projectName: project.name,
      pourName: pour.name,
      tendonTag: tendon.tag,
      flags: flags.map((f) => ({ id: f.id, kind: f.kind, reason: f.reason })),
      verdictLine:
        deviationPct === null
          ? "No elongation reading yet."
          : `${verdict}${provisional ? " (provisional: not every end read)" : ""}, ${showPct(deviationPct)}`,
      basisLine:
        `${project.comparisonBasis === "net" ? "Net of anchor set" : "Gross at jacking"}, ±${project.tolerancePct} % band, ` +
        `μ ${project.frictionMu}, K ${project.wobblePerM.toFixed(4)} per m, anchor set ${showLength(project, project.anchorSetMm)}, ` +
        `${predicted.strand.source === "strand lot" ? `strand lot ${basis.lot?.lotNumber}` : "nominal strand values"}.`,
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

  return {
    outcome: { evaluationId, verdict, provisional, deviationPct, flagKinds: flags.map((f) => f.kind) },
    evaluation,
    flags,
    notification,
    closures,
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
  if (plan.flags.length) writes.flags = db.insertInto("flags").values(plan.flags);
  if (plan.notification) writes.notification = db.insertInto("notifications").values(plan.notification);
  plan.closures.forEach((c, i) => {
    writes[`closure_${i}`] = db
      .updateTable("flags")
      .set({ status: "closed", closed_at: new Date(), close_reason: c.reason })
      .where("project_id", "=", plan.evaluation.project_id)
      .where("id", "=", c.flagId)
      .where("status", "!=", "closed");
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
  const row = await db
    .insertInto("tendon_versions")
    .columns(["tendon_id", "version"])
    .expression((eb) =>
      eb
        .selectFrom("tendons")
        .select(["tendons.id", sql<number>`1`.as("version")])
        .where("tendons.project_id", "=", input.projectId)
        .where("tendons.id", "=", input.tendonId),
    )
    .onConflict((oc) =>
      oc.column("tendon_id").doUpdateSet((eb) => ({ version: eb("tendon_versions.version", "+", 1) })),
    )
    .returning("version")
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such tendon on this project.");
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
  const row = await selectTendonState(db, input).executeTakeFirstOrThrow();
  const plan = planEvaluation(stateFromRow(row), input);
  await writeTogether(db, evaluationWrites(db, plan));
  return plan.outcome;
}
