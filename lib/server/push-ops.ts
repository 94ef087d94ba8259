import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "@/db/types";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/session";
import { zodFields } from "@/lib/http/route";
import { recordPayloadSchema, type RecordPayload } from "@/lib/schemas/record";
import type { OpError, OpEvaluation, OpResult, PushResponse, SyncOp } from "@/lib/schemas/sync";
import { evaluateTendon } from "./evaluate-tendon";
import { recordAudit } from "./record-audit";

/**
 * Applies a batch of the tablet's operations. Each operation runs in a transaction of its own that
 * first claims its op id in applied_ops (the permanent idempotency key): a second delivery finds
 * the claim and answers "duplicate" with the stored result, a concurrent one waits on the key and
 * then does the same. A conflict or a rejection rolls the transaction back, so nothing at all is
 * written for it. Operations on different record chains run side by side; those on one chain run
 * in the order sent.
 */

type Db = Kysely<Database>;
type Trx = Transaction<Database>;

export interface Pusher {
  id: string;
  memberships: Pick<SessionUser["memberships"][number], "projectId" | "role">[];
}

export interface PushHooks {
  /** Called after an op's transaction committed, before its answer is returned (tests use it to lose answers). */
  afterCommit?: (op: SyncOp, result: OpResult) => void | Promise<void>;
}

const CHAINS_AT_ONCE = 8;

/** Ends the op's transaction with an answer: thrown inside it so everything it wrote rolls back. */
class Answer extends Error {
  constructor(readonly result: OpResult) {
    super(result.status);
  }
}

const rejected = (op: SyncOp, code: string, message: string, fields?: Record<string, string[]>): OpResult => ({
  opId: op.opId,
  status: "rejected",
  error: { code, message, ...(fields ? { fields } : {}) },
});

/** The calendar day of an instant in the device's time zone, or null for an unknown zone. */
function localDay(instant: string, timeZone: string): string | null {
  try {
    return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(
      new Date(instant),
    );
  } catch {
    return null;
  }
}

function precheck(op: SyncOp, user: Pusher): { payload: RecordPayload; day: string } | OpResult {
  const parsed = recordPayloadSchema.safeParse(op.payload);
  if (!parsed.success) {
    const fields = zodFields(parsed.error);
    return rejected(op, "INVALID_INPUT", `Check the record: ${Object.keys(fields).join(", ")}.`, fields);
  }
  const p = parsed.data;
  if (op.kind === "create" && (p.revision !== 1 || p.chainId !== op.recordId || op.baseVersion !== undefined)) {
    return rejected(op, "INVALID_INPUT", "A new record is revision 1 of its own chain, with no base version.", {
      revision: ["Must be 1 for a new record."],
    });
  }
  if (
    op.kind === "revise" &&
    (op.baseVersion === undefined || p.revision !== op.baseVersion + 1 || p.chainId === op.recordId)
  ) {
    return rejected(
      op,
      "INVALID_INPUT",
      "A correction names the version it corrects and is the next revision of that chain.",
      {
        baseVersion: ["A correction needs baseVersion, and its revision must be baseVersion + 1."],
      },
    );
  }
  const day = localDay(p.deviceTime, p.deviceTimeZone);
  if (!day)
    return rejected(op, "INVALID_INPUT", "The device time zone is not one the server knows.", {
      deviceTimeZone: ["Unknown time zone."],
    });
  const membership = user.memberships.find((m) => m.projectId === p.projectId);
  if (!membership) return rejected(op, "NOT_FOUND", "No such project among yours.");
  if (!can(membership.role, "record.create"))
    return rejected(op, "FORBIDDEN", `Your role on this project (${membership.role}) does not allow recording.`);
  if (p.authorUserId !== user.id) {
    return rejected(
      op,
      "FORBIDDEN",
      "This record was made by another person on this tablet; it is sent when they sign in.",
      {
        authorUserId: ["Not the signed-in person."],
      },
    );
  }
  return { payload: p, day };
}

