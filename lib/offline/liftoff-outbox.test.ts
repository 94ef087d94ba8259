import { describe, expect, it } from "vitest";
import { tabletDbsClosedAfterEach } from "../../tests/support/tablet-db";
import type { LiftoffPayload } from "@/lib/schemas/liftoff";
import type { OpResult } from "@/lib/schemas/sync";
import { applyPushResults, OutboxWriteError, requeue, saveLiftoffCheck } from "./outbox";
import { applyPull } from "./reference";
import { emptyPull, fieldTendon, TEST_USER } from "./test-support";

const freshDb = tabletDbsClosedAfterEach();

const PROJECT = "0190a0b0-0000-7000-8000-0000000000a1";
const POUR = "0190a0b0-0000-7000-8000-0000000000b1";
const T1 = "0190a0b0-0000-7000-8000-0000000000c1";
const ORDER = "0190a0b0-0000-7000-8000-0000000000d1";
const SET = "0190a0b0-0000-7000-8000-0000000000e1";
const tendon = fieldTendon({ id: T1, projectId: PROJECT, pourId: POUR, tag: "U01" });
const payload = (over: Partial<LiftoffPayload> = {}): LiftoffPayload => ({
  projectId: PROJECT,
  pourId: POUR,
  tendonId: T1,
  dispositionId: ORDER,
  tendonEnd: "A",
  equipmentSetId: SET,
  pressure: "4150",
  pressureUnit: "psi",
  checkedAt: "2026-12-02T15:00:00.000Z",
  authorUserId: TEST_USER.userId,
  ...over,
});
const result = { liftoffForceN: 131_000, expectedForceN: 132_000, deviationPct: -0.76, bandPct: 5, withinBand: true };

describe("saveLiftoffCheck", () => {
  it("writes the check and its liftoff_check op together; the server's answer brings the result", async () => {
    const db = freshDb();
    await db.tendons.put(tendon);
    const { checkId, opId } = await saveLiftoffCheck(db, {
      payload: payload(),
      pressureMPa: 28.61,
      authorName: TEST_USER.name,
    });
    const [check, ops] = await Promise.all([db.liftoffChecks.get(checkId), db.outbox.toArray()]);
    expect(check).toMatchObject({
      tendonId: T1,
      dispositionId: ORDER,
      entered: { pressure: "4150", unit: "psi" },
      checkedByName: TEST_USER.name,
      syncState: "pending",
    });
    expect(check!.withinBand).toBeUndefined();
    expect(ops).toHaveLength(1);
    expect(ops[0]).toMatchObject({ opId, kind: "liftoff_check", recordId: checkId, state: "pending" });
    expect(ops[0]!.payload).toEqual(payload());

    const answer: OpResult[] = [{ opId, status: "applied", liftoffCheck: result }];
    expect(await applyPushResults(db, answer)).toEqual({ confirmed: 1, attention: 0 });
    expect(await db.outbox.count()).toBe(0);
    expect(await db.liftoffChecks.get(checkId)).toMatchObject({ syncState: "synced", ...result });
  });

  it("keeps a refused check for a person, and sends it again on request", async () => {
    const db = freshDb();
    await db.tendons.put(tendon);
    const { checkId, opId } = await saveLiftoffCheck(db, { payload: payload(), pressureMPa: 28.61, authorName: "x" });
    await applyPushResults(db, [
      {
        opId,
        status: "rejected",
        error: { code: "INVALID_INPUT", message: "Out of range", fields: { pressure: ["Out of range"] } },
      },
    ]);
    expect((await db.liftoffChecks.get(checkId))!.syncState).toBe("rejected");
    expect((await db.outbox.toArray())[0]).toMatchObject({ state: "attention", status: "rejected" });
    await requeue(db, opId);
    expect((await db.liftoffChecks.get(checkId))!.syncState).toBe("pending");
  });

  it("refuses a tendon that is not in the pour here, and then writes nothing", async () => {
    const db = freshDb();
    await db.tendons.put(tendon);
    await expect(
      saveLiftoffCheck(db, { payload: payload({ pourId: crypto.randomUUID() }), pressureMPa: 28, authorName: "x" }),
    ).rejects.toBeInstanceOf(OutboxWriteError);
    expect(await db.liftoffChecks.count()).toBe(0);
    expect(await db.outbox.count()).toBe(0);
  });

  it("takes the server's checks from the pull, with their results", async () => {
    const db = freshDb();
    const pulled = emptyPull("10", {
      liftoffChecks: [
        {
          id: "0190a0b0-0000-7000-8000-0000000000f1",
          projectId: PROJECT,
          pourId: POUR,
          tendonId: T1,
          dispositionId: ORDER,
          tendonEnd: "A" as const,
          equipmentSetId: SET,
          pressureMPa: 28.61,
          entered: { pressure: "4150", unit: "psi" as const },
          checkedAt: "2026-12-02T15:00:00.000Z",
          checkedByName: "Another Crew",
          ...result,
        },
      ],
    });
    await applyPull(db, pulled, { pourIds: [] });
    expect(await db.liftoffChecks.where("tendonId").equals(T1).toArray()).toEqual([
      expect.objectContaining({ checkedByName: "Another Crew", withinBand: true, syncState: "synced" }),
    ]);
  });
});
