import "server-only";
import { uuidv7 } from "uuidv7";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { CorrectionInput } from "@/lib/schemas/review";
import { evaluateTendon, type EvaluationOutcome } from "./evaluate-tendon";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";
import { requireOpenPour } from "./require-open-pour";

/**
 * A paperwork correction found in review: a new revision of the record with the corrected
 * values and the reason, evaluated again in the same transaction. The original stays as it was.
 */
export async function correctRecord(
  db: Kysely<Database>,
  input: { projectId: string; recordId: string; by: { id: string }; correction: CorrectionInput },
): Promise<{ recordId: string; evaluation: EvaluationOutcome }> {
  return inTransaction(db, async (trx) => {
    const base = await trx
      .selectFrom("records")
      .selectAll()
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.recordId)
      .executeTakeFirst();
    if (!base) throw new AppError("NOT_FOUND", "No such record on this project.");
    await requireOpenPour(trx, { projectId: input.projectId, pourId: base.pour_id });
    const head = await trx
      .selectFrom("records")
      .select(["id", "revision"])
      .where("project_id", "=", input.projectId)
      .where("chain_id", "=", base.chain_id)
      .orderBy("revision", "desc")
      .limit(1)
      .executeTakeFirstOrThrow();
    if (head.id !== base.id) {
      throw new AppError(
        "CONFLICT",
        `This record was already corrected (revision ${head.revision} is the latest); correct that one instead.`,
      );
    }
    const c = input.correction;
    const id = uuidv7();
    await trx
      .insertInto("records")
      .values({
        ...base,
        id,
        revision: base.revision + 1,
        base_record_id: base.id,
        revision_reason: c.reason,
        tendon_end: c.tendonEnd ?? base.tendon_end,
        measured_mm: c.measuredMm ?? base.measured_mm,
        final_pressure_mpa: c.finalPressureMPa ?? base.final_pressure_mpa,
        initial_pressure_mpa: c.initialPressureMPa === undefined ? base.initial_pressure_mpa : c.initialPressureMPa,
        entered: JSON.stringify({ ...base.entered, correctedBy: input.by.id, correction: c }),
        wire_break_details: base.wire_break_details ? JSON.stringify(base.wire_break_details) : null,
        // A corrected elongation is no longer the tablet's re-read: the first reading goes with it.
        first_reading_mm: c.measuredMm === undefined ? base.first_reading_mm : null,
        author_user_id: input.by.id,
        received_at: new Date(),
      })
      .execute();
    await recordAudit(trx, {
      action: "record.correct",
      outcome: "success",
      actorUserId: input.by.id,
      projectId: input.projectId,
      target: base.id,
      detail: { revision: base.revision + 1 },
    });
    const evaluation = await evaluateTendon(trx, {
      projectId: input.projectId,
      tendonId: base.tendon_id,
      reason: `paperwork correction: ${c.reason}`,
    });
    return { recordId: id, evaluation };
  });
}
