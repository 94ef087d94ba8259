import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import type { SyncOp } from "@/lib/schemas/sync";
import type { TailCutPayload } from "@/lib/schemas/tail-cut";
import { pullChanges } from "@/lib/server/pull-changes";
import { pushOps } from "@/lib/server/push-ops";
import { releasePour } from "@/lib/server/release-pour";
import type { TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

/**
 * Tails cut through the sync push on real PostgreSQL: stored exactly once under duplicate and
 * concurrent delivery, a cut of a held tendon stored and flagged, a released pour taking cuts,
 * and the pull sending the cut state back.
 */

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
let pourId: string;
let releasedPourId: string;
let tendonIds: string[];
const DEVICE = "tablet-tails-01";

const crewSession = () =>
  ({
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  }) as unknown as Parameters<typeof pullChanges>[1]["user"];

function cutOp(tendonId: string, pour: string, over: Partial<SyncOp> = {}): SyncOp & { payload: TailCutPayload } {
  const payload: TailCutPayload = {
    projectId: w.projectId,
    pourId: pour,
    tendonId,
    cutAt: "2026-12-02T15:30:00.000Z",
    authorUserId: w.crew.id,
  };
  return { opId: randomUUID(), kind: "tails_cut", recordId: randomUUID(), payload, ...over } as SyncOp & {
    payload: TailCutPayload;
  };
}

const cutsOf = (tendonId: string) =>
  t.db.selectFrom("tail_cuts").selectAll().where("tendon_id", "=", tendonId).execute();
const flagsOf = (tendonId: string, kind: string) =>
  t.db
    .selectFrom("flags")
    .selectAll()
    .where("tendon_id", "=", tendonId)
    .where("kind", "=", kind as never)
    .execute();

/** A pour of our own with copies of the demo's one-end tendons, the concrete confirmed as in the demo pour. */
async function pourWith(name: string, count: number): Promise<{ pourId: string; tendonIds: string[] }> {
  const demoPour = await t.db
    .selectFrom("pours")
    .select("concrete_strength_mpa")
    .where("id", "=", w.pourId)
    .executeTakeFirstOrThrow();
  const pour = await t.db
    .insertInto("pours")
    .values({ project_id: w.projectId, name, concrete_strength_mpa: demoPour.concrete_strength_mpa })
    .returning("id")
    .executeTakeFirstOrThrow();
  const ids: string[] = [];
  for (const [i, source] of w.tendons
    .filter((x) => x.ends === "A")
    .slice(0, count)
    .entries()) {
    const s = await t.db.selectFrom("tendons").selectAll().where("id", "=", source.id).executeTakeFirstOrThrow();
    const row = await t.db
      .insertInto("tendons")
      .values({
        project_id: s.project_id,
        pour_id: pour.id,
        tag: `${name.slice(0, 2).toUpperCase()}-${i + 1}`,
        kind: s.kind,
        strand_size: s.strand_size,
        strand_count: s.strand_count,
        segments: JSON.stringify(s.segments),
        ends: s.ends,
        jack_grip_mm: s.jack_grip_mm,
        strand_lot_id: s.strand_lot_id,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    ids.push(row.id);
  }
  return { pourId: pour.id, tendonIds: ids };
}

const recordInBand = async (tendonId: string, pour: string) => {
  const pushed = await pushOps(app, {
    user: w.crew,
    deviceId: DEVICE,
    ops: [createOp(w, tendonId, { marksAfter: await w.inBandAfter(tendonId) }, { pourId: pour })],
  });
  expect(pushed.results[0]).toMatchObject({ status: "applied", evaluation: { verdict: "in band", flagKinds: [] } });
};

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(4));
  const project = await t.db
    .selectFrom("projects")
    .select("required_concrete_mpa")
    .where("id", "=", w.projectId)
    .executeTakeFirstOrThrow();
  // The gate these tests rely on: the demo project requires a strength and the demo pour meets it.
  expect(project.required_concrete_mpa).not.toBeNull();
  ({ pourId, tendonIds } = await pourWith("Tails pour", 2));
  ({ pourId: releasedPourId } = await pourWith("Released pour", 1));
});
afterAll(() => t.drop());

describe("tails cut of a clear tendon", () => {
  it("lands once under repeated and concurrent delivery of the same op", async () => {
    const tendonId = tendonIds[0]!;
    await recordInBand(tendonId, pourId);
    const op = cutOp(tendonId, pourId);
    const [a, b] = await Promise.all([
      pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [op] }),
      pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [op] }),
    ]);
    const again = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [op] });
    const statuses = [a.results[0]!.status, b.results[0]!.status].sort();
    expect(statuses).toEqual(["applied", "duplicate"]);
    expect(again.results[0]).toMatchObject({ status: "duplicate", tailCut: { held: false, reasons: [] } });

    const cuts = await cutsOf(tendonId);
    expect(cuts).toHaveLength(1);
    expect(cuts[0]).toMatchObject({ id: op.recordId, cut_by: w.crew.id, held_reasons: [], device_id: DEVICE });
    expect(new Date(cuts[0]!.cut_at).toISOString()).toBe(op.payload.cutAt);
    const claims = await t.db.selectFrom("applied_ops").select("kind").where("op_id", "=", op.opId).execute();
    expect(claims).toEqual([{ kind: "tails_cut" }]);
    expect(await flagsOf(tendonId, "cut_while_held")).toHaveLength(0);

    // The same tendon cut again from another tablet (a new op and cut id): still one cut.
    const second = await pushOps(app, { user: w.crew, deviceId: "tablet-tails-02", ops: [cutOp(tendonId, pourId)] });
    expect(second.results[0]!.status).toBe("duplicate");
    expect(await cutsOf(tendonId)).toHaveLength(1);
  });
});

