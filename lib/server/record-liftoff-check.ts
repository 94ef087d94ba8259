import "server-only";
import { rejectedOp, repeatOf, takenRecordId } from "./applied-ops";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { env } from "@/lib/env";
import { dayInZone } from "@/lib/format/dates";
import { reference } from "@/lib/format/references";
import { pressureAsTyped, showWobble } from "@/lib/format/quantities";
import { flagMail } from "@/lib/mail/templates";
import { CALIBRATION_COLUMNS, calibrationFromRow, pickCalibration } from "@/lib/schemas/calibration";
import { liftoffPayloadSchema } from "@/lib/schemas/liftoff";
import type { FieldLiftoffResult, OpResult, SyncOp } from "@/lib/schemas/sync";
import { flagRecipientsNow } from "@/lib/stressing/flag-mail";
import { predictTendon } from "@/lib/stressing/basis";
import {
  expectedAnchorForceN,
  judgeLiftoff,
  liftoffEndProblem,
  liftoffLine,
  liftoffPressureProblem,
} from "@/lib/stressing/liftoff";
import { isInputError } from "@/lib/units";
import {
  admitEventOp,
  auditEventOp,
  claimEventOp,
  insertEventFlag,
  refusedField as refused,
  typedPressureMPa,
  type OpSender,
} from "./admit-event-op";
import { inTransaction } from "./in-transaction";
import { selectTendonBasis, toLoadedTendon } from "./load-tendon-basis";
import { queueMail } from "./queue-mail";

/**
 * Records a lift-off check from the tablet's outbox (op kind liftoff_check), exactly once: the
 * op id is claimed in applied_ops in the same transaction as the check, so a second delivery
 * answers "duplicate" with the stored result.
 *
 * The check answers a disposition of the tendon that ordered one (decision liftoff_check). The
 * server reads the typed pressure again, converts it to force on the equipment set's calibration
 * in force on the day of the check (in the project's time zone; `pickCalibration`, as the
 * stressing records), and compares it with the force the engine expects at that anchorage after
 * seating (lib/stressing/liftoff.ts) within the project's band (`liftoff_band_pct`). Outside the
 * band it raises a flag of kind liftoff_out_of_band and e-mails the engineer like any other flag.
 * The disposition's own flag stays with the engineer either way: the result informs their next
 * decision, it does not make it.
 *
 * Bad input writes nothing and names the field: an unreadable pressure, a pressure outside the
 * calibrated range, a dead end, a set of another project, no calibration in force, an expired one.
 */

type Db = Kysely<Database>;

export type LiftoffChecker = OpSender;

interface StoredResult {
  liftoffCheck?: FieldLiftoffResult;
}

const LIFTOFF_CHECK = {
  schema: liftoffPayloadSchema,
  noun: "lift-off check",
  recording: "a lift-off check",
  auditAction: "liftoff.check",
};

