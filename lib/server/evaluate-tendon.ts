import "server-only";
import type { Kysely } from "kysely";
import type { CalibrationsTable, Database, FlagKind, Verdict } from "@/db/types";
import { ENGINE_VERSION, checkStressLimits, findStrandSize, forceFromPressure } from "@/lib/elongation";
import { env } from "@/lib/env";
import { flagMail } from "@/lib/mail/templates";
import { judgeTendon, predictTendon, type CalibrationLine, type EndReading } from "@/lib/stressing/basis";
import { showForce, showLength, showPct, showPressure } from "@/lib/stressing/display";
import { loadTendonBasis } from "./load-tendon-basis";

/**
 * The server's authoritative evaluation of one tendon, run in the caller's transaction (the
 * sync push that stored the record). It reads the latest revision of each end's current
 * stressing, computes on the project's basis, stores the evaluation with every input used,
 * raises flags by rule and queues one e-mail for the new flags, all in that transaction: a
 * replayed sync stores nothing new and so sends nothing twice.
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
const HALF_GRADUATION_MPA = 50 * 0.006894757293168;

export async function evaluateTendon(
  db: Kysely<Database>,
  input: { projectId: string; tendonId: string; reason: string },
): Promise<EvaluationOutcome> {
  const basis = await loadTendonBasis(db, input);
  const { project, tendon, pour } = basis;

  const all = await db
    .selectFrom("records")
    .selectAll()
    .where("project_id", "=", input.projectId)
    .where("tendon_id", "=", input.tendonId)
    .orderBy("device_time")
    .orderBy("revision")
    .execute();

  // The head revision of each chain; per end, the chain stressed last is the current one.
  const heads = new Map<string, (typeof all)[number]>();
  for (const r of all) {
    const seen = heads.get(r.chain_id);
    if (!seen || r.revision > seen.revision) heads.set(r.chain_id, r);
  }
  const chainsByEnd = { A: [] as (typeof all)[number][], B: [] as (typeof all)[number][] };
  for (const head of heads.values()) chainsByEnd[head.tendon_end].push(head);
  for (const list of Object.values(chainsByEnd))
    list.sort((a, b) => +new Date(a.device_time) - +new Date(b.device_time));
  const current = (["A", "B"] as const).flatMap((end) => chainsByEnd[end].slice(-1));

  // A stressing that reached the server after an engineer ordered a restress answers that
  // order, whether or not the tablet knew of it (so only when an end was stressed again).
  const stressedAgain = chainsByEnd.A.length > 1 || chainsByEnd.B.length > 1;
  const restressOrders = !stressedAgain
    ? []
    : await db
        .selectFrom("dispositions")
        .select(["id", "created_at"])
        .where("project_id", "=", input.projectId)
        .where("tendon_id", "=", input.tendonId)
        .where("decision", "in", ["restress", "detension_restress"])
        .orderBy("created_at")
        .execute();
  const answeredOrder = (r: (typeof all)[number]): string | null =>
    r.restress_of_disposition_id ??
    restressOrders.filter((d) => new Date(d.created_at) < new Date(r.received_at)).at(-1)?.id ??
    null;

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

  // The equipment sets of the current records and all their calibrations, in one query.
  const setIds = [...new Set(current.map((r) => r.equipment_set_id))];
  const setRows = setIds.length
    ? await db
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
        .where("equipment_sets.project_id", "=", input.projectId)
        .where("equipment_sets.id", "in", setIds)
        .execute()
    : [];
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
      : calibrationsOf(set.setId).find((c) => c.calibrated_on <= day);

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

  const evaluation = await db
    .insertInto("evaluations")
    .values({
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
    })
    .returning("id")
    .executeTakeFirstOrThrow();

  // A rule already flagged and still open on this tendon is not raised again.
  const open = await db
    .selectFrom("flags")
    .select(["kind", "record_id"])
    .where("project_id", "=", input.projectId)
    .where("tendon_id", "=", input.tendonId)
    .where("status", "!=", "closed")
    .execute();
  const fresh = findings.filter((f) => !open.some((o) => o.kind === f.kind));
  const unique = fresh.filter((f, i) => fresh.findIndex((g) => g.kind === f.kind) === i);

  const created: { id: string; kind: FlagKind; reason: string }[] = [];
  for (const f of unique) {
    const flag = await db
      .insertInto("flags")
      .values({
        project_id: input.projectId,
        pour_id: pour.id,
        tendon_id: input.tendonId,
        record_id: f.recordId,
        evaluation_id: evaluation.id,
        kind: f.kind,
        reason: f.reason,
      })
      .returning(["id", "kind", "reason"])
      .executeTakeFirstOrThrow();
    created.push(flag);
  }

  await closeRestressedFlags(db, {
    projectId: input.projectId,
    dispositionIds: current.map(answeredOrder).filter((id): id is string => Boolean(id)),
    verdict,
    provisional,
    evaluationId: evaluation.id,
  });

  if (created.length) {
    const recipients = [
      ...new Set([project.engineerOfRecordEmail, ...project.notifyEmails].filter((e): e is string => Boolean(e))),
    ];
    if (recipients.length) {
      const mail = flagMail({
        to: recipients,
        projectName: project.name,
        pourName: pour.name,
        tendonTag: tendon.tag,
        flags: created,
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
      await db
        .insertInto("notifications")
        .values({
          project_id: input.projectId,
          flag_id: created[0]!.id,
          dedupe_key: `evaluation:${evaluation.id}`,
          to_emails: recipients,
          subject: mail.subject,
          text_body: mail.text,
          html_body: mail.html,
        })
        .execute();
    }
  }

  return { evaluationId: evaluation.id, verdict, provisional, deviationPct, flagKinds: created.map((c) => c.kind) };
}

/**
 * A restress ordered by a disposition closes the flag it answered once the tendon, evaluated
 * again with that record, is complete and in band. Out of band again, the rules above raise a
 * new flag and the old one stays with the engineer.
 */
async function closeRestressedFlags(
  db: Kysely<Database>,
  input: { projectId: string; dispositionIds: string[]; verdict: Verdict; provisional: boolean; evaluationId: string },
): Promise<void> {
  if (input.provisional || input.verdict !== "in band") return;
  const dispositionIds = [...new Set(input.dispositionIds)];
  if (!dispositionIds.length) return;
  const dispositions = await db
    .selectFrom("dispositions")
    .select(["id", "flag_id"])
    .where("project_id", "=", input.projectId)
    .where("id", "in", dispositionIds)
    .execute();
  for (const d of dispositions) {
    await db
      .updateTable("flags")
      .set({
        status: "closed",
        closed_at: new Date(),
        close_reason: `Restressed as ordered by disposition ${d.id}; evaluation ${input.evaluationId} is in band.`,
      })
      .where("project_id", "=", input.projectId)
      .where("id", "=", d.flag_id)
      .where("status", "!=", "closed")
      .execute();
  }
}