/** The tendon, its pour, the equipment set and the calibration, each within the payload's project. */
async function loadRefs(trx: Trx, p: RecordPayload) {
  return trx
    .selectFrom("tendons")
    .innerJoin("pours", (j) =>
      j.onRef("pours.id", "=", "tendons.pour_id").onRef("pours.project_id", "=", "tendons.project_id"),
    )
    .leftJoin("equipment_sets", (j) =>
      j.on("equipment_sets.id", "=", p.equipmentSetId).onRef("equipment_sets.project_id", "=", "tendons.project_id"),
    )
    .leftJoin("calibrations", (j) =>
      j
        .on("calibrations.id", "=", p.calibrationId ?? "00000000-0000-0000-0000-000000000000")
        .onRef("calibrations.equipment_set_id", "=", "equipment_sets.id")
        .onRef("calibrations.project_id", "=", "tendons.project_id"),
    )
    .select([
      "tendons.pour_id",
      "tendons.ends",
      "equipment_sets.id as setId",
      "calibrations.id as calibrationId",
      "calibrations.valid_until",
    ])
    .where("tendons.project_id", "=", p.projectId)
    .where("tendons.id", "=", p.tendonId)
    .executeTakeFirst();
}

function refProblem(
  op: SyncOp,
  p: RecordPayload,
  day: string,
  refs: Awaited<ReturnType<typeof loadRefs>>,
): OpResult | null {
  if (!refs)
    return rejected(op, "NOT_FOUND", "No such tendon on this project.", {
      tendonId: ["Not a tendon of this project."],
    });
  if (refs.pour_id !== p.pourId)
    return rejected(op, "INVALID_INPUT", "The tendon is not in that pour.", { pourId: ["Not the tendon's pour."] });
  if (refs.ends !== "both" && refs.ends !== p.tendonEnd) {
    return rejected(op, "INVALID_INPUT", `This tendon is stressed at end ${refs.ends} only.`, {
      tendonEnd: [`Only end ${refs.ends}.`],
    });
  }
  if (!refs.setId)
    return rejected(op, "NOT_FOUND", "No such equipment set on this project.", {
      equipmentSetId: ["Not a set of this project."],
    });
  if (p.calibrationId && !refs.calibrationId) {
    return rejected(op, "NOT_FOUND", "That calibration does not belong to the equipment set.", {
      calibrationId: ["Not this set's calibration."],
    });
  }
  const expired = !refs.valid_until || refs.valid_until < day;
  if (expired && !p.expiredCalibrationReason) {
    return rejected(
      op,
      "INVALID_INPUT",
      "The equipment set's calibration had expired on the day of the record: a reason is required.",
      {
        expiredCalibrationReason: ["Say why an expired set was used."],
      },
    );
  }
  return null;
}

/** A record already stored under this id: the same values (a re-delivery under a new op id) or not. */
async function sameRecordStored(trx: Trx, recordId: string, p: RecordPayload): Promise<boolean | null> {
  const row = await trx
    .selectFrom("records")
    .select([
      "project_id",
      "tendon_id",
      "tendon_end",
      "chain_id",
      "revision",
      "measured_mm",
      "final_pressure_mpa",
      "equipment_set_id",
      "device_time",
      "author_user_id",
    ])
    .where("id", "=", recordId)
    .executeTakeFirst();
  if (!row) return null;
  return (
    row.project_id === p.projectId &&
    row.tendon_id === p.tendonId &&
    row.tendon_end === p.tendonEnd &&
    row.chain_id === p.chainId &&
    row.revision === p.revision &&
    row.measured_mm === p.measuredMm &&
    row.final_pressure_mpa === p.finalPressureMPa &&
    row.equipment_set_id === p.equipmentSetId &&
    new Date(row.device_time).getTime() === new Date(p.deviceTime).getTime() &&
    row.author_user_id === p.authorUserId
  );
}

