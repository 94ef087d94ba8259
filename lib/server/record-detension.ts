import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { detensionPayloadSchema } from "@/lib/schemas/detension";
import { DECISION_LABELS } from "@/lib/schemas/review";
import type { OpResult, SyncOp } from "@/lib/schemas/sync";
import { rejectedOp, repeatOf, takenRecordId } from "./applied-ops";
import {
  admitEventOp,
  auditEventOp,
  claimEventOp,
  refusedField as refused,
  typedPressureMPa,
  type OpSender,
} from "./admit-event-op";
import { inTransaction } from "./in-transaction";
import { isReleasedPourRefusal, RELEASED_POUR_MESSAGE } from "./require-open-pour";

/**
 * Records a detension from the tablet's outbox (op kind detension), exactly once: the op id is
 * claimed in applied_ops in the same transaction as the detension, so a second delivery answers
 * "duplicate" with nothing written again.
 *
 * A detension answers a disposition of the tendon that ordered one (decision detension_restress);
 * any other is refused with the reason, and nothing is written. The tendon then stays held
 * ("detensioned: restress required", lib/stressing/tail-clearance.ts) until a stressing record made
 * after the detension has come in for every end the tendon is stressed from.
 *
 * Bad input writes nothing and names the field: an unreadable or non-positive pressure, a time in
 * the future, more strands than the tendon has, a set of another project, a released pour.
 */

type Db = Kysely<Database>;

export type Detensioner = OpSender;

/** How far ahead of the server's clock a tablet's time may be before it is refused as in the future. */
const FUTURE_SLACK_MS = 10 * 60 * 1000;

const DETENSION = {
  schema: detensionPayloadSchema,
  noun: "detension",
  recording: "a detension",
  auditAction: "detension.record",
};

export async function recordDetension(
  db: Db,
  input: { user: Detensioner; deviceId: string; now?: Date },
  op: SyncOp,
): Promise<OpResult> {
  const admitted = await admitEventOp(db, input.user, op, DETENSION);
  if (!admitted.ok) return admitted.result;
  const p = admitted.payload;
  const { user, deviceId } = input;
  const now = input.now ?? new Date();
  if (new Date(p.detensionedAt).getTime() > now.getTime() + FUTURE_SLACK_MS)
    return refused(op, "detensionedAt", "The time of the detension lies in the future: check the tablet's clock.");
  let pressureMPa: number | null = null;
  if (p.pressure) {
    pressureMPa = typedPressureMPa(p.pressure, p.pressureUnit);
    if (pressureMPa === null)
      return refused(op, "pressure", `The gauge pressure at release “${p.pressure}” cannot be read as a pressure.`);
    if (!(pressureMPa > 0)) return refused(op, "pressure", "The gauge pressure at release must be above zero.");
  }

  try {
    return await inTransaction(db, async (trx) => {
      const repeat = await repeatOf(trx, op, user.id);
      if (repeat) return repeat;

      const [tendon, disposition, set, taken] = await Promise.all([
        trx
          .selectFrom("tendons")
          .select(["id", "pour_id", "tag", "strand_count"])
          .where("project_id", "=", p.projectId)
          .where("id", "=", p.tendonId)
          .executeTakeFirst(),
        trx
          .selectFrom("dispositions")
          .select(["id", "decision"])
          .where("project_id", "=", p.projectId)
          .where("tendon_id", "=", p.tendonId)
          .where("id", "=", p.dispositionId)
          .executeTakeFirst(),
        trx
          .selectFrom("equipment_sets")
          .select(["id", "name"])
          .where("project_id", "=", p.projectId)
          .where("id", "=", p.equipmentSetId)
          .executeTakeFirst(),
        trx.selectFrom("detensions").select("id").where("id", "=", op.recordId).executeTakeFirst(),
      ]);
      if (!tendon) return refused(op, "tendonId", "No such tendon on this project.");
      if (tendon.pour_id !== p.pourId) return refused(op, "pourId", "The tendon is not in that pour.");
      if (!disposition)
        return refused(
          op,
          "dispositionId",
          `No disposition of the engineer on ${tendon.tag} ordered a detension: nothing was saved. Detension only on the engineer of record's order.`,
        );
      if (disposition.decision !== "detension_restress")
        return refused(
          op,
          "dispositionId",
          `The engineer's disposition on ${tendon.tag} is “${DECISION_LABELS[disposition.decision]}”, not a detension: nothing was saved. Detension only on the engineer of record's order.`,
        );
      if (p.strandsDetensioned > tendon.strand_count)
        return refused(
          op,
          "strandsDetensioned",
          `${tendon.tag} has ${tendon.strand_count} strand${tendon.strand_count === 1 ? "" : "s"}: ${p.strandsDetensioned} cannot have been detensioned.`,
        );
      if (!set) return refused(op, "equipmentSetId", "No such equipment set on this project.");
      if (taken) return takenRecordId(trx, op, user.id, "detension");

      const concurrent = await claimEventOp(trx, op, { ...input, projectId: p.projectId }, {});
      if (concurrent) return concurrent;

      await trx
        .insertInto("detensions")
        .values({
          id: op.recordId,
          project_id: p.projectId,
          pour_id: p.pourId,
          tendon_id: p.tendonId,
          disposition_id: disposition.id,
          equipment_set_id: set.id,
          operator_name: p.operatorName,
          entered: pressureMPa === null ? null : JSON.stringify({ pressure: p.pressure, unit: p.pressureUnit }),
          release_pressure_mpa: pressureMPa,
          strands_detensioned: p.strandsDetensioned,
          remarks: p.remarks ? p.remarks : null,
          detensioned_at: p.detensionedAt,
          recorded_by: user.id,
          device_id: deviceId,
        })
        .execute();
      await auditEventOp(trx, {
        action: "detension.record",
        user,
        payload: p,
        deviceId,
        detail: { opId: op.opId, detensionId: op.recordId, dispositionId: disposition.id },
      });
      return { opId: op.opId, status: "applied" } satisfies OpResult;
    });
  } catch (error) {
    if (isReleasedPourRefusal(error))
      return rejectedOp(op, "RELEASED", RELEASED_POUR_MESSAGE, { pourId: ["Released."] });
    throw error;
  }
}
