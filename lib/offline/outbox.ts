import { uuidv7 } from "uuidv7";
import type { RecordPayload } from "@/lib/schemas/record";
import type { DetensionPayload } from "@/lib/schemas/detension";
import type { LiftoffPayload } from "@/lib/schemas/liftoff";
import type { TailCutPayload } from "@/lib/schemas/tail-cut";
import type { OpResult } from "@/lib/schemas/sync";
import type {
  FieldDb,
  LocalDetension,
  LocalLiftoffCheck,
  LocalPhoto,
  LocalRecord,
  LocalVerdict,
  OutboxEntry,
} from "./db";

/**
 * The durable outbox. A record and its operation are written in one IndexedDB transaction, so a
 * record never exists here without the op that will send it. An op leaves the outbox only when
 * the server answers applied or duplicate; conflict and rejected move it to "needs attention",
 * with the server's reason, for a person to deal with.
 */

export class OutboxWriteError extends Error {}

export interface SaveInput {
  payload: RecordPayload;
  recordId: string;
  authorName: string;
  local: LocalVerdict | null;
  photos?: Omit<LocalPhoto, "recordId" | "projectId" | "state" | "uploadedBytes">[];
  now?: Date;
}

/** Saves a new record (revision 1, or a correction naming its base) with its outbox op. */
export async function saveRecord(db: FieldDb, input: SaveInput): Promise<{ recordId: string; opId: string }> {
  const { payload, recordId } = input;
  const opId = crypto.randomUUID();
  const now = (input.now ?? new Date()).toISOString();
  const record: LocalRecord = {
    ...payload,
    id: recordId,
    syncState: "pending",
    authorName: input.authorName,
    savedAt: now,
    local: input.local,
    server: null,
    supersededBy: null,
  };
  const entry: OutboxEntry = {
    opId,
    kind: payload.revision === 1 ? "create" : "revise",
    recordId,
    ...(payload.revision > 1 ? { baseVersion: payload.revision - 1 } : {}),
    payload,
    authorUserId: payload.authorUserId,
    state: "pending",
    createdAt: now,
    attempts: 0,
  };
  await db.transaction("rw", [db.records, db.outbox, db.photos, db.pours], async () => {
    const pour = await db.pours.get(payload.pourId);
    if (pour?.release) {
      throw new OutboxWriteError(
        `${pour.name} was released by ${pour.release.by}: it takes no new record unless the engineer of record reopens it. Nothing was saved.`,
      );
    }
    if (payload.baseRecordId) {
      const base = await db.records.get(payload.baseRecordId);
      if (!base) throw new OutboxWriteError("The record being corrected is not on this tablet.");
      if (base.supersededBy)
        throw new OutboxWriteError("This record was already corrected: correct the newest revision.");
      await db.records.update(base.id, { supersededBy: recordId });
    }
    await db.records.add(record);
    await db.outbox.add(entry);
    for (const photo of input.photos ?? []) {
      await db.photos.add({ ...photo, recordId, projectId: payload.projectId, state: "queued", uploadedBytes: 0 });
    }
  });
  // Read back what was written: a write the browser lost quietly must not look saved.
  const [savedRecord, savedOps] = await Promise.all([
    db.records.get(recordId),
    db.outbox.where("opId").equals(opId).count(),
  ]);
  if (!savedRecord || savedOps !== 1)
    throw new OutboxWriteError("The tablet did not keep the record. Nothing was saved; try again.");
  return { recordId, opId };
}

/** A correction: the next revision of the chain whose newest revision is `head`, with a reason. */
export function correctionOf(
  head: LocalRecord,
  changes: Partial<RecordPayload>,
  reason: string,
  now = new Date(),
): { recordId: string; payload: RecordPayload } {
  const { id, syncState, authorName, savedAt, local, server, supersededBy, ...payload } = head;
  void syncState;
  void authorName;
  void savedAt;
  void local;
  void server;
  void supersededBy;
  return {
    recordId: uuidv7(),
    payload: {
      ...payload,
      ...changes,
      revision: head.revision + 1,
      baseRecordId: id,
      revisionReason: reason,
      deviceTime: now.toISOString(),
    },
  };
}

