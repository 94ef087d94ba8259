import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import type { RecordPayload } from "@/lib/schemas/record";
import type { SyncOp } from "@/lib/schemas/sync";
import { correctRecord } from "@/lib/server/correct-record";
import { pushOps, type Pusher } from "@/lib/server/push-ops";
import type { TestDatabase } from "../support/database";
import { syncWorld, createOp, reviseOp, rowsOf, type SyncWorld } from "./sync-fixtures";

let t: TestDatabase;
let w: SyncWorld;
/** Pushes go through a client like the app's, with prepared statements. */
let app: Db;
const DEVICE = "tablet-test-0001";

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(5));
});
afterAll(() => t.drop());

const push = (ops: SyncOp[], user: Pusher = w.crew) => pushOps(app, { user, deviceId: DEVICE, ops });
const statuses = (r: { results: { status: string }[] }) => r.results.map((x) => x.status);
/** A tendon's evaluations, the latest first. */
const evaluationsOf = (tendonId: string) =>
  t.db
    .selectFrom("evaluations")
    .select(["record_ids", "provisional"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .execute();
const recordsOf = (recordIds: string[]) =>
  t.db.selectFrom("records").select(["id", "revision"]).where("id", "in", recordIds).execute();

describe("push: idempotency", () => {
  it("applies a batch once; the same batch again answers duplicate and writes nothing", async () => {
    const ops = [createOp(w, w.tendons[0]!.id), createOp(w, w.tendons[1]!.id), createOp(w, w.tendons[2]!.id)];
    const before = await rowsOf(t.db, "records");
    expect(statuses(await push(ops))).toEqual(["applied", "applied", "applied"]);
    const again = await push(ops);
    expect(statuses(again)).toEqual(["duplicate", "duplicate", "duplicate"]);
    expect(again.results.map((r) => r.revision)).toEqual([1, 1, 1]);
    expect(await rowsOf(t.db, "records")).toBe(before + 3);
    expect(await recordsOf(ops.map((o) => o.recordId))).toHaveLength(3);
  });

  it("the same op delivered ten times at once makes one row and nine duplicates", async () => {
    const op = createOp(w, w.tendons[3]!.id);
    const answers = await Promise.all(Array.from({ length: 10 }, () => push([op])));
    const all = answers.flatMap(statuses).sort();
    expect(all).toEqual(["applied", ...Array(9).fill("duplicate")]);
    expect(await recordsOf([op.recordId])).toHaveLength(1);
    const claims = await t.db.selectFrom("applied_ops").select("op_id").where("op_id", "=", op.opId).execute();
    expect(claims).toHaveLength(1);
  });

  it("a server that commits and then loses its answer gives duplicate on the retry", async () => {
    const op = createOp(w, w.tendons[4]!.id);
    await expect(
      pushOps(app, {
        user: w.crew,
        deviceId: DEVICE,
        ops: [op],
        hooks: {
          afterCommit: () => {
            throw new Error("connection reset after commit");
          },
        },
      }),
    ).rejects.toThrow("connection reset after commit");
    expect(await recordsOf([op.recordId])).toHaveLength(1);
    const retry = await push([op]);
    expect(retry.results[0]).toMatchObject({ opId: op.opId, status: "duplicate", revision: 1 });
    expect(await recordsOf([op.recordId])).toHaveLength(1);
  });

  it("keeps the server's evaluation with the op, so a duplicate answers with the same verdict", async () => {
    const op = createOp(w, w.tendons[5]!.id, { marksAfter: await w.inBandAfter(w.tendons[5]!.id) });
    const first = await push([op]);
    expect(first.results[0]!.evaluation).toBeDefined();
    const again = await push([op]);
    expect(again.results[0]!.evaluation).toEqual(first.results[0]!.evaluation);
    const evaluations = await t.db
      .selectFrom("evaluations")
      .select("id")
      .where("tendon_id", "=", w.tendons[5]!.id)
      .execute();
    expect(evaluations).toHaveLength(1);
  });
});

describe("push: corrections", () => {
  it("a correction on the current version appends the next revision; one on a stale version is a conflict and writes nothing", async () => {
    const create = createOp(w, w.tendons[6]!.id) as SyncOp & { payload: RecordPayload };
    expect(statuses(await push([create]))).toEqual(["applied"]);
    const base = { recordId: create.recordId, revision: 1, payload: create.payload };
    const fix = reviseOp(base, { remarks: "Second look at the mark" });
    expect((await push([fix])).results[0]).toMatchObject({ status: "applied", revision: 2 });

    // Another tablet still holds revision 1 and corrects it too.
    const stale = reviseOp(base, { remarks: "Corrected on the other tablet" });
    const recordsBefore = await rowsOf(t.db, "records");
    const claimsBefore = await rowsOf(t.db, "applied_ops");
    const answer = (await push([stale])).results[0]!;
    expect(answer).toMatchObject({ status: "conflict", revision: 2, headRecordId: fix.recordId });
    expect(answer.error?.message).toMatch(/revision 2/);
    expect(await rowsOf(t.db, "records")).toBe(recordsBefore);
    expect(await rowsOf(t.db, "applied_ops")).toBe(claimsBefore);
    const chain = await t.db
      .selectFrom("records")
      .select("revision")
      .where("chain_id", "=", create.recordId)
      .orderBy("revision")
      .execute();
    expect(chain.map((r) => r.revision)).toEqual([1, 2]);
  });

  it("two corrections of the same version sent at once: one lands, the other is a conflict", async () => {
    const create = createOp(w, w.tendons[7]!.id) as SyncOp & { payload: RecordPayload };
    await push([create]);
    const base = { recordId: create.recordId, revision: 1, payload: create.payload };
    const [x, y] = await Promise.all([
      push([reviseOp(base, { remarks: "x" })]),
      push([reviseOp(base, { remarks: "y" })]),
    ]);
    expect([...statuses(x!), ...statuses(y!)].sort()).toEqual(["applied", "conflict"]);
    const chain = await t.db.selectFrom("records").select("revision").where("chain_id", "=", create.recordId).execute();
    expect(chain).toHaveLength(2);
  });

  it("a correction whose first revision never reached the server is rejected", async () => {
    const create = createOp(w, w.tendons[8]!.id) as SyncOp & { payload: RecordPayload };
    const fix = reviseOp({ recordId: create.recordId, revision: 1, payload: create.payload }, { remarks: "z" });
    expect((await push([fix])).results[0]).toMatchObject({ status: "rejected", error: { code: "NOT_FOUND" } });
  });
});

describe("push: bad operations", () => {
  it("one invalid op in a batch is rejected with its fields while the others land", async () => {
    const good1 = createOp(w, w.tendons[9]!.id);
    const bad = createOp(w, w.tendons[10]!.id);
    (bad.payload as RecordPayload).measuredMm = 999; // not what the marks as typed say
    const good2 = createOp(w, w.tendons[11]!.id);
    const claimsBefore = await rowsOf(t.db, "applied_ops");
    const { results } = await push([good1, bad, good2]);
    expect(statuses({ results })).toEqual(["applied", "rejected", "applied"]);
    expect(results[1]!.error?.fields).toHaveProperty("measuredMm");
    expect(results.map((r) => r.opId)).toEqual([good1.opId, bad.opId, good2.opId]);
    expect(await recordsOf([good1.recordId, bad.recordId, good2.recordId])).toHaveLength(2);
    expect(await rowsOf(t.db, "applied_ops")).toBe(claimsBefore + 2);
  });

  it("names every unreadable typed value", async () => {
    const bad = createOp(w, w.tendons[12]!.id);
    const p = bad.payload as RecordPayload;
    p.entered = { ...p.entered, finalPressure: "lots", marks: { before: "0", after: "8 9/8" } };
    const answer = (await push([bad])).results[0]!;
    expect(answer.status).toBe("rejected");
    expect(Object.keys(answer.error!.fields!)).toEqual(
      expect.arrayContaining(["entered.finalPressure", "entered.marksAfter"]),
    );
  });

  it("rejects another project's tendon, a project the person is not on, and a role that may not record", async () => {
    const viaOwnProject = createOp(w, w.foreign.tendonId);
    const intoForeignProject = createOp(
      w,
      w.foreign.tendonId,
      {},
      { projectId: w.foreign.projectId, pourId: w.foreign.pourId },
    );
    const before = await rowsOf(t.db, "records");
    const { results } = await push([viaOwnProject, intoForeignProject]);
    expect(results.map((r) => [r.status, r.error?.code])).toEqual([
      ["rejected", "NOT_FOUND"],
      ["rejected", "NOT_FOUND"],
    ]);
    // The other project's crew member cannot record on this project either.
    const theirs = createOp(w, w.tendons[13]!.id, {}, { authorUserId: w.other.id });
    expect((await push([theirs], w.other)).results[0]).toMatchObject({
      status: "rejected",
      error: { code: "NOT_FOUND" },
    });
    const inspectors = createOp(w, w.tendons[13]!.id, {}, { authorUserId: w.inspector.id });
    expect((await push([inspectors], w.inspector)).results[0]).toMatchObject({
      status: "rejected",
      error: { code: "FORBIDDEN" },
    });
    expect(await rowsOf(t.db, "records")).toBe(before);
  });

  it("refuses a record made by someone else than the person pushing", async () => {
    const op = createOp(w, w.tendons[14]!.id, {}, { authorUserId: w.inspector.id });
    expect((await push([op])).results[0]).toMatchObject({
      status: "rejected",
      error: { fields: { authorUserId: expect.any(Array) } },
    });
  });

  it("wants a reason for an equipment set whose calibration had expired that day", async () => {
    const day = new Date("2026-12-20T10:00:00-08:00");
    const noReason = createOp(
      w,
      w.tendons[15]!.id,
      { equipmentSetId: w.setB.id },
      { calibrationId: w.setB.calibrationId, deviceTime: day.toISOString() },
    );
    expect((await push([noReason])).results[0]).toMatchObject({
      status: "rejected",
      error: { fields: { expiredCalibrationReason: expect.any(Array) } },
    });
    const withReason = createOp(
      w,
      w.tendons[15]!.id,
      { equipmentSetId: w.setB.id },
      {
        calibrationId: w.setB.calibrationId,
        deviceTime: day.toISOString(),
        expiredCalibrationReason: "Set A jack leaking; engineer told by phone",
      },
    );
    const answer = (await push([withReason])).results[0]!;
    expect(answer.status).toBe("applied");
    expect(answer.evaluation?.flagKinds).toContain("calibration_expired");
  });

  it("refuses a calibration of another set and an end the tendon is not stressed at", async () => {
    const wrongCal = createOp(w, w.tendons[16]!.id, {}, { calibrationId: w.setB.calibrationId });
    const oneEnded = w.tendons.find((x) => x.ends === "A")!;
    const wrongEnd = createOp(w, oneEnded.id, { tendonEnd: "B" });
    const { results } = await push([wrongCal, wrongEnd]);
    expect(results[0]).toMatchObject({ status: "rejected", error: { fields: { calibrationId: expect.any(Array) } } });
    expect(results[1]).toMatchObject({ status: "rejected", error: { fields: { tendonEnd: expect.any(Array) } } });
  });
});

describe("push: both ends of a tendon in one batch", () => {
  it("the evaluation after the second end sees the first, however the two ops interleave", async () => {
    // The two ends are different record chains, so the push applies them side by side; the
    // tendon's evaluation must still read both ends once both are stored.
    const twoEnded = w.tendons.filter((x) => x.ends === "both").slice(-6);
    expect(twoEnded.length).toBeGreaterThanOrEqual(4);
    const ops = twoEnded.flatMap((x) => [createOp(w, x.id, { tendonEnd: "A" }), createOp(w, x.id, { tendonEnd: "B" })]);
    expect(statuses(await push(ops))).toEqual(ops.map(() => "applied"));
    for (const x of twoEnded) {
      const latest = (await evaluationsOf(x.id))[0]!;
      expect({ tag: x.tag, ends: latest.record_ids.length, provisional: latest.provisional }).toEqual({
        tag: x.tag,
        ends: 2,
        provisional: false,
      });
    }
  });

  it("a correction made in review while the other end is pushed: the latest evaluation reads both", async () => {
    const twoEnded = w.tendons.filter((x) => x.ends === "both").slice(-10, -6);
    expect(twoEnded.length).toBe(4);
    for (const x of twoEnded) {
      const endA = createOp(w, x.id, { tendonEnd: "A" });
      expect(statuses(await push([endA]))).toEqual(["applied"]);
      const [corrected, pushed] = await Promise.all([
        correctRecord(t.db, {
          projectId: w.projectId,
          recordId: endA.recordId,
          by: w.inspector,
          correction: {
            reason: "Tape read from the wrong mark.",
            measuredMm: (endA.payload as RecordPayload).measuredMm + 3,
          },
        }),
        push([createOp(w, x.id, { tendonEnd: "B" })]),
      ]);
      expect(statuses(pushed)).toEqual(["applied"]);
      const latest = (await evaluationsOf(x.id))[0]!;
      expect(latest.provisional).toBe(false);
      expect(latest.record_ids).toContain(corrected.recordId);
      expect(latest.record_ids).toHaveLength(2);
    }
  });
});

describe("push: another write between an op's read and its write", () => {
  it("the other end stored first: the op reads again, lands once, and its evaluation reads both ends", async () => {
    const twoEnded = w.tendons.filter((x) => x.ends === "both");
    const tendon = twoEnded.at(-11)!;
    expect(twoEnded.length).toBeGreaterThanOrEqual(11);
    const endA = createOp(w, tendon.id, { tendonEnd: "A" });
    const endB = createOp(w, tendon.id, { tendonEnd: "B" });
    const attempts: number[] = [];
    const { results } = await pushOps(app, {
      user: w.crew,
      deviceId: DEVICE,
      ops: [endA],
      hooks: {
        beforeWrite: async (_op, attempt) => {
          attempts.push(attempt);
          if (attempt === 1) expect(statuses(await push([endB]))).toEqual(["applied"]);
        },
      },
    });
    expect(results[0]).toMatchObject({ status: "applied", evaluation: { provisional: false } });
    expect(attempts).toEqual([1, 2]);
    // End B's lone evaluation, then end A's with both: the refused first write left nothing.
    const evaluations = await evaluationsOf(tendon.id);
    expect(evaluations.map((e) => [e.record_ids.length, e.provisional])).toEqual([
      [2, false],
      [1, true],
    ]);
    expect(await recordsOf([endA.recordId, endB.recordId])).toHaveLength(2);
  });

  it("its record id taken on another tendon meanwhile: a conflict, and nothing of the op is written", async () => {
    const [mine, theirs] = [w.tendons[20]!, w.tendons[21]!];
    const op = createOp(w, mine.id);
    const { results } = await pushOps(app, {
      user: w.crew,
      deviceId: DEVICE,
      ops: [op],
      hooks: {
        beforeWrite: async () => {
          const other = createOp(w, theirs.id);
          const sameId = {
            ...other,
            recordId: op.recordId,
            payload: { ...(other.payload as RecordPayload), chainId: op.recordId },
          };
          expect(statuses(await push([sameId]))).toEqual(["applied"]);
        },
      },
    });
    expect(results[0]).toMatchObject({
      status: "conflict",
      error: { code: "CONFLICT", message: expect.stringContaining("already stored elsewhere") },
    });
    const claim = await t.db.selectFrom("applied_ops").select("op_id").where("op_id", "=", op.opId).execute();
    expect(claim).toHaveLength(0);
    expect(await evaluationsOf(mine.id)).toHaveLength(0);
    const stored = await t.db.selectFrom("records").select("tendon_id").where("id", "=", op.recordId).execute();
    expect(stored).toEqual([{ tendon_id: theirs.id }]);
  });
});

describe("push: gauge steps and a gauge kept off its target", () => {
  const flagsOf = (tendonId: string) =>
    t.db.selectFrom("flags").select(["kind", "reason"]).where("tendon_id", "=", tendonId).execute();

  it("stores the steps as typed with their SI values and judges along their line; forged SI values are refused by field", async () => {
    const psi = Number(w.targetPsi);
    const p = (f: number) => String(Math.round((psi * f) / 50) * 50);
    const form = {
      initialPressure: p(0.2),
      marksBefore: "0",
      marksAfter: "3 1/2",
      gaugeSteps: [
        { pressure: p(0.2), reading: "1" },
        { pressure: p(0.6), reading: "2 3/4" },
        { pressure: w.targetPsi, reading: "4 1/2" },
      ],
    };
    const op = createOp(w, w.tendons[30]!.id, form);
    expect(statuses(await push([op]))).toEqual(["applied"]);
    const row = await t.db
      .selectFrom("records")
      .select("entered")
      .where("id", "=", op.recordId)
      .executeTakeFirstOrThrow();
    const stored = row.entered as { gaugeSteps: { pressure: string; reading: string; readingMm: number }[] };
    expect(stored.gaugeSteps.map((s) => [s.pressure, s.reading])).toEqual(
      form.gaugeSteps.map((s) => [s.pressure, s.reading]),
    );
    const evaluation = await t.db
      .selectFrom("evaluations")
      .select("inputs")
      .where("tendon_id", "=", w.tendons[30]!.id)
      .orderBy("created_at", "desc")
      .executeTakeFirstOrThrow();
    const reading = (evaluation.inputs as { readings: { stepFit: { r2: number; steps: unknown[] } | null }[] })
      .readings[0]!;
    expect(reading.stepFit!.steps).toHaveLength(3);
    expect(reading.stepFit!.r2).toBeGreaterThan(0.99);

    const forged = createOp(w, w.tendons[31]!.id, form);
    const fp = forged.payload as RecordPayload;
    fp.entered = {
      ...fp.entered,
      gaugeSteps: fp.entered.gaugeSteps!.map((s, i) => (i === 1 ? { ...s, readingMm: 1 } : s)),
    };
    const answer = (await push([forged])).results[0]!;
    expect(answer.status).toBe("rejected");
    expect(Object.keys(answer.error!.fields!)).toEqual(["entered.gaugeSteps.1.readingMm"]);
  });

  it("a final pressure off its target beyond the band raises its own flag, quoting the crew's reason or saying none came", async () => {
    // Under-force past 10 % only (the most a project may set), so the off-target flag is the one that holds these tendons.
    const { under_force_pct: before } = await t.db
      .selectFrom("projects")
      .select("under_force_pct")
      .where("id", "=", w.projectId)
      .executeTakeFirstOrThrow();
    await t.db.updateTable("projects").set({ under_force_pct: 10 }).where("id", "=", w.projectId).execute();
    try {
      const low = String(Math.round((Number(w.targetPsi) * 0.92) / 50) * 50);
      const confirmed = createOp(w, w.tendons[32]!.id, { finalPressure: low }, {});
      const cp = confirmed.payload as RecordPayload;
      cp.entered = { ...cp.entered, gaugeOffTarget: { pct: -8, reason: "pump lost pressure, held at the mark" } };
      const silent = createOp(w, w.tendons[33]!.id, { finalPressure: low });
      expect(statuses(await push([confirmed, silent]))).toEqual(["applied", "applied"]);
      const withReason = (await flagsOf(w.tendons[32]!.id)).find((f) => f.kind === "gauge_off_target");
      expect(withReason!.reason).toMatch(/from the target .*“pump lost pressure, held at the mark”/);
      const without = (await flagsOf(w.tendons[33]!.id)).find((f) => f.kind === "gauge_off_target");
      expect(without!.reason).toMatch(/no reason came with the record/);

      const noReason = createOp(w, w.tendons[34]!.id, { finalPressure: low });
      const np = noReason.payload as RecordPayload;
      np.entered = { ...np.entered, gaugeOffTarget: { pct: -8, reason: "" } };
      const refused = (await push([noReason])).results[0]!;
      expect(refused.status).toBe("rejected");
      expect(Object.keys(refused.error!.fields!)).toEqual(["entered.gaugeOffTarget.reason"]);
    } finally {
      await t.db.updateTable("projects").set({ under_force_pct: before }).where("id", "=", w.projectId).execute();
    }
  });
});
