import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { OpErrorCode } from "@/lib/errors";
import type { OpResult, SyncOp } from "@/lib/schemas/sync";

/**
 * The tablet's ops are applied exactly once by their op id (applied_ops). What the kinds of op share:
 * the answer of a refused op, the claim of an op id with the result a repeat will be answered, and
 * the answer to a repeat. The stored result holds the fields the op's answer carries beyond its id
 * and status (a record's revision and evaluation, a tail cut's hold, a lift-off check's result).
 */

export const rejectedOp = (
  op: SyncOp,
  code: OpErrorCode,
  message: string,
  fields?: Record<string, string[]>,
): OpResult => ({
  opId: op.opId,
  status: "rejected",
  error: { code, message, ...(fields ? { fields } : {}) },
});

export interface OpClaim {
  user_id: string;
  result: unknown;
}

/** A repeat of an applied op: its stored answer, unless another person's op already took the id. */
export function duplicateOf(op: SyncOp, userId: string, claim: OpClaim): OpResult {
  if (claim.user_id !== userId)
    return rejectedOp(op, "CONFLICT", "This operation id was already used by someone else.");
  return { ...(claim.result as Partial<OpResult>), opId: op.opId, status: "duplicate" };
}

/** The claim of the op id, if any delivery has made one. */
export function findClaim(trx: Kysely<Database>, opId: string): Promise<OpClaim | undefined> {
  return trx.selectFrom("applied_ops").select(["user_id", "result"]).where("op_id", "=", opId).executeTakeFirst();
}

/** The answer to a repeat of an op already applied, or null when its id is not claimed yet. */
export async function repeatOf(trx: Kysely<Database>, op: SyncOp, userId: string): Promise<OpResult | null> {
  const claim = await findClaim(trx, op.opId);
  return claim ? duplicateOf(op, userId, claim) : null;
}

/**
 * The answer when the op's record id is already taken: a concurrent delivery of this same op that
 * committed between the first read and this one, else a conflict naming the kind of record.
 */
export async function takenRecordId(
  trx: Kysely<Database>,
  op: SyncOp,
  userId: string,
  noun: string,
): Promise<OpResult> {
  return (
    (await repeatOf(trx, op, userId)) ?? {
      opId: op.opId,
      status: "conflict",
      error: { code: "CONFLICT", message: `This ${noun} id is already used; nothing was saved.` },
    }
  );
}

/**
 * Claims the op id (`claimOp`): null when this delivery claimed it, else the answer to the
 * concurrent delivery of the same op that committed first.
 */
export async function claimOrRepeat(
  trx: Kysely<Database>,
  input: { op: SyncOp; projectId: string; deviceId: string; userId: string; result: object },
): Promise<OpResult | null> {
  const concurrent = await claimOp(trx, input);
  return concurrent ? duplicateOf(input.op, input.userId, concurrent) : null;
}

/**
 * Claims the op id inside the op's transaction, with the answer a repeat will get. Null when this
 * delivery claimed it; otherwise the claim of a concurrent delivery that committed first.
 */
export async function claimOp(
  trx: Kysely<Database>,
  input: { op: SyncOp; projectId: string; deviceId: string; userId: string; result: object },
): Promise<OpClaim | null> {
  const claimed = await trx
    .insertInto("applied_ops")
    .values({
      op_id: input.op.opId,
      project_id: input.projectId,
      device_id: input.deviceId,
      user_id: input.userId,
      kind: input.op.kind,
      record_id: input.op.recordId,
      status: "applied",
      result: JSON.stringify(input.result),
    })
    .onConflict((oc) => oc.column("op_id").doNothing())
    .returning("op_id")
    .executeTakeFirst();
  if (claimed) return null;
  return trx
    .selectFrom("applied_ops")
    .select(["user_id", "result"])
    .where("op_id", "=", input.op.opId)
    .executeTakeFirstOrThrow();
}