/** The ops of one person waiting to be pushed, oldest first. */
export async function pendingOps(db: FieldDb, authorUserId: string, limit: number): Promise<OutboxEntry[]> {
  const all = await db.outbox
    .orderBy("seq")
    .filter((e) => e.state === "pending" && e.authorUserId === authorUserId)
    .limit(limit)
    .toArray();
  return all;
}

/** Takes the server's answers into the outbox and the records, in one transaction. */
export async function applyPushResults(
  db: FieldDb,
  results: OpResult[],
): Promise<{ confirmed: number; attention: number }> {
  let confirmed = 0;
  let attention = 0;
  await db.transaction("rw", [db.outbox, db.records, db.tailCuts, db.liftoffChecks, db.detensions], async () => {
    for (const result of results) {
      const entry = await db.outbox.where("opId").equals(result.opId).first();
      if (!entry || entry.state !== "pending") continue;
      if (result.status === "retry-later") {
        // Nothing stored: the op stays pending and goes with the next push.
        await db.outbox.update(entry.seq!, { attempts: entry.attempts + 1, lastError: result.error?.message ?? null });
        continue;
      }
      if (result.status === "applied" || result.status === "duplicate") {
        await db.outbox.delete(entry.seq!);
        if (entry.kind === "tails_cut") {
          await db.tailCuts
            .where("id")
            .equals(entry.recordId)
            .modify({
              syncState: "synced",
              ...(result.tailCut ? { heldReasons: result.tailCut.reasons } : {}),
            });
          confirmed++;
          continue;
        }
        if (entry.kind === "liftoff_check") {
          await db.liftoffChecks.update(entry.recordId, { syncState: "synced", ...(result.liftoffCheck ?? {}) });
          confirmed++;
          continue;
        }
        if (entry.kind === "detension") {
          await db.detensions.update(entry.recordId, { syncState: "synced" });
          confirmed++;
          continue;
        }
        await db.records.update(entry.recordId, {
          syncState: "synced",
          ...(result.evaluation ? { server: result.evaluation } : {}),
        });
        confirmed++;
      } else {
        await db.outbox.update(entry.seq!, {
          state: "attention",
          status: result.status,
          error: result.error ?? {
            code: result.status === "conflict" ? "CONFLICT" : "INVALID_INPUT",
            message: `The server answered ${result.status}.`,
          },
          lastError: result.error?.message ?? null,
        });
        if (entry.kind === "tails_cut")
          await db.tailCuts.where("id").equals(entry.recordId).modify({ syncState: result.status });
        else if (entry.kind === "liftoff_check")
          await db.liftoffChecks.update(entry.recordId, { syncState: result.status });
        else if (entry.kind === "detension") await db.detensions.update(entry.recordId, { syncState: result.status });
        else await db.records.update(entry.recordId, { syncState: result.status });
        attention++;
      }
    }
  });
  return { confirmed, attention };
}

/** Counts that an ongoing error should not hide: note the failure on each pending op. */
export async function notePushFailure(db: FieldDb, seqs: number[], message: string): Promise<void> {
  await db.transaction("rw", db.outbox, async () => {
    for (const seq of seqs) {
      const entry = await db.outbox.get(seq);
      if (entry) await db.outbox.update(seq, { attempts: entry.attempts + 1, lastError: message });
    }
  });
}

export interface OutboxStatus {
  pending: number;
  oldestPendingAt: string | null;
  attention: number;
  photosQueued: number;
}