export async function recordLiftoffCheck(
  db: Db,
  input: { user: LiftoffChecker; deviceId: string },
  op: SyncOp,
): Promise<OpResult> {
  const admitted = await admitEventOp(db, input.user, op, LIFTOFF_CHECK);
  if (!admitted.ok) return admitted.result;
  const p = admitted.payload;
  const { user, deviceId } = input;
  const pressureMPa = typedPressureMPa(p.pressure, p.pressureUnit);
  if (pressureMPa === null)
    return refused(op, "pressure", `The lift-off gauge pressure “${p.pressure}” cannot be read as a pressure.`);

  return inTransaction(db, async (trx) => {
    const repeat = await repeatOf(trx, op, user.id);
    if (repeat) return repeat;

    const row = await selectTendonBasis(trx, { projectId: p.projectId, tendonId: p.tendonId })
      .select("projects.liftoff_band_pct")
      .executeTakeFirst();
    if (!row) return refused(op, "tendonId", "No such tendon on this project.");
    const basis = toLoadedTendon(row);
    if (basis.pour.id !== p.pourId) return refused(op, "pourId", "The tendon is not in that pour.");

    const [disposition, set, calibrations, taken, person] = await Promise.all([
      trx
        .selectFrom("dispositions")
        .select(["id", "decision", "flag_id"])
        .where("project_id", "=", p.projectId)
        .where("tendon_id", "=", p.tendonId)
        .where("id", "=", p.dispositionId)
        .executeTakeFirst(),
      trx
        .selectFrom("equipment_sets")
        .select(["id", "name", "jack_grip_mm"])
        .where("project_id", "=", p.projectId)
        .where("id", "=", p.equipmentSetId)
        .executeTakeFirst(),
      trx
        .selectFrom("calibrations")
        .select(CALIBRATION_COLUMNS)
        .where("project_id", "=", p.projectId)
        .where("equipment_set_id", "=", p.equipmentSetId)
        .execute(),
      trx.selectFrom("liftoff_checks").select("id").where("id", "=", op.recordId).executeTakeFirst(),
      trx.selectFrom("users").select("name").where("id", "=", user.id).executeTakeFirstOrThrow(),
    ]);
    if (!disposition || disposition.decision !== "liftoff_check")
      return refused(op, "dispositionId", "No lift-off check was ordered on this tendon by that disposition.");
    const endProblem = liftoffEndProblem(basis.tendon.ends, p.tendonEnd);
    if (endProblem) return refused(op, endProblem.field, endProblem.message);
    if (!set) return refused(op, "equipmentSetId", "No such equipment set on this project.");
    if (taken) return takenRecordId(trx, op, user.id, "lift-off check");

    const day = dayInZone(p.checkedAt, basis.project.timeZone ?? "UTC");
    const picked = pickCalibration(calibrations.map(calibrationFromRow), day);
    if (!picked)
      return refused(
        op,
        "equipmentSetId",
        `${set.name} had no calibration in force on ${day}: the force cannot be known.`,
      );
    if (day > picked.validUntil)
      return refused(
        op,
        "equipmentSetId",
        `The calibration of ${set.name} expired on ${picked.validUntil}, before this check (${day}): use a calibrated set.`,
      );
    const { slope, intercept, minPressureMPa, maxPressureMPa } = picked;
    const line = { slope, intercept, minPressureMPa, maxPressureMPa };
    const pressureProblem = liftoffPressureProblem(basis.project, line, pressureMPa);
    if (pressureProblem) return refused(op, pressureProblem.field, pressureProblem.message);

    let expectedForceN: number;
    try {
      const predicted = predictTendon({
        project: basis.project,
        tendon: basis.tendon,
        lot: basis.lot,
        equipmentGripMm: set.jack_grip_mm,
      });
      expectedForceN = expectedAnchorForceN(predicted, p.tendonEnd);
    } catch (error) {
      if (!isInputError(error) && !(error instanceof Error && /strand size/.test(error.message))) throw error;
      return rejectedOp(
        op,
        "CONFLICT",
        `The expected force of ${basis.tendon.tag} cannot be computed from its schedule (${error.message}); nothing was saved. Ask the office to fix the schedule.`,
      );
    }
    const judged = judgeLiftoff({ pressureMPa, calibration: line, expectedForceN, bandPct: row.liftoff_band_pct });
    const result: FieldLiftoffResult = {
      liftoffForceN: judged.liftoffForceN,
      expectedForceN: judged.expectedForceN,
      deviationPct: judged.deviationPct,
      bandPct: judged.bandPct,
      withinBand: judged.withinBand,
    };
    const stored: StoredResult = { liftoffCheck: result };

    const concurrent = await claimEventOp(trx, op, { ...input, projectId: p.projectId }, stored);
    if (concurrent) return concurrent;

    const line_ = liftoffLine(basis.project, judged);
    let raisedFlagId: string | null = null;
    if (!judged.withinBand) {
      const reason =
        `Lift-off check at end ${p.tendonEnd} of ${basis.tendon.tag} by ${person.name}: gauge ` +
        `${pressureAsTyped(basis.project, { pressure: p.pressure, unit: p.pressureUnit }, pressureMPa)} on ${set.name}, ` +
        `calibration of ${picked.calibratedOn}. ${line_}`;
      const flag = await insertEventFlag(trx, p, { kind: "liftoff_out_of_band", reason })
        .returning(["id", "number"])
        .executeTakeFirstOrThrow();
      raisedFlagId = flag.id;
      const recipients = flagRecipientsNow(basis.project, basis.project.digestEmails ?? [], ["liftoff_out_of_band"]);
      if (recipients.length) {
        const mail = flagMail({
          to: recipients,
          projectName: basis.project.name,
          pourName: basis.pour.name,
          tendonTag: basis.tendon.tag,
          flags: [{ id: flag.id, reference: reference("F", flag.number), kind: "liftoff_out_of_band", reason }],
          verdictLine: `lift-off ${judged.deviationPct >= 0 ? "+" : "−"}${Math.abs(judged.deviationPct).toFixed(1)} % from the expected anchor force`,
          basisLine:
            `expected force at end ${p.tendonEnd} after seating from Tautline's force profile ` +
            `(μ ${basis.project.frictionMu}, K ${showWobble(basis.project, basis.project.wobblePerM)}), ±${judged.bandPct} % lift-off band.`,
          url: `${env.APP_URL}/projects/${p.projectId}/tendons/${p.tendonId}/flags`,
        });
        await queueMail(trx, {
          projectId: p.projectId,
          flagId: flag.id,
          dedupeKey: `liftoff:${op.recordId}`,
          to: recipients,
          mail,
        });
      }
    }

    await trx
      .insertInto("liftoff_checks")
      .values({
        id: op.recordId,
        project_id: p.projectId,
        pour_id: p.pourId,
        tendon_id: p.tendonId,
        disposition_id: disposition.id,
        tendon_end: p.tendonEnd,
        equipment_set_id: set.id,
        calibration_id: picked.id,
        entered: JSON.stringify({ pressure: p.pressure, unit: p.pressureUnit }),
        pressure_mpa: pressureMPa,
        liftoff_force_n: judged.liftoffForceN,
        expected_force_n: judged.expectedForceN,
        deviation_pct: judged.deviationPct,
        band_pct: judged.bandPct,
        within_band: judged.withinBand,
        raised_flag_id: raisedFlagId,
        checked_by: user.id,
        checked_at: p.checkedAt,
        device_id: deviceId,
      })
      .execute();
    await auditEventOp(trx, {
      action: "liftoff.check",
      user,
      payload: p,
      deviceId,
      detail: {
        opId: op.opId,
        liftoffCheckId: op.recordId,
        dispositionId: disposition.id,
        withinBand: judged.withinBand,
      },
    });
    return { opId: op.opId, status: "applied", ...stored };
  });
}
