import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import { jackingForceOverLimit, type TendonInput } from "@/lib/schemas/tendon";
import { checkScheduleRow, scheduleColumns } from "./create-tendon";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";
import { raiseTendonVersion } from "./evaluate-tendon";
import { reevaluateTendons } from "./reevaluate-project";
import { lockOpenPour } from "./require-open-pour";

/**
 * Edits one tendon's schedule row. When it has been stressed and a value its prediction reads
 * changed, it is judged again in the same transaction with the cause as the reason (a new
 * evaluation; flags raised and closed by the rules), and the edit is audited with what changed.
 * Refused while its pour stands released, like every other schedule write.
 */
export async function updateTendon(
  db: Db,
  input: { projectId: string; tendonId: string; values: TendonInput; by: string },
): Promise<{ tendonId: string; reevaluated: number; changed: number; closedFlags: number }> {
  const v = input.values;
  return inTransaction(db, async (trx) => {
    const found = await trx
      .selectFrom("tendons")
      .select("pour_id")
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.tendonId)
      .executeTakeFirst();
    if (!found) throw new AppError("NOT_FOUND", "No such tendon on this project.");
    // The pour's row lock serialises the tag check with the pour's other schedule writers.
    await lockOpenPour(trx, { projectId: input.projectId, pourId: found.pour_id });
    const before = await trx
      .selectFrom("tendons")
      .selectAll()
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.tendonId)
      .forUpdate()
      .executeTakeFirstOrThrow();
    await checkScheduleRow(trx, {
      projectId: input.projectId,
      pourId: before.pour_id,
      values: v,
      exceptTendonId: input.tendonId,
    });
    // A body without the jacking force keeps the stored one: it must still suit the strands sent.
    const jackingForceN = v.jackingForceN === undefined ? before.jacking_force_n : v.jackingForceN;
    const over = jackingForceOverLimit({ strandSize: v.strandSize, strandCount: v.strandCount, jackingForceN });
    if (over) {
      const message = `The tendon's jacking force is above 0.80·fpu·A = ${over} for ${v.strandCount} × ${v.strandSize} strand (ACI 318-19 Table 20.3.2.5.1); lower it or leave it empty for the project's factor.`;
      throw new AppError("INVALID_INPUT", message, { jackingForceN: [message] });
    }
    await trx
      .updateTable("tendons")
      .set({
        ...scheduleColumns(v),
        // Absent from the body: the member stays as it was.
        ...(v.member !== undefined && { member: v.member }),
        // Absent from the body: the schedule's stressing order stays as it was.
        ...(v.stressingOrder !== undefined && { stressing_order: v.stressingOrder }),
        // Absent from the body: the schedule's jacking force stays as it was.
        ...(v.jackingForceN !== undefined && { jacking_force_n: v.jackingForceN }),
        updated_at: new Date(),
      })
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.tendonId)
      .execute();

    // What the judge reads of the schedule row; the tag and the kind's name feed no number.
    const judging: [string, unknown, unknown][] = [
      ["strand size", before.strand_size, v.strandSize],
      ["strands", before.strand_count, v.strandCount],
      ["segments", segmentsKey(before.segments), segmentsKey(v.segments)],
      ["ends", before.ends, v.ends],
      ["grip length", before.jack_grip_mm, v.jackGripMm],
      ["shop-drawing elongation", before.shop_elongation_mm, v.shopElongationMm],
      ["strand lot", before.strand_lot_id, v.strandLotId],
      ["member", before.member, v.member === undefined ? before.member : v.member],
      ["jacking force", before.jacking_force_n, jackingForceN],
    ];
    const moved = judging.filter(([, a, b]) => a !== b).map(([name]) => name);
    // Raising the version holds the tendon until this transaction ends, so a record of it pushed
    // meanwhile (read on the old schedule) is refused by its guard and judged again on the new one.
    if (moved.length) await raiseTendonVersion(trx, { projectId: input.projectId, tendonId: input.tendonId });
    const stressed = await trx
      .selectFrom("records")
      .select("id")
      .where("project_id", "=", input.projectId)
      .where("tendon_id", "=", input.tendonId)
      .limit(1)
      .executeTakeFirst();
    const reason = `tendon ${v.tag} schedule edited: ${moved.join(", ")}`;
    // The member, and the steel the tendon adds to it, are also read by its neighbours' group band
    // and wire-break ledger: then every stressed tendon of the pour is judged again.
    const neighbours = moved.some((m) => ["member", "strand size", "strands", "strand lot"].includes(m));
    const tendonIds = neighbours
      ? (
          await trx
            .selectFrom("records")
            .select("tendon_id")
            .distinct()
            .where("project_id", "=", input.projectId)
            .where("pour_id", "=", before.pour_id)
            .execute()
        ).map((r) => r.tendon_id)
      : stressed
        ? [input.tendonId]
        : [];
    const result =
      tendonIds.length && moved.length
        ? await reevaluateTendons(trx, { projectId: input.projectId, tendonIds, reason })
        : { reevaluated: 0, changed: 0, closedFlags: 0 };
    await recordAudit(trx, {
      action: "tendon.update",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      target: input.tendonId,
      detail: {
        tag: v.tag,
        changed: [["tag", before.tag, v.tag] as [string, unknown, unknown], ["kind", before.kind, v.kind], ...judging]
          .filter(([, a, b]) => a !== b)
          .map(([field]) => field),
        reevaluated: result.reevaluated,
        verdictChanged: result.changed > 0,
        flagsClosed: result.closedFlags,
        ...(result.reevaluated && { reason }),
      },
    });
    return { tendonId: input.tendonId, ...result };
  });
}

/** Segments as comparable text (jsonb keeps its keys in its own order). */
const segmentsKey = (segments: readonly { lengthMm: number; angleRad: number }[]) =>
  JSON.stringify(segments.map((g) => [g.lengthMm, g.angleRad]));
