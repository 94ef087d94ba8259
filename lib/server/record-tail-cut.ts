import "server-only";
import { rejectedOp, repeatOf } from "./applied-ops";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { OpResult, SyncOp } from "@/lib/schemas/sync";
import { tailCutPayloadSchema } from "@/lib/schemas/tail-cut";
import { awaitingRestress, tailClearance } from "@/lib/stressing/tail-clearance";
import { formatDateTime } from "@/lib/format/dates";
import { getProjectTimeZone } from "./get-project-time-zone";
import { admitEventOp, auditEventOp, claimEventOp, insertEventFlag, type OpSender } from "./admit-event-op";
import { inTransaction } from "./in-transaction";

/**
 * Records "tails cut" on a tendon from the tablet's outbox (op kind tails_cut), exactly once:
 * the op id is claimed in applied_ops in the same transaction as the cut, so a second delivery
 * answers "duplicate" with the stored result. One cut per tendon: a cut of a tendon already cut
 * (another tablet, or the same cut under a new op id) is a duplicate too.
 *
 * The server decides the clearance again from what it holds (open flags, an end without a
 * record, the concrete gate). A cut of a held tendon is a fact on the slab, so it is stored all
 * the same, with why the tendon was held, and raises a flag (cut_while_held) for the inspector
 * and the engineer. A released pour accepts cuts: cutting tails is what the release is for.
 */

type Db = Kysely<Database>;

export type TailCutter = OpSender;

interface StoredResult {
  tailCut?: { held: boolean; reasons: string[] };
}

const TAILS_CUT = {
  schema: tailCutPayloadSchema,
  noun: "tails cut",
  recording: "tails cut",
  auditAction: "tails.cut",
};

export async function recordTailCut(
  db: Db,
  input: { user: TailCutter; deviceId: string },
  op: SyncOp,
): Promise<OpResult> {
  const admitted = await admitEventOp(db, input.user, op, TAILS_CUT);
  if (!admitted.ok) return admitted.result;
  const p = admitted.payload;
  const { user, deviceId } = input;

  return inTransaction(db, async (trx) => {
    const repeat = await repeatOf(trx, op, user.id);
    if (repeat) return repeat;

    const tendon = await trx
      .selectFrom("tendons")
      .innerJoin("pours", (j) =>
        j.onRef("pours.id", "=", "tendons.pour_id").onRef("pours.project_id", "=", "tendons.project_id"),
      )
      .innerJoin("projects", "projects.id", "tendons.project_id")
      .select([
        "tendons.id",
        "tendons.tag",
        "tendons.pour_id",
        "tendons.ends",
        "pours.concrete_strength_mpa",
        "projects.required_concrete_mpa",
      ])
      .where("tendons.project_id", "=", p.projectId)
      .where("tendons.id", "=", p.tendonId)
      // Two cuts of one tendon are decided one after the other (no key lock: records still insert).
      .forNoKeyUpdate("tendons")
      .executeTakeFirst();
    if (!tendon)
      return rejectedOp(op, "NOT_FOUND", "No such tendon on this project.", {
        tendonId: ["Not a tendon of this project."],
      });
    if (tendon.pour_id !== p.pourId)
      return rejectedOp(op, "INVALID_INPUT", "The tendon is not in that pour.", { pourId: ["Not the tendon's pour."] });

    const existing = await trx
      .selectFrom("tail_cuts")
      .select(["id", "tendon_id"])
      .where((eb) => eb.or([eb("tendon_id", "=", p.tendonId), eb("id", "=", op.recordId)]))
      .execute();
    if (existing.some((c) => c.tendon_id !== p.tendonId))
      return {
        opId: op.opId,
        status: "conflict",
        error: {
          code: "CONFLICT",
          message: "This tails cut id is already used for another tendon; nothing was saved.",
        },
      };

    const [stressings, openFlags, person, detensions] = await Promise.all([
      trx
        .selectFrom("records")
        .select(["tendon_end", "device_time"])
        .where("project_id", "=", p.projectId)
        .where("tendon_id", "=", p.tendonId)
        .execute(),
      trx
        .selectFrom("flags")
        .select("kind")
        .where("project_id", "=", p.projectId)
        .where("tendon_id", "=", p.tendonId)
        .where("status", "!=", "closed")
        .execute(),
      trx.selectFrom("users").select("name").where("id", "=", user.id).executeTakeFirstOrThrow(),
      trx
        .selectFrom("detensions")
        .select("detensioned_at")
        .where("project_id", "=", p.projectId)
        .where("tendon_id", "=", p.tendonId)
        .execute(),
    ]);
    const clearance = tailClearance({
      ends: tendon.ends,
      recordedEnds: [...new Set(stressings.map((e) => e.tendon_end))],
      awaitingRestress: awaitingRestress({
        ends: tendon.ends,
        detensionedAt: detensions.map((d) => new Date(d.detensioned_at).toISOString()),
        records: stressings.map((r) => ({
          tendonEnd: r.tendon_end,
          stressedAt: new Date(r.device_time).toISOString(),
        })),
      }),
      openFlags,
      requiredConcreteMPa: tendon.required_concrete_mpa,
      concreteStrengthMPa: tendon.concrete_strength_mpa,
    });
    const alreadyCut = existing.length > 0;
    const stored: StoredResult = {
      tailCut: { held: !alreadyCut && !clearance.clear, reasons: alreadyCut ? [] : clearance.reasons },
    };

    const concurrent = await claimEventOp(trx, op, { ...input, projectId: p.projectId }, stored);
    if (concurrent) return concurrent;
    // The tendon's tails are already cut (recorded from elsewhere): nothing more to store.
    if (alreadyCut) return { opId: op.opId, status: "duplicate", ...stored };

    await trx
      .insertInto("tail_cuts")
      .values({
        id: op.recordId,
        project_id: p.projectId,
        pour_id: p.pourId,
        tendon_id: p.tendonId,
        cut_by: user.id,
        cut_at: p.cutAt,
        device_id: deviceId,
        held_reasons: clearance.reasons,
      })
      .execute();
    if (!clearance.clear) {
      const cutAt = formatDateTime(p.cutAt, await getProjectTimeZone(trx, p.projectId));
      await insertEventFlag(trx, p, {
        kind: "cut_while_held",
        reason: `Tails of ${tendon.tag} were cut by ${person.name} at ${cutAt} while the tendon was held: ${clearance.reasons.join(" ")}`,
      }).execute();
    }
    await auditEventOp(trx, {
      action: "tails.cut",
      user,
      payload: p,
      deviceId,
      detail: { opId: op.opId, tailCutId: op.recordId, held: !clearance.clear },
    });
    return { opId: op.opId, status: "applied", ...stored };
  });
}
