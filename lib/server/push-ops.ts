import "server-only";
import { duplicateOf, findClaim, rejectedOp, type OpClaim } from "./applied-ops";
import { setTimeout as sleep } from "node:timers/promises";
import { sql, type Kysely } from "kysely";
import { jsonArrayFrom, jsonObjectFrom } from "kysely/helpers/postgres";
import { reusableQuery } from "@/db/reusable-query";
import type { Database } from "@/db/types";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/session";
import { zodFields } from "@/lib/schemas/zod-fields";
import { recordPayloadSchema, type RecordPayload } from "@/lib/schemas/record";
import type { OpError, OpEvaluation, OpResult, PushResponse, SyncOp } from "@/lib/schemas/sync";
import {
  evaluationWrites,
  lostConcreteFlagRace,
  planEvaluation,
  raiseVersionFrom,
  selectTendonState,
  stateFromRow,
  writeTogether,
  type EvaluatedRecord,
} from "./evaluate-tendon";
import { auditInsert, recordAudit } from "./record-audit";
import { recordDetension } from "./record-detension";
import { recordLiftoffCheck } from "./record-liftoff-check";
import { recordTailCut } from "./record-tail-cut";
import { databaseRefusal } from "./database-refusal";
import { isReleasedPourRefusal, RELEASED_POUR_MESSAGE } from "./require-open-pour";

/**
 * Applies a batch of the tablet's operations. Each operation is one transaction: a single
 * statement that claims its op id in applied_ops (the permanent idempotency key), stores the
 * record, the server's evaluation with its flags and e-mail, the op's result and the audit row,
 * and raises the tendon's version from the one read before. It ends in sync_write_guard, which
 * refuses the whole statement unless the claim, the version and the record each wrote their
 * row, so nothing at all is written for an op that loses:
 *
 * - a second delivery finds the claim and answers "duplicate" with the stored result (the
 *   claims of a whole batch are looked up in one query before its ops run, so a re-sent batch
 *   costs no read of any tendon); a concurrent one on the same server waits for the first to
 *   end and then does the same, and one that got as far as its write (on another server) waits
 *   there on the key, is refused by the guard and answers from the claim;
 * - when another write stored a record of the tendon since the state was read, the op reads the
 *   state again and retries, so two ends stored at the same moment are judged together;
 * - a conflict or a rejection is decided from the read, before anything is written; the read
 *   covers every row the write could collide with, so a refused write always reads again.
 *
 * An applied op costs two round trips: the read of the tendon's state with the op's references,
 * and the write; a batch adds one, the look-up of its claims. Operations on different record chains run side by side; those on one chain run
 * in the order sent.
 */

type Db = Kysely<Database>;

export interface Pusher {
  id: string;
  memberships: Pick<SessionUser["memberships"][number], "projectId" | "role">[];
}

export interface PushHooks {
  /** Called after an op's transaction committed, before its answer is returned (tests use it to lose answers). */
  afterCommit?: (op: SyncOp, result: OpResult) => void | Promise<void>;
  /** Called between an attempt's read and its write (tests use it to let another write in first). */
  beforeWrite?: (op: SyncOp, attempt: number) => void | Promise<void>;
}

const CHAINS_AT_ONCE = 8;
/** Reads again when another write of the same tendon came first; each lost round means one landed. */
const MAX_ATTEMPTS = 20;

const rejected = rejectedOp;

class AnswerLost extends Error {
  constructor(cause: unknown) {
    super("the answer to a committed op was lost", { cause });
  }
}

const retryLater = (op: SyncOp, message: string): OpResult => ({
  opId: op.opId,
  status: "retry-later",
  error: { code: "RETRY_LATER", message },
});

const dayFormats = new Map<string, Intl.DateTimeFormat | null>();

