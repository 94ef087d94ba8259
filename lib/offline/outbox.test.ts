import { describe, expect, it } from "vitest";
import { tabletDbsClosedAfterEach } from "../../tests/support/tablet-db";
import type { OpResult } from "@/lib/schemas/sync";
import {
  applyPushResults,
  correctionOf,
  outboxStatus,
  OutboxWriteError,
  pendingOps,
  requeue,
  saveRecord,
  saveTailCuts,
} from "./outbox";
import { fieldTendon, samplePayload, TEST_USER } from "./test-support";

const freshDb = tabletDbsClosedAfterEach();

describe("saveRecord", () => {
  it("writes the record and its op together, and the op carries the payload as saved", async () => {
    const db = freshDb();
    const { recordId, payload } = samplePayload();
    const { opId } = await saveRecord(db, { recordId, payload, authorName: "Test Crew", local: null });
    const [record, ops] = await Promise.all([db.records.get(recordId), db.outbox.toArray()]);
    expect(record).toMatchObject({ id: recordId, syncState: "pending", measuredMm: 112 });
    expect(ops).toHaveLength(1);
    expect(ops[0]).toMatchObject({ opId, kind: "create", recordId, state: "pending", attempts: 0 });
    expect(ops[0]!.payload).toEqual(payload);
  });

  it("writes nothing at all when any part of the transaction fails", async () => {
    const db = freshDb();
    const { recordId, payload } = samplePayload();
    await saveRecord(db, { recordId, payload, authorName: "Test Crew", local: null });
    // The same record id again: the record insert fails, so no second op may appear.
    await expect(saveRecord(db, { recordId, payload, authorName: "Test Crew", local: null })).rejects.toThrow();
    expect(await db.outbox.count()).toBe(1);
    // A correction of a record the tablet does not hold.
    const stray = samplePayload({ revision: 2, baseRecordId: crypto.randomUUID(), revisionReason: "Misread" });
    await expect(saveRecord(db, { ...stray, authorName: "Test Crew", local: null })).rejects.toBeInstanceOf(
      OutboxWriteError,
    );
    expect(await db.records.count()).toBe(1);
    expect(await db.outbox.count()).toBe(1);
  });

  it("refuses, before saving anything, a record for a pour the last sync said is released; saves again once reopened", async () => {
    const db = freshDb();
    const { recordId, payload } = samplePayload();
    const pour = {
      id: payload.pourId,
      projectId: payload.projectId,
      name: "L2 Pour 1",
      level: null,
      plannedStressingDate: null,
      status: "released",
      release: { by: "P. Raman, P.E.", at: "2026-12-01T15:00:00.000Z", statement: "All tendons accepted." },
      reopened: null,
      downloadedAt: "2026-12-01T15:00:00.000Z",
      cursor: "1",
    };
    await db.pours.put(pour);
    await expect(saveRecord(db, { recordId, payload, authorName: "Test Crew", local: null })).rejects.toThrow(
      /L2 Pour 1 was released by P\. Raman, P\.E\.: it takes no new record/,
    );
    expect(await db.records.count()).toBe(0);
    expect(await db.outbox.count()).toBe(0);
    await db.pours.put({
      ...pour,
      status: "stressed",
      release: null,
      reopened: { by: "P. Raman, P.E.", at: "2026-12-02T09:00:00.000Z", reason: "Restress U07" },
    });
    await saveRecord(db, { recordId, payload, authorName: "Test Crew", local: null });
    expect(await db.outbox.count()).toBe(1);
  });

  it("makes a correction the next revision naming its base, and refuses to correct a superseded revision", async () => {
    const db = freshDb();
    const first = samplePayload();
    await saveRecord(db, { ...first, authorName: "Test Crew", local: null });
    const head = (await db.records.get(first.recordId))!;
    const fix = correctionOf(
      head,
      { measuredMm: 115, entered: { ...first.payload.entered, marks: { before: "0", after: "115" } } },
      "Read the wrong mark",
    );
    await saveRecord(db, { ...fix, authorName: "Test Crew", local: null });
    expect(fix.payload).toMatchObject({
      revision: 2,
      baseRecordId: first.recordId,
      chainId: first.recordId,
      revisionReason: "Read the wrong mark",
    });
    const ops = await db.outbox.orderBy("seq").toArray();
    expect(ops.map((o) => [o.kind, o.baseVersion])).toEqual([
      ["create", undefined],
      ["revise", 1],
    ]);
    expect((await db.records.get(first.recordId))!.supersededBy).toBe(fix.recordId);
    const again = correctionOf(head, {}, "Second try on the old revision");
    await expect(saveRecord(db, { ...again, authorName: "Test Crew", local: null })).rejects.toThrow(
      /already corrected/,
    );
  });
});