describe("tails cut of a held tendon", () => {
  it("is stored with why it was held and raises one cut_while_held flag, even when delivered twice", async () => {
    const tendonId = tendonIds[1]!; // no record: its end is not stressed
    const op = cutOp(tendonId, pourId);
    const first = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [op] });
    expect(first.results[0]).toMatchObject({
      status: "applied",
      tailCut: { held: true, reasons: ["No record yet for end A."] },
    });
    const again = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [op] });
    expect(again.results[0]!.status).toBe("duplicate");

    const cuts = await cutsOf(tendonId);
    expect(cuts).toHaveLength(1);
    expect(cuts[0]!.held_reasons).toEqual(["No record yet for end A."]);
    const flags = await flagsOf(tendonId, "cut_while_held");
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ status: "open", pour_id: pourId, project_id: w.projectId });
    expect(flags[0]!.reason).toMatch(/cut .* while the tendon was held: No record yet for end A\./);
  });

  it("is held by an open flag too", async () => {
    // The clear tendon now cut; a fresh pour with an out-of-band record (a flag) is held.
    const { pourId: p, tendonIds: ids } = await pourWith("Flagged pour", 1);
    const tendonId = ids[0]!;
    const pushed = await pushOps(app, {
      user: w.crew,
      deviceId: DEVICE,
      ops: [createOp(w, tendonId, { marksAfter: "40" }, { pourId: p })],
    });
    expect(pushed.results[0]!.evaluation?.flagKinds.length).toBeGreaterThan(0);
    const cut = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [cutOp(tendonId, p)] });
    expect(cut.results[0]!.tailCut?.held).toBe(true);
    expect(cut.results[0]!.tailCut?.reasons.join(" ")).toMatch(/flags? (is|are) still open/);
    expect(await flagsOf(tendonId, "cut_while_held")).toHaveLength(1);
  });
});

describe("tails cut on a released pour, refusals and the pull", () => {
  it("a released pour takes the cut: cutting tails is what the release is for", async () => {
    const [pour] = await t.db.selectFrom("tendons").select("id").where("pour_id", "=", releasedPourId).execute();
    await recordInBand(pour!.id, releasedPourId);
    const engineer = await demoPerson(t.db, "engineer@demo.tautline.test");
    await releasePour(t.db, {
      projectId: w.projectId,
      pourId: releasedPourId,
      by: { ...engineer, role: "engineer" },
      statement: "The tendon is in band; tails may be cut.",
      signerName: engineer.name,
      licence: "PE 048213 (invented)",
    });
    const cut = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [cutOp(pour!.id, releasedPourId)] });
    expect(cut.results[0]).toMatchObject({ status: "applied", tailCut: { held: false } });
    expect(await cutsOf(pour!.id)).toHaveLength(1);
  });

  it("refuses a bad payload naming the field, another person's cut, and a tendon of another pour, writing nothing", async () => {
    const tendonId = w.tendons[0]!.id;
    const bad = cutOp(tendonId, w.pourId);
    (bad.payload as Record<string, unknown>).cutAt = "yesterday";
    const other = cutOp(tendonId, w.pourId);
    other.payload.authorUserId = w.other.id;
    const wrongPour = cutOp(tendonId, pourId);
    const res = await pushOps(app, { user: w.crew, deviceId: DEVICE, ops: [bad, other, wrongPour] });
    expect(res.results[0]).toMatchObject({
      status: "rejected",
      error: { code: "INVALID_INPUT", fields: { cutAt: [expect.any(String)] } },
    });
    expect(res.results[1]).toMatchObject({ status: "rejected", error: { code: "FORBIDDEN" } });
    expect(res.results[2]).toMatchObject({
      status: "rejected",
      error: { fields: { pourId: ["Not the tendon's pour."] } },
    });
    expect(await cutsOf(tendonId)).toHaveLength(0);
  });

  it("the pull sends each cut with who cut it and why it was held", async () => {
    const pulled = await pullChanges(t.db, { user: crewSession(), cursor: "0", pourIds: [pourId] });
    const cuts = pulled.tailCuts ?? [];
    expect(cuts.map((c) => c.tendonId).sort()).toEqual([...tendonIds].sort());
    const held = cuts.find((c) => c.tendonId === tendonIds[1]);
    expect(held).toMatchObject({
      pourId,
      heldReasons: ["No record yet for end A."],
      cutAt: "2026-12-02T15:30:00.000Z",
    });
    expect(held!.cutByName.length).toBeGreaterThan(0);
    expect(pulled.flags.some((f) => f.tendonId === tendonIds[1] && f.kind === "cut_while_held")).toBe(true);
    // A later pull from the cursor sends nothing again until a cut changes.
    const later = await pullChanges(t.db, { user: crewSession(), cursor: pulled.cursor, pourIds: [pourId] });
    expect(later.tailCuts).toEqual([]);
  });
});