export async function outboxStatus(db: FieldDb): Promise<OutboxStatus> {
  return db.transaction("r", [db.outbox, db.photos], async () => {
    const pending = await db.outbox.where("state").equals("pending").toArray();
    return {
      pending: pending.length,
      oldestPendingAt: pending.reduce<string | null>(
        (oldest, e) => (!oldest || e.createdAt < oldest ? e.createdAt : oldest),
        null,
      ),
      attention: await db.outbox.where("state").equals("attention").count(),
      photosQueued: await db.photos.where("state").anyOf("queued", "uploading", "failed").count(),
    };
  });
}

/**
 * Sends a refused op again under the same op id (safe: the server never applied it), once a
 * person has dealt with the cause, say by signing in as its author.
 */
export async function requeue(db: FieldDb, opId: string): Promise<void> {
  await db.transaction("rw", [db.outbox, db.records, db.tailCuts, db.liftoffChecks, db.detensions], async () => {
    const entry = await db.outbox.where("opId").equals(opId).first();
    if (entry?.state !== "attention") return;
    await db.outbox.update(entry.seq!, { state: "pending", status: undefined, error: undefined });
    if (entry.kind === "tails_cut")
      await db.tailCuts.where("id").equals(entry.recordId).modify({ syncState: "pending" });
    else if (entry.kind === "liftoff_check") await db.liftoffChecks.update(entry.recordId, { syncState: "pending" });
    else if (entry.kind === "detension") await db.detensions.update(entry.recordId, { syncState: "pending" });
    else await db.records.update(entry.recordId, { syncState: "pending" });
  });
}

export interface TailCutInput {
  projectId: string;
  pourId: string;
  tendonIds: string[];
  authorUserId: string;
  authorName: string;
  now?: Date;
}

/**
 * Records "tails cut" on tendons (one, or every clear tendon of a pour), each with its outbox op,
 * in one transaction. The caller passes only tendons it showed as clear; a tendon already cut
 * here is refused, and a released pour takes cuts (cutting tails is what the release is for).
 */
export async function saveTailCuts(db: FieldDb, input: TailCutInput): Promise<{ opIds: string[] }> {
  if (!input.tendonIds.length) throw new OutboxWriteError("No tendon is clear to cut. Nothing was saved.");
  const cutAt = (input.now ?? new Date()).toISOString();
  const opIds: string[] = [];
  await db.transaction("rw", [db.tailCuts, db.outbox, db.tendons], async () => {
    for (const tendonId of input.tendonIds) {
      const tendon = await db.tendons.get(tendonId);
      if (!tendon || tendon.pourId !== input.pourId)
        throw new OutboxWriteError("A tendon to cut is not in this pour on this tablet. Nothing was saved.");
      if (await db.tailCuts.get(tendonId))
        throw new OutboxWriteError(`The tails of ${tendon.tag} are already recorded as cut. Nothing was saved.`);
      const id = uuidv7();
      const opId = crypto.randomUUID();
      const payload: TailCutPayload = {
        projectId: input.projectId,
        pourId: input.pourId,
        tendonId,
        cutAt,
        authorUserId: input.authorUserId,
      };
      await db.tailCuts.add({
        id,
        projectId: input.projectId,
        pourId: input.pourId,
        tendonId,
        cutAt,
        cutByName: input.authorName,
        heldReasons: [],
        syncState: "pending",
      });
      await db.outbox.add({
        opId,
        kind: "tails_cut",
        recordId: id,
        payload,
        authorUserId: input.authorUserId,
        state: "pending",
        createdAt: cutAt,
        attempts: 0,
      });
      opIds.push(opId);
    }
  });
  const saved = await db.outbox.where("opId").anyOf(opIds).count();
  if (saved !== opIds.length)
    throw new OutboxWriteError("The tablet did not keep the tails cut. Nothing was saved; try again.");
  return { opIds };
}

export interface LiftoffCheckInput {
  payload: LiftoffPayload;
  /** The pressure read into MPa on the tablet, for showing until the server answers. */
  pressureMPa: number;
  authorName: string;
}