/** The calendar day of an instant in the device's time zone, or null for an unknown zone. */
function localDay(instant: string, timeZone: string): string | null {
  if (!dayFormats.has(timeZone)) {
    let format: Intl.DateTimeFormat | null = null;
    try {
      format = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" });
    } catch {
      // an unknown zone: remembered as such
    }
    if (dayFormats.size < 1_000) dayFormats.set(timeZone, format);
    if (!format) return null;
    return format.format(new Date(instant));
  }
  return dayFormats.get(timeZone)?.format(new Date(instant)) ?? null;
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

/**
 * One read for an op: the tendon's state (basis, records, flags, sets, dispositions, version),
 * the op's claim if it was applied before, the equipment set and calibration it names within the
 * project, a record already stored under its id and the head of its chain.
 */
const opRead = reusableQuery(
  ["projectId", "tendonId", "setId", "calibrationId", "opId", "recordId", "chainId", "wireBreaks"],
  (db, a) =>
    selectTendonState(db, {
      projectId: a.projectId,
      tendonId: a.tendonId,
      alsoSetId: a.setId,
      addingWireBreaks: a.wireBreaks,
    }).select((eb) => [
      jsonObjectFrom(
        eb
          .selectFrom("applied_ops")
          .select(["applied_ops.user_id", "applied_ops.result"])
          .where("applied_ops.op_id", "=", a.opId),
      ).as("claim"),
      eb
        .selectFrom("equipment_sets")
        .select("equipment_sets.id")
        .where("equipment_sets.project_id", "=", a.projectId)
        .where("equipment_sets.id", "=", a.setId)
        .as("setId"),
      jsonObjectFrom(
        eb
          .selectFrom("calibrations")
          .select(["calibrations.id", "calibrations.valid_until"])
          .where("calibrations.project_id", "=", a.projectId)
          .where("calibrations.equipment_set_id", "=", a.setId)
          .where("calibrations.id", "=", a.calibrationId),
      ).as("calibration"),
      jsonObjectFrom(
        eb
          .selectFrom("records")
          .select([
            "records.project_id",
            "records.tendon_id",
            "records.tendon_end",
            "records.chain_id",
            "records.revision",
            "records.measured_mm",
            "records.final_pressure_mpa",
            "records.equipment_set_id",
            "records.device_time",
            "records.author_user_id",
          ])
          .where("records.id", "=", a.recordId),
      ).as("sameId"),
      jsonObjectFrom(
        eb
          .selectFrom("records")
          .select(["records.id", "records.revision", "records.tendon_id", "records.tendon_end"])
          .where("records.project_id", "=", a.projectId)
          .where("records.chain_id", "=", a.chainId)
          .orderBy("records.revision", "desc")
          .limit(1),
      ).as("chainHead"),
      // Every revision of the chain stored anywhere: the write's other unique key.
      jsonArrayFrom(eb.selectFrom("records").select("records.revision").where("records.chain_id", "=", a.chainId)).as(
        "chainRevisions",
      ),
    ]),
);

function readForOp(db: Db, op: SyncOp, p: RecordPayload) {
  return opRead.executeTakeFirst(db, {
    projectId: p.projectId,
    tendonId: p.tendonId,
    setId: p.equipmentSetId,
    calibrationId: p.calibrationId ?? "00000000-0000-0000-0000-000000000000",
    opId: op.opId,
    recordId: op.recordId,
    chainId: p.chainId,
    wireBreaks: String(p.wireBreaks),
  });
}

type OpRead = NonNullable<Awaited<ReturnType<typeof readForOp>>>;

/** The stored record under the op's id has the same values (a re-delivery under a new op id). */
function sameValues(row: NonNullable<OpRead["sameId"]>, p: RecordPayload): boolean {
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

/** What the read says of the op before anything is written: an answer, or null to go on. */
function answerFromRead(op: SyncOp, user: Pusher, p: RecordPayload, day: string, read: OpRead): OpResult | null {
  if (read.claim) return duplicateOf(op, user.id, read.claim);
  const problem = refProblem(op, p, day, {
    pour_id: read.pourId,
    ends: read.ends,
    setId: read.setId,
    calibrationId: read.calibration?.id ?? null,
    valid_until: read.calibration?.valid_until ?? null,
  });
  if (problem) return problem;

  const head = read.chainHead;
  if (op.kind === "revise") {
    if (!head)
      return rejected(op, "NOT_FOUND", "There is no record to correct: its first revision has not reached the server.");
    if (head.tendon_id !== p.tendonId || head.tendon_end !== p.tendonEnd) {
      return rejected(
        op,
        "INVALID_INPUT",
        "A correction stays on the same tendon end; record the other end as a new record.",
        {
          tendonId: ["Not the corrected record's tendon."],
        },
      );
    }
    if (head.revision !== op.baseVersion || head.id !== p.baseRecordId) {
      return {
        opId: op.opId,
        status: "conflict",
        revision: head.revision,
        headRecordId: head.id,
        error: {
          code: "CONFLICT",
          message: `This record was corrected elsewhere first (the server has revision ${head.revision}); nothing was saved.`,
        },
      };
    }
  }
  if (read.sameId) {
    if (sameValues(read.sameId, p)) return { opId: op.opId, status: "duplicate", revision: p.revision };
    const error: OpError = {
      code: "CONFLICT",
      message: "A record with this id is already stored elsewhere or with other values; nothing was saved.",
    };
    return { opId: op.opId, status: "conflict", error };
  }
  if (read.chainRevisions.some((r) => r.revision === p.revision)) {
    const error: OpError = {
      code: "CONFLICT",
      message: `Revision ${p.revision} of this record was saved from elsewhere first; nothing was saved.`,
    };
    return { opId: op.opId, status: "conflict", error };
  }
  return null;
}

/** The record as the evaluation reads it, before it is stored (its row, `recordValues`, adds to it). */
function asEvaluated(recordId: string, p: RecordPayload, receivedAt: Date): EvaluatedRecord {
  return {
    id: recordId,
    chain_id: p.chainId,
    revision: p.revision,
    tendon_end: p.tendonEnd,
    device_time: new Date(p.deviceTime),
    received_at: receivedAt,
    restress_of_disposition_id: null,
    equipment_set_id: p.equipmentSetId,
    calibration_id: p.calibrationId,
    expired_calibration_reason: p.expiredCalibrationReason,
    concrete_go_ahead: p.concreteGoAhead ?? null,
    initial_pressure_mpa: p.initialPressureMPa,
    final_pressure_mpa: p.finalPressureMPa,
    measured_mm: p.measuredMm,
    reading_method: p.readingMethod,
    entered: p.entered,
    seating_mm: p.seatingMm,
    draw_in_mm: p.drawInMm ?? null,
    stressing_order: p.stressingOrder ?? null,
    wire_breaks: p.wireBreaks,
    first_reading_mm: p.firstReadingMm ?? null,
    reread_declined_reason: p.rereadDeclinedReason ?? null,
    wire_break_details: p.wireBreakDetails ?? null,
  };
}

const RETRY = Symbol("read again");

/** sync_write_guard refused the write (its hint says which row was missing). */
const refusedByGuard = (error: unknown): boolean => (error as { code?: unknown } | null)?.code === "TL409";
/** The guard refused because the op id was claimed first: a concurrent delivery of this op committed. */
const claimedFirst = (error: unknown): boolean =>
  refusedByGuard(error) && (error as { hint?: unknown }).hint === "claim";

async function attemptOp(
  db: Db,
  input: { user: Pusher; deviceId: string; hooks?: PushHooks },
  op: SyncOp,
  p: RecordPayload,
  day: string,
  attempt: number,
): Promise<OpResult | typeof RETRY> {
  const { user, deviceId } = input;
  const read = await readForOp(db, op, p);
  if (!read)
    return rejected(op, "NOT_FOUND", "No such tendon on this project.", {
      tendonId: ["Not a tendon of this project."],
    });
  const answer = answerFromRead(op, user, p, day, read);
  if (answer) return answer;

  const receivedAt = new Date();
  const state = stateFromRow(read, asEvaluated(op.recordId, p, receivedAt));
  // A broken wire names a strand the tendon has.
  const strands = state.basis.tendon.strandCount;
  const beyond = (p.wireBreakDetails ?? []).findIndex((b) => b.strand !== null && b.strand > strands);
  if (beyond >= 0)
    return rejected(op, "INVALID_INPUT", `Break ${beyond + 1} names a strand this tendon does not have.`, {
      [`wireBreakDetails.${beyond}.strand`]: [`This tendon has ${strands} strand${strands > 1 ? "s" : ""}.`],
    });
  const plan = planEvaluation(state, {
    projectId: p.projectId,
    tendonId: p.tendonId,
    reason: "sync",
  });
  const { verdict, provisional, deviationPct, flagKinds } = plan.outcome;
  const evaluation: OpEvaluation = { verdict, provisional, deviationPct, flagKinds };
  await input.hooks?.beforeWrite?.(op, attempt);
  try {
    await writeTogether(
      db,
      {
        claim: db
          .insertInto("applied_ops")
          .values({
            op_id: op.opId,
            project_id: p.projectId,
            device_id: deviceId,
            user_id: user.id,
            kind: op.kind,
            record_id: op.recordId,
            status: "applied",
            result: JSON.stringify({ revision: p.revision, evaluation }),
          })
          .onConflict((oc) => oc.column("op_id").doNothing())
          .returning("op_id"),
        raised: raiseVersionFrom(db, p.tendonId, read.version ?? 0),
        stored: db
          .insertInto("records")
          .values(recordValues(op.recordId, deviceId, p, receivedAt))
          .onConflict((oc) => oc.doNothing())
          .returning("id"),
        ...evaluationWrites(db, plan),
        audit: auditInsert(db, {
          action: op.kind === "create" ? "record.create" : "record.revise",
          outcome: "success",
          actorUserId: user.id,
          projectId: p.projectId,
          target: op.recordId,
          detail: { opId: op.opId, revision: p.revision, deviceId },
        }),
      },
      sql`select sync_write_guard((select count(*) from claim), (select count(*) from raised), (select count(*) from stored))`,
    );
  } catch (error) {
    // A concurrent delivery of this op committed first (another server's, or one this process
    // did not see): its claim is the answer, read by its key without the tendon's state again.
    if (claimedFirst(error)) {
      const claim = await findClaim(db, op.opId);
      if (claim) return duplicateOf(op, user.id, claim);
    }
    // Another write came first: another record of the tendon (its version) or a record taking
    // this one's id or revision. The read covers each of them, so reading again tells which
    // answer is right.
    if (refusedByGuard(error) || lostConcreteFlagRace(error)) return RETRY;
    if (isReleasedPourRefusal(error)) return rejected(op, "RELEASED", RELEASED_POUR_MESSAGE, { pourId: ["Released."] });
    const refusal = refusedRow(op, error);
    if (refusal) return refusal;
    throw error;
  }
  return { opId: op.opId, status: "applied", revision: p.revision, evaluation };
}

/**
 * The claims already made for the batch's record ops, by op id, in one query: a re-delivered op
 * is answered from its claim without the read of its tendon's state. An op whose claim is not
 * there yet goes the whole way, where its read and the write's guard decide as before.
 */
async function claimsOf(db: Db, ops: SyncOp[]): Promise<Map<string, OpClaim>> {
  const ids = ops.filter((op) => op.kind === "create" || op.kind === "revise").map((op) => op.opId);
  if (!ids.length) return new Map();
  const rows = await db
    .selectFrom("applied_ops")
    .select(["op_id", "user_id", "result"])
    .where("op_id", "=", sql<string>`any(${ids}::uuid[])`)
    .execute();
  return new Map(rows.map((r) => [r.op_id, { user_id: r.user_id, result: r.result }]));
}

async function applyOp(
  db: Db,
  input: { user: Pusher; deviceId: string; hooks?: PushHooks },
  op: SyncOp,
  claimed: OpClaim | undefined,
): Promise<OpResult> {
  const { user } = input;
  if (op.kind === "tails_cut") return answered(op, await recordTailCut(db, input, op), input.hooks);
  if (op.kind === "liftoff_check") return answered(op, await recordLiftoffCheck(db, input, op), input.hooks);
  if (op.kind === "detension") return answered(op, await recordDetension(db, input, op), input.hooks);
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
  if (claimed) return duplicateOf(op, user.id, claimed);
  // Another delivery of this op id is being applied by this server (a retry racing its
  // original): wait for it and answer from its claim, instead of reading and judging the tendon
  // a second time only for the write's guard to refuse it.
  const flights = opsInFlight(db);
  for (let other = flights.get(op.opId); other; other = flights.get(op.opId)) {
    await other;
    const claim = await findClaim(db, op.opId);
    if (claim) return duplicateOf(op, user.id, claim);
  }
  const flight = applyChecked(db, input, op, checked.payload, checked.day);
  const settled = flight.then(
    () => undefined,
    () => undefined,
  );
  flights.set(op.opId, settled);
  try {
    return await flight;
  } finally {
    if (flights.get(op.opId) === settled) flights.delete(op.opId);
  }
}

async function applyChecked(
  db: Db,
  input: { user: Pusher; deviceId: string; hooks?: PushHooks },
  op: SyncOp,
  p: RecordPayload,
  day: string,
): Promise<OpResult> {
  for (let attempt = 1; ; attempt++) {
    const result = await attemptOp(db, input, op, p, day, attempt);
    if (result !== RETRY) return answered(op, result, input.hooks);
    if (attempt >= MAX_ATTEMPTS)
      throw new Error(`op ${op.opId}: the tendon kept changing under ${MAX_ATTEMPTS} attempts`);
    await sleep(Math.random() * 5 * attempt);
  }
}

/**
 * The record ops this server is applying, by op id, per database handle (one per server
 * process). Only a shortcut: a delivery that does not see its twin here (another server's, or
 * one arriving after it ended) is decided by the claim and the write's guard as before.
 */
const inFlight = new WeakMap<Db, Map<string, Promise<void>>>();

function opsInFlight(db: Db): Map<string, Promise<void>> {
  let flights = inFlight.get(db);
  if (!flights) inFlight.set(db, (flights = new Map()));
  return flights;
}

/** Calls the afterCommit hook for an applied op; a failure there stands for a lost answer. */
async function answered(op: SyncOp, result: OpResult, hooks: PushHooks | undefined): Promise<OpResult> {
  if (result.status === "applied" && hooks?.afterCommit) {
    try {
      await hooks.afterCommit(op, result);
    } catch (error) {
      throw new AnswerLost(error);
    }
  }
  return result;
}

function refProblem(
  op: SyncOp,
  p: RecordPayload,
  day: string,
  refs:
    | { pour_id: string; ends: string; setId: string | null; calibrationId: string | null; valid_until: string | null }
    | undefined,
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

/** The stored row: the record as the evaluation read it, with its JSON as text and what only the row keeps. */
function recordValues(recordId: string, deviceId: string, p: RecordPayload, receivedAt: Date) {
  const read = asEvaluated(recordId, p, receivedAt);
  return {
    ...read,
    entered: JSON.stringify(read.entered),
    wire_break_details: read.wire_break_details ? JSON.stringify(read.wire_break_details) : null,
    project_id: p.projectId,
    pour_id: p.pourId,
    tendon_id: p.tendonId,
    base_record_id: p.baseRecordId,
    revision_reason: p.revisionReason,
    remarks: p.remarks,
    device_time_zone: p.deviceTimeZone,
    device_id: deviceId,
    author_user_id: p.authorUserId,
  };
}

/** PostgreSQL refused the row itself: the same words a route would answer, never its own text. */
function refusedRow(op: SyncOp, error: unknown): OpResult | null {
  const refusal = databaseRefusal(error);
  return refusal
    ? rejected(op, refusal.code, `The server refused this record: ${refusal.message}`, refusal.fields)
    : null;
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
  // A failed look-up only loses the shortcut: each op then reads its claim with its state.
  const claims = await claimsOf(db, input.ops).catch((error: unknown) => {
    console.error("push: the batch's claims could not be read; each op reads its own", error);
    return new Map<string, OpClaim>();
  });
  const queue = [...chains.values()];
  const worker = async () => {
    for (let chain = queue.shift(); chain; chain = queue.shift()) {
      let failed = false;
      for (const i of chain) {
        // One op that cannot get through now (the tendon kept changing, a deadlock, a lost
        // connection) answers retry-later on its own, with the rest of its chain behind it; the
        // ops that were applied still say so, instead of a 500 for the whole batch.
        if (failed) {
          results[i] = retryLater(input.ops[i]!, "An earlier change to this record is waiting to be sent again.");
          continue;
        }
        try {
          results[i] = await applyOp(db, input, input.ops[i]!, claims.get(input.ops[i]!.opId));
        } catch (error) {
          // The op committed and its answer was lost (a test hook's stand-in for a dropped connection).
          if (error instanceof AnswerLost) throw error.cause;
          console.error(`push: op ${input.ops[i]!.opId} answered retry-later`, error);
          results[i] = retryLater(
            input.ops[i]!,
            "The server was busy with this tendon; this change will be sent again.",
          );
          failed = true;
        }
      }
    }
  };
  await Promise.all(Array.from({ length: Math.min(CHAINS_AT_ONCE, queue.length) }, worker));
  return { results };
}