async function insertRecord(trx: Trx, recordId: string, deviceId: string, p: RecordPayload): Promise<boolean> {
  const inserted = await trx
    .insertInto("records")
    .values({
      id: recordId,
      project_id: p.projectId,
      pour_id: p.pourId,
      tendon_id: p.tendonId,
      tendon_end: p.tendonEnd,
      chain_id: p.chainId,
      revision: p.revision,
      base_record_id: p.baseRecordId,
      revision_reason: p.revisionReason,
      equipment_set_id: p.equipmentSetId,
      calibration_id: p.calibrationId,
      expired_calibration_reason: p.expiredCalibrationReason,
      initial_pressure_mpa: p.initialPressureMPa,
      final_pressure_mpa: p.finalPressureMPa,
      reading_method: p.readingMethod,
      entered: JSON.stringify(p.entered),
      measured_mm: p.measuredMm,
      seating_mm: p.seatingMm,
      wire_breaks: p.wireBreaks,
      remarks: p.remarks,
      device_time: p.deviceTime,
      device_time_zone: p.deviceTimeZone,
      device_id: deviceId,
      author_user_id: p.authorUserId,
    })
    .onConflict((oc) => oc.doNothing())
    .returning("id")
    .executeTakeFirst();
  return Boolean(inserted);
}

async function duplicateOf(trx: Trx, op: SyncOp, user: Pusher): Promise<OpResult> {
  const stored = await trx
    .selectFrom("applied_ops")
    .select(["user_id", "status", "result"])
    .where("op_id", "=", op.opId)
    .executeTakeFirstOrThrow();
  if (stored.user_id !== user.id)
    return rejected(op, "CONFLICT", "This operation id was already used by someone else.");
  const result = stored.result as { revision?: number; evaluation?: OpEvaluation };
  return {
    opId: op.opId,
    status: "duplicate",
    ...(result.revision ? { revision: result.revision } : {}),
    ...(result.evaluation ? { evaluation: result.evaluation } : {}),
  };
}

function databaseRefusal(op: SyncOp, error: unknown): OpResult | null {
  const code = (error as { code?: unknown })?.code;
  // Class 22 (data exception) and 23 (integrity constraint): the row itself is refused.
  if (typeof code === "string" && /^2[23]/.test(code)) {
    return rejected(op, "INVALID_INPUT", `The database refused this record (${(error as Error).message}).`);
  }
  return null;
}

