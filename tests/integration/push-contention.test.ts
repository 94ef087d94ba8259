import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "@/db/connect";
import type { RecordPayload } from "@/lib/schemas/record";
import type { SyncOp } from "@/lib/schemas/sync";
import { pushOps } from "@/lib/server/push-ops";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { buildWorld, createOp, reviseOp, type SyncWorld } from "./sync-fixtures";

// Before: one op that failed under contention (a deadlock, a tendon that kept changing) threw out
// of the batch, the route answered 500 "Nothing was saved" although the batch's other ops had
// committed. Now each op answers for itself, and an op that could not get through answers
// retry-later with nothing stored, so the tablet sends it again.

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const DEVICE = "tablet-contention-01";

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  w = await buildWorld(t.db);
  app = createDb(t.appUrl, 5, { prepare: true });
});
afterAll(async () => {
  await app.destroy();
  await t.drop();
});

const stored = async (ops: SyncOp[]) =>
  (
    await t.db
      .selectFrom("records")
      .select("id")
      .where(
        "id",
        "in",
        ops.map((o) => o.recordId),
      )
      .execute()
  ).map((r) => r.id);

describe("push under contention", () => {
  it("answers retry-later for the op that failed and applied for the others, and stores exactly the applied ones", async () => {
    const ops = [createOp(w, w.tendons[0]!.id), createOp(w, w.tendons[1]!.id), createOp(w, w.tendons[2]!.id)];
    const { results } = await pushOps(app, {
      user: w.crew,
      deviceId: DEVICE,
      ops,
      hooks: {
        beforeWrite: (op) => {
          if (op.opId === ops[1]!.opId) throw Object.assign(new Error("deadlock detected"), { code: "40P01" });
        },
      },
    });
    expect(results.map((r) => r.status)).toEqual(["applied", "retry-later", "applied"]);
    expect(results[1]!.error).toMatchObject({ code: "RETRY_LATER" });
    expect((await stored(ops)).sort()).toEqual([ops[0]!.recordId, ops[2]!.recordId].sort());

    // Sent again, it lands once; the others answer duplicate.
    const again = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops });
    expect(again.results.map((r) => r.status)).toEqual(["duplicate", "applied", "duplicate"]);
    expect(await stored(ops)).toHaveLength(3);
  });

  it("holds back the rest of a record's chain behind an op that must be retried", async () => {
    const first = createOp(w, w.tendons[3]!.id);
    const second = reviseOp(
      { recordId: first.recordId, revision: 1, payload: first.payload as RecordPayload },
      { remarks: "Gauge re-read" },
    );
    const { results } = await pushOps(app, {
      user: w.crew,
      deviceId: DEVICE,
      ops: [first, second],
      hooks: {
        beforeWrite: () => {
          throw new Error("connection terminated unexpectedly");
        },
      },
    });
    expect(results.map((r) => [r.opId, r.status])).toEqual([
      [first.opId, "retry-later"],
      [second.opId, "retry-later"],
    ]);
    expect(results[1]!.error?.message).toContain("earlier change");
    expect(await stored([first, second])).toEqual([]);
    const again = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [first, second] });
    expect(again.results.map((r) => r.status)).toEqual(["applied", "applied"]);
  });

  it("five pushes at once on one tendon: every op gets its own answer and the database holds exactly the applied ones", async () => {
    const tendon = w.tendons.find((x) => x.ends === "both")!;
    const batches = Array.from({ length: 5 }, (_, i) => [createOp(w, tendon.id, { tendonEnd: i % 2 ? "B" : "A" })]);
    const answers = await Promise.all(batches.map((ops) => pushOps(app, { user: w.crew, deviceId: DEVICE, ops })));
    const all = answers.flatMap((a) => a.results);
    expect(all).toHaveLength(5);
    for (const r of all) expect(["applied", "conflict", "rejected", "retry-later"]).toContain(r.status);
    const applied = all
      .filter((r) => r.status === "applied")
      .map((r) => batches.flat().find((o) => o.opId === r.opId)!.recordId);
    expect((await stored(batches.flat())).sort()).toEqual(applied.sort());
    console.log(`contention: 5 concurrent pushes on one tendon answered ${all.map((r) => r.status).join(", ")}`);
  });
});