describe("applyPushResults", () => {
  it("removes an op only on applied or duplicate; conflict and rejected go to needs attention with the reason", async () => {
    const db = freshDb();
    const saved = [];
    for (let i = 0; i < 4; i++) {
      const s = samplePayload();
      saved.push({ ...s, ...(await saveRecord(db, { ...s, authorName: "Test Crew", local: null })) });
    }
    const results: OpResult[] = [
      {
        opId: saved[0]!.opId,
        status: "applied",
        revision: 1,
        evaluation: { verdict: "in band", provisional: false, deviationPct: 1.2, flagKinds: [] },
      },
      { opId: saved[1]!.opId, status: "duplicate", revision: 1 },
      { opId: saved[2]!.opId, status: "conflict", error: { code: "CONFLICT", message: "Corrected elsewhere first" } },
      {
        opId: saved[3]!.opId,
        status: "rejected",
        error: { code: "INVALID_INPUT", message: "No such tendon", fields: { tendonId: ["x"] } },
      },
    ];
    expect(await applyPushResults(db, results)).toEqual({ confirmed: 2, attention: 2 });
    const left = await db.outbox.toArray();
    expect(left.map((e) => [e.opId, e.state, e.status, e.error?.message])).toEqual([
      [saved[2]!.opId, "attention", "conflict", "Corrected elsewhere first"],
      [saved[3]!.opId, "attention", "rejected", "No such tendon"],
    ]);
    const states = await Promise.all(saved.map((s) => db.records.get(s.recordId)));
    expect(states.map((r) => r!.syncState)).toEqual(["synced", "synced", "conflict", "rejected"]);
    expect(states[0]!.server?.verdict).toBe("in band");
    expect(await outboxStatus(db)).toMatchObject({ pending: 0, attention: 2 });

    await requeue(db, saved[3]!.opId);
    expect(await pendingOps(db, TEST_USER.userId, 10)).toHaveLength(1);
  });

  it("reports the oldest pending op and counts only the signed-in person's ops as theirs to push", async () => {
    const db = freshDb();
    const mine = samplePayload();
    const theirs = samplePayload({ authorUserId: "0190a0b0-0000-7000-8000-000000000002" });
    await saveRecord(db, { ...mine, authorName: "Test Crew", local: null, now: new Date("2026-12-02T09:00:00Z") });
    await saveRecord(db, { ...theirs, authorName: "Other Crew", local: null, now: new Date("2026-12-02T10:00:00Z") });
    expect(await outboxStatus(db)).toMatchObject({
      pending: 2,
      oldestPendingAt: "2026-12-02T09:00:00.000Z",
      attention: 0,
    });
    expect((await pendingOps(db, TEST_USER.userId, 10)).map((e) => e.recordId)).toEqual([mine.recordId]);
  });
});

describe("saveTailCuts", () => {
  const PROJECT = "0190a0b0-0000-7000-8000-0000000000aa";
  const POUR = "0190a0b0-0000-7000-8000-0000000000bb";
  const tendon = (id: string, tag: string) => fieldTendon({ id, projectId: PROJECT, pourId: POUR, tag });
  const T1 = "0190a0b0-0000-7000-8000-0000000000c1";
  const T2 = "0190a0b0-0000-7000-8000-0000000000c2";
  const input = (tendonIds: string[]) => ({
    projectId: PROJECT,
    pourId: POUR,
    tendonIds,
    authorUserId: TEST_USER.userId,
    authorName: TEST_USER.name,
    now: new Date("2026-12-02T15:00:00.000Z"),
  });

  it("writes a cut and a tails_cut op per tendon, and the server's answer marks them received", async () => {
    const db = freshDb();
    await db.tendons.bulkPut([tendon(T1, "U01"), tendon(T2, "U02")]);
    const { opIds } = await saveTailCuts(db, input([T1, T2]));
    const ops = await db.outbox.toArray();
    expect(ops.map((o) => o.kind)).toEqual(["tails_cut", "tails_cut"]);
    expect(ops[0]!.payload).toEqual({
      projectId: PROJECT,
      pourId: POUR,
      tendonId: T1,
      cutAt: "2026-12-02T15:00:00.000Z",
      authorUserId: TEST_USER.userId,
    });
    expect((await db.tailCuts.get(T1))!).toMatchObject({
      id: ops[0]!.recordId,
      syncState: "pending",
      cutByName: "Test Crew",
    });

    const results: OpResult[] = [
      { opId: opIds[0]!, status: "applied", tailCut: { held: false, reasons: [] } },
      { opId: opIds[1]!, status: "applied", tailCut: { held: true, reasons: ["1 flag is still open."] } },
    ];
    expect(await applyPushResults(db, results)).toEqual({ confirmed: 2, attention: 0 });
    expect(await db.outbox.count()).toBe(0);
    expect((await db.tailCuts.get(T1))!.syncState).toBe("synced");
    expect((await db.tailCuts.get(T2))!.heldReasons).toEqual(["1 flag is still open."]);
  });

  it("refuses a tendon already cut here or not in the pour, and then writes nothing at all", async () => {
    const db = freshDb();
    await db.tendons.bulkPut([tendon(T1, "U01"), tendon(T2, "U02")]);
    await saveTailCuts(db, input([T1]));
    await expect(saveTailCuts(db, input([T2, T1]))).rejects.toThrow("U01 are already recorded as cut");
    await expect(saveTailCuts(db, input([crypto.randomUUID()]))).rejects.toBeInstanceOf(OutboxWriteError);
    await expect(saveTailCuts(db, input([]))).rejects.toThrow("No tendon is clear to cut");
    expect(await db.tailCuts.count()).toBe(1);
    expect(await db.outbox.count()).toBe(1);
  });
});
