import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import type { SyncOp } from "@/lib/schemas/sync";
import { listConcreteResults } from "@/lib/server/list-concrete-results";
import { pushOps } from "@/lib/server/push-ops";
import type { TestDatabase } from "../support/database";
import { makePour } from "../support/factories";
import { copyDemoTendons } from "../support/records";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

// The crew's reason to stress a pour whose concrete strength is not confirmed, on real
// PostgreSQL: it travels with the record, is kept on it, and the pour's one concrete flag quotes
// it to the engineer. The demo project requires 3,000 psi (20.68 MPa). Each test stresses a pour of
// its own with no concrete results (tendons shaped as the demo's L2 Pour 1), so it runs alone and in
// any order.

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const REASON = "Inspector read the field-cured cylinders on site at 3,200 psi.";

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(3));
});
afterAll(() => t.drop());

let pours = 0;
/** A pour of the test's own, its concrete not confirmed, with six tendons copied from the demo's. */
async function unconfirmedPour(): Promise<{ world: SyncWorld; tendons: SyncWorld["tendons"] }> {
  const n = ++pours;
  const pour = await makePour(t.db, w.projectId, { name: `Go-ahead pour ${n}`, concreteStrengthMPa: null });
  const tendons: SyncWorld["tendons"] = [];
  for (const [i, source] of w.tendons.slice(0, 6).entries()) {
    const [made] = await copyDemoTendons(t.db, { projectId: w.projectId, pourId: pour.id }, [`GA${n}-${i + 1}`], {
      templateTag: source.tag,
    });
    tendons.push({ id: made!.id, tag: made!.tag, ends: source.ends });
  }
  return { world: { ...w, pourId: pour.id, tendons }, tendons };
}

const push = (ops: SyncOp[]) => pushOps(app, { user: w.crew, deviceId: "tablet-go-ahead", ops });
const recordRow = (id: string) =>
  t.db.selectFrom("records").select(["concrete_go_ahead"]).where("id", "=", id).executeTakeFirst();
const concreteFlags = (pourId: string) =>
  t.db
    .selectFrom("flags")
    .select(["reason", "record_id", "status"])
    .where("pour_id", "=", pourId)
    .where("kind", "=", "concrete_unconfirmed")
    .execute();

describe("the reason to go ahead before the concrete is confirmed", () => {
  it("refuses a reason too short to say anything, naming the field, and writes nothing", async () => {
    const { world, tendons } = await unconfirmedPour();
    const op = createOp(world, tendons[0]!.id, {}, { concreteGoAhead: "ok" });
    const [answer] = (await push([op])).results;
    expect(answer).toMatchObject({ status: "rejected", error: { code: "INVALID_INPUT" } });
    expect(Object.keys(answer!.error!.fields!)).toEqual(["concreteGoAhead"]);
    expect(await recordRow(op.recordId)).toBeUndefined();
    expect(await concreteFlags(world.pourId)).toEqual([]);
  });

  it("is kept on the record and quoted on the pour's concrete flag", async () => {
    const { world, tendons } = await unconfirmedPour();
    const op = createOp(world, tendons[0]!.id, {}, { concreteGoAhead: REASON });
    expect((await push([op])).results[0]).toMatchObject({ status: "applied" });
    expect(await recordRow(op.recordId)).toEqual({ concrete_go_ahead: REASON });
    const [flag, ...others] = await concreteFlags(world.pourId);
    expect(others).toEqual([]);
    expect(flag).toMatchObject({ record_id: op.recordId, status: "open" });
    expect(flag!.reason).toMatch(/was confirmed\./);
    expect(flag!.reason).toContain(`Crew's reason to go ahead: ${REASON}`);
  });

  it("takes a record from a tablet that did not ask (kept without a reason), and raises no second flag", async () => {
    const { world, tendons } = await unconfirmedPour();
    const first = createOp(world, tendons[0]!.id, {}, { concreteGoAhead: REASON });
    expect((await push([first])).results[0]).toMatchObject({ status: "applied" });
    const op = createOp(world, tendons[1]!.id);
    expect(op.payload).not.toHaveProperty("concreteGoAhead");
    expect((await push([op])).results[0]).toMatchObject({ status: "applied" });
    expect(await recordRow(op.recordId)).toEqual({ concrete_go_ahead: null });
    expect(await concreteFlags(world.pourId)).toHaveLength(1);
  });

  it("is listed with the pour's concrete results, by tendon, end and who recorded it, while the pour is not released", async () => {
    const { world, tendons } = await unconfirmedPour();
    // A reason too short (refused, never stored), a good one, and a record from a tablet that did not ask.
    const refused = createOp(world, tendons[2]!.id, {}, { concreteGoAhead: "ok" });
    expect((await push([refused])).results[0]).toMatchObject({ status: "rejected" });
    expect((await push([createOp(world, tendons[0]!.id, {}, { concreteGoAhead: REASON })])).results[0]).toMatchObject({
      status: "applied",
    });
    expect((await push([createOp(world, tendons[1]!.id)])).results[0]).toMatchObject({ status: "applied" });

    const gate = await listConcreteResults(t.db, { projectId: world.projectId, pourId: world.pourId });
    expect(gate.met).toBe(false);
    expect(gate.release).toBeNull();
    // Only the first tendon's record came with a reason.
    expect(gate.goAheads).toEqual([
      {
        tag: tendons[0]!.tag,
        end: expect.stringMatching(/^[AB]$/),
        reason: REASON,
        by: expect.any(String),
        at: expect.any(String),
      },
    ]);
  });

  it("adds the reasons of later records to the pour's one flag, once each", async () => {
    const { world, tendons } = await unconfirmedPour();
    expect((await push([createOp(world, tendons[0]!.id, {}, { concreteGoAhead: REASON })])).results[0]).toMatchObject({
      status: "applied",
    });
    const LATER = "Lab phoned: 7-day breaks at 3,400 psi, report to follow.";
    const later = createOp(world, tendons[3]!.id, {}, { concreteGoAhead: LATER });
    // Delivered twice, and the same reason again on another tendon, and the first reason again.
    expect((await push([later])).results[0]).toMatchObject({ status: "applied" });
    expect((await push([later])).results[0]).toMatchObject({ status: "duplicate" });
    const same = createOp(world, tendons[4]!.id, {}, { concreteGoAhead: LATER });
    expect((await push([same])).results[0]).toMatchObject({ status: "applied" });
    const first = createOp(world, tendons[5]!.id, {}, { concreteGoAhead: REASON });
    expect((await push([first])).results[0]).toMatchObject({ status: "applied" });

    const [flag, ...others] = await concreteFlags(world.pourId);
    expect(others).toEqual([]);
    const count = (text: string) => flag!.reason.split(text).length - 1;
    expect(count(REASON)).toBe(1);
    expect(count(LATER)).toBe(1);
    expect(flag!.reason).toContain(`Crew's reason to go ahead on ${tendons[3]!.tag} end `);
    expect(flag!.reason.endsWith(LATER)).toBe(true);
  });

  it("says on the flag when no reason came with the record that raised it", async () => {
    const { world, tendons } = await unconfirmedPour();
    const op = createOp(world, tendons[2]!.id);
    expect((await push([op])).results[0]).toMatchObject({ status: "applied" });
    const open = (await concreteFlags(world.pourId)).filter((f) => f.status === "open");
    expect(open).toHaveLength(1);
    expect(open[0]!.reason).toMatch(/No reason to go ahead came with the record\.$/);
  });
});