async function applyOp(
  db: Db,
  input: { user: Pusher; deviceId: string; hooks?: PushHooks },
  op: SyncOp,
): Promise<OpResult> {
  const { user, deviceId } = input;
  const checked = precheck(op, user);
  if ("status" in checked) {
    if (checked.error?.code === "FORBIDDEN" || checked.error?.code === "NOT_FOUND") {
      await recordAudit(db, {
        action: "record.create",
        outcome: "denied",
        actorUserId: user.id,
        target: op.recordId,
        detail: { opId: op.opId, reason: checked.error.message },
      });
    }
    return checked;
  }
  const { payload: p, day } = checked;
  let result: OpResult;
  try {
    result = await db.transaction().execute(async (trx) => {
      const claimed = await trx
        .insertInto("applied_ops")
        .values({
          op_id: op.opId,
          project_id: p.projectId,
          device_id: deviceId,
          user_id: user.id,
          kind: op.kind,
          record_id: op.recordId,
          status: "applied",
        })
        .onConflict((oc) => oc.column("op_id").doNothing())
        .returning("op_id")
        .executeTakeFirst();
      if (!claimed) throw new Answer(await duplicateOf(trx, op, user));

      const problem = refProblem(op, p, day, await loadRefs(trx, p));
      if (problem) throw new Answer(problem);

      if (op.kind === "revise") {
        const head = await trx
          .selectFrom("records")
          .select(["id", "revision", "tendon_id", "tendon_end"])
          .where("project_id", "=", p.projectId)
          .where("chain_id", "=", p.chainId)
          .orderBy("revision", "desc")
          .limit(1)
          .executeTakeFirst();
        if (!head)
          throw new Answer(
            rejected(op, "NOT_FOUND", "There is no record to correct: its first revision has not reached the server."),
          );
        if (head.tendon_id !== p.tendonId || head.tendon_end !== p.tendonEnd) {
          throw new Answer(
            rejected(
              op,
              "INVALID_INPUT",
              "A correction stays on the same tendon end; record the other end as a new record.",
              { tendonId: ["Not the corrected record's tendon."] },
            ),
          );
        }
        if (head.revision !== op.baseVersion || head.id !== p.baseRecordId) {
          throw new Answer({
            opId: op.opId,
            status: "conflict",
            revision: head.revision,
            headRecordId: head.id,
            error: {
              code: "CONFLICT",
              message: `This record was corrected elsewhere first (the server has revision ${head.revision}); nothing was saved.`,
            },
          });
        }
      }

      if (!(await insertRecord(trx, op.recordId, deviceId, p))) {
        const same = await sameRecordStored(trx, op.recordId, p);
        if (same) throw new Answer({ opId: op.opId, status: "duplicate", revision: p.revision });
        const error: OpError =
          same === false
            ? {
                code: "CONFLICT",
                message: "A record with this id is already stored with other values; nothing was saved.",
              }
            : {
                code: "CONFLICT",
                message: `Revision ${p.revision} of this record was saved from elsewhere first; nothing was saved.`,
              };
        throw new Answer({ opId: op.opId, status: "conflict", error });
      }

      // The server's verdict, flags and queued e-mail, in this same transaction.
      const outcome = await evaluateTendon(trx, { projectId: p.projectId, tendonId: p.tendonId, reason: "sync" });
      const evaluation: OpEvaluation = {
        verdict: outcome.verdict,
        provisional: outcome.provisional,
        deviationPct: outcome.deviationPct,
        flagKinds: outcome.flagKinds,
      };
      const applied: OpResult = { opId: op.opId, status: "applied", revision: p.revision, evaluation };
      await trx
        .updateTable("applied_ops")
        .set({ result: JSON.stringify({ revision: p.revision, evaluation }) })
        .where("op_id", "=", op.opId)
        .execute();
      await recordAudit(trx, {
        action: op.kind === "create" ? "record.create" : "record.revise",
        outcome: "success",
        actorUserId: user.id,
        projectId: p.projectId,
        target: op.recordId,
        detail: { opId: op.opId, revision: p.revision, deviceId },
      });
      return applied;
    });
  } catch (error) {
    if (error instanceof Answer) return error.result;
    const refusal = databaseRefusal(op, error);
    if (refusal) return refusal;
    throw error;
  }
  await input.hooks?.afterCommit?.(op, result);
  return result;
}

function chainKey(op: SyncOp): string {
  const chainId = (op.payload as { chainId?: unknown } | null)?.chainId;
  return typeof chainId === "string" ? chainId : op.opId;
}

export async function pushOps(
  db: Db,
  input: { user: Pusher; deviceId: string; ops: SyncOp[]; hooks?: PushHooks },
): Promise<PushResponse> {
  const results = new Array<OpResult>(input.ops.length);
  const chains = new Map<string, number[]>();
  input.ops.forEach((op, i) => {
    const key = chainKey(op);
    chains.set(key, [...(chains.get(key) ?? []), i]);
  });
  const queue = [...chains.values()];
  const worker = async () => {
    for (let chain = queue.shift(); chain; chain = queue.shift()) {
      for (const i of chain) results[i] = await applyOp(db, input, input.ops[i]!);
    }
  };
  await Promise.all(Array.from({ length: Math.min(CHAINS_AT_ONCE, queue.length) }, worker));
  return { results };
}