/**
 * Records a lift-off check with its outbox op (kind liftoff_check) in one transaction. The caller
 * has read the pressure and checked it against the set's calibrated range; the server judges it.
 */
export async function saveLiftoffCheck(
  db: FieldDb,
  input: LiftoffCheckInput,
): Promise<{ checkId: string; opId: string }> {
  const { payload } = input;
  const checkId = uuidv7();
  const opId = crypto.randomUUID();
  await db.transaction("rw", [db.liftoffChecks, db.outbox, db.tendons], async () => {
    const tendon = await db.tendons.get(payload.tendonId);
    if (!tendon || tendon.pourId !== payload.pourId)
      throw new OutboxWriteError("The tendon is not in this pour on this tablet. Nothing was saved.");
    const check: LocalLiftoffCheck = {
      id: checkId,
      projectId: payload.projectId,
      pourId: payload.pourId,
      tendonId: payload.tendonId,
      dispositionId: payload.dispositionId,
      tendonEnd: payload.tendonEnd,
      equipmentSetId: payload.equipmentSetId,
      pressureMPa: input.pressureMPa,
      entered: { pressure: payload.pressure, unit: payload.pressureUnit },
      checkedAt: payload.checkedAt,
      checkedByName: input.authorName,
      syncState: "pending",
    };
    await db.liftoffChecks.add(check);
    await db.outbox.add({
      opId,
      kind: "liftoff_check",
      recordId: checkId,
      payload,
      authorUserId: payload.authorUserId,
      state: "pending",
      createdAt: payload.checkedAt,
      attempts: 0,
    });
  });
  if (!(await db.outbox.where("opId").equals(opId).count()))
    throw new OutboxWriteError("The tablet did not keep the lift-off check. Nothing was saved; try again.");
  return { checkId, opId };
}

export interface DetensionInput {
  payload: DetensionPayload;
  /** The pressure at release read into MPa on the tablet, null when none was read. */
  releasePressureMPa: number | null;
  authorName: string;
}

/**
 * Records a detension with its outbox op (kind detension) in one transaction. The caller has
 * checked the form; the server checks again that the engineer ordered it.
 */
export async function saveDetension(
  db: FieldDb,
  input: DetensionInput,
): Promise<{ detensionId: string; opId: string }> {
  const { payload } = input;
  const detensionId = uuidv7();
  const opId = crypto.randomUUID();
  await db.transaction("rw", [db.detensions, db.outbox, db.tendons], async () => {
    const tendon = await db.tendons.get(payload.tendonId);
    if (!tendon || tendon.pourId !== payload.pourId)
      throw new OutboxWriteError("The tendon is not in this pour on this tablet. Nothing was saved.");
    const detension: LocalDetension = {
      id: detensionId,
      projectId: payload.projectId,
      pourId: payload.pourId,
      tendonId: payload.tendonId,
      dispositionId: payload.dispositionId,
      detensionedAt: payload.detensionedAt,
      operatorName: payload.operatorName,
      equipmentSetId: payload.equipmentSetId,
      entered: payload.pressure ? { pressure: payload.pressure, unit: payload.pressureUnit } : null,
      releasePressureMPa: input.releasePressureMPa,
      strandsDetensioned: payload.strandsDetensioned,
      remarks: payload.remarks || null,
      recordedByName: input.authorName,
      syncState: "pending",
    };
    await db.detensions.add(detension);
    await db.outbox.add({
      opId,
      kind: "detension",
      recordId: detensionId,
      payload,
      authorUserId: payload.authorUserId,
      state: "pending",
      createdAt: new Date().toISOString(),
      attempts: 0,
    });
  });
  if (!(await db.outbox.where("opId").equals(opId).count()))
    throw new OutboxWriteError("The tablet did not keep the detension. Nothing was saved; try again.");
  return { detensionId, opId };
}
