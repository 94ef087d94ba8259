import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import type { DetensionPayload } from "@/lib/schemas/detension";
import type { SyncOp } from "@/lib/schemas/sync";
import type { TailCutPayload } from "@/lib/schemas/tail-cut";
import { recordRows, RECORD_COLUMNS } from "@/lib/reports/pour-rows";
import { getPourReport } from "@/lib/server/get-pour-report";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { pullChanges } from "@/lib/server/pull-changes";
import { pushOps } from "@/lib/server/push-ops";
import { recordDisposition } from "@/lib/server/record-disposition";
import type { TestDatabase } from "../support/database";
import { demoPerson, flagIdOf } from "../support/records";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";

/**
 * Detensions through the sync push on real PostgreSQL: a detension answers an engineer's
 * "detension and restress" order and nothing else (refused with the reason, nothing written); it
 * is stored once however often it is delivered; the tendon stays held for tails cut until a
 * stressing record made after the detension comes in; the pull sends it back with the
 * disposition it answers.
 */

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const DEVICE = "tablet-detension-01";
const STRESSED_AT = "2026-12-02T06:00:00-08:00";
const DETENSIONED_AT = "2026-12-02T07:10:00-08:00";
const RESTRESSED_AT = "2026-12-02T07:40:00-08:00";
/** held: detensioned, not restressed; restressed: detensioned, then stressed again; other: a restress order only. */
let held: { id: string; pourId: string; strandCount: number; dispositionId: string };
let restressed: { id: string; pourId: string; dispositionId: string };
let otherDispositionId: string;
let otherTendonId: string;

const crewSession = () =>
  ({
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  }) as unknown as Parameters<typeof pullChanges>[1]["user"];

function detensionOp(
  over: Partial<DetensionPayload> = {},
  tendon: { id: string; pourId: string; dispositionId: string } = held,
): SyncOp & { payload: DetensionPayload } {
  const payload: DetensionPayload = {
    projectId: w.projectId,
    pourId: tendon.pourId,
    tendonId: tendon.id,
    dispositionId: tendon.dispositionId,
    detensionedAt: DETENSIONED_AT,
    operatorName: "R. Okafor",
    equipmentSetId: w.setA.id,
    pressure: "1200",
    pressureUnit: "psi",
    strandsDetensioned: 1,
    remarks: "Wedges released with the jack; strand slack at the live end.",
    authorUserId: w.crew.id,
    ...over,
  };
  return { opId: randomUUID(), kind: "detension", recordId: randomUUID(), payload };
}

function tailCutOp(tendon: { id: string; pourId: string }): SyncOp {
  const payload: TailCutPayload = {
    projectId: w.projectId,
    pourId: tendon.pourId,
    tendonId: tendon.id,
    cutAt: "2026-12-02T08:00:00-08:00",
    authorUserId: w.crew.id,
  };
  return { opId: randomUUID(), kind: "tails_cut", recordId: randomUUID(), payload };
}

const push = (...ops: SyncOp[]) => pushOps(app, { user: w.crew, deviceId: DEVICE, ops });
const detensionsOf = (tendonId: string) =>
  t.db.selectFrom("detensions").selectAll().where("tendon_id", "=", tendonId).execute();
const claims = async () => (await t.db.selectFrom("applied_ops").select("op_id").execute()).length;

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(4));
  const engineer = await demoPerson(t.db, "engineer@demo.tautline.test");
  // Three one-end tendons read short: the engineer orders a detension and restress on two, a plain restress on the third.
  const [x, y, z] = w.tendons.filter((tt) => tt.ends === "A");
  const ordered: string[] = [];
  for (const [i, tendon] of [x!, y!, z!].entries()) {
    // Stressed at 06:00 on the site's clock (the times of this file lie before the test's run, so none is in the future).
    const [pushed] = (await push(createOp(w, tendon.id, { marksAfter: "2" }, { deviceTime: STRESSED_AT }))).results;
    expect(pushed).toMatchObject({ status: "applied", evaluation: { verdict: "short" } });
    const flagId = await flagIdOf(t.db, tendon.id, "out_of_band");
    const { dispositionId } = await recordDisposition(app, {
      projectId: w.projectId,
      flagId,
      engineer: { id: engineer.id, name: "Demo Engineer" },
      disposition: {
        decision: i < 2 ? "detension_restress" : "restress",
        reasons: "Release the strand, check the duct at the live end, then stress it again.",
        licenceStatement: "Licensed professional engineer, test licence (invented)",
      },
    });
    ordered.push(dispositionId);
  }
  const rows = await t.db
    .selectFrom("tendons")
    .select(["id", "pour_id", "strand_count"])
    .where("id", "in", [x!.id, y!.id])
    .execute();
  const row = (id: string) => rows.find((r) => r.id === id)!;
  held = { id: x!.id, pourId: row(x!.id).pour_id, strandCount: row(x!.id).strand_count, dispositionId: ordered[0]! };
  restressed = { id: y!.id, pourId: row(y!.id).pour_id, dispositionId: ordered[1]! };
  otherDispositionId = ordered[2]!;
  otherTendonId = z!.id;
});
afterAll(() => t.drop());

describe("a detension not ordered by a disposition is refused, and nothing is written", () => {
  it.each([
    [
      "an order for a plain restress",
      () => detensionOp({}, { ...held, id: otherTendonId, dispositionId: otherDispositionId }),
      /“Restress”, not a detension: nothing was saved/,
    ],
    [
      "a disposition of another tendon",
      () => detensionOp({ dispositionId: restressed.dispositionId }),
      /No disposition/,
    ],
    ["no disposition at all", () => detensionOp({ dispositionId: randomUUID() }), /No disposition/],
  ])("%s", async (_what, op, message) => {
    const before = await claims();
    const [result] = (await push(op())).results;
    expect(result!.status).toBe("rejected");
    expect(result!.error!.fields!.dispositionId!.join(" ")).toMatch(message);
    expect(result!.error!.message).toMatch(/engineer of record's order/);
    expect(await t.db.selectFrom("detensions").select("id").execute()).toHaveLength(0);
    expect(await claims()).toBe(before);
  });
});

describe("bad input names the field and writes nothing", () => {
  it.each([
    ["more strands than the tendon has", () => ({ strandsDetensioned: 2 }), "strandsDetensioned", /has 1 strand/],
    ["no strands", () => ({ strandsDetensioned: 0 }), "strandsDetensioned", /At least one strand/],
    ["an unreadable pressure", () => ({ pressure: "lots" }), "pressure", /cannot be read/],
    ["a zero pressure", () => ({ pressure: "0" }), "pressure", /above zero/],
    ["a time in the future", () => ({ detensionedAt: "2099-01-01T00:00:00Z" }), "detensionedAt", /future/],
    ["no operator", () => ({ operatorName: " " }), "operatorName", /who ran the jack/],
    ["a set of another project", () => ({ equipmentSetId: w.foreign.setId }), "equipmentSetId", /No such/],
  ])("%s", async (_what, over, field, message) => {
    expect(held.strandCount).toBe(1);
    const before = await claims();
    const [result] = (await push(detensionOp(over()))).results;
    expect(result!.status).toBe("rejected");
    expect(result!.error!.fields![field]!.join(" ")).toMatch(message);
    expect(await detensionsOf(held.id)).toHaveLength(0);
    expect(await claims()).toBe(before);
  });
});

describe("a detension ordered by the engineer", () => {
  it("is stored exactly once under repeated and concurrent delivery, linked to its disposition", async () => {
    const op = detensionOp();
    const [a, b] = await Promise.all([push(op), push(op)]);
    const again = await push(op);
    expect([a.results[0]!.status, b.results[0]!.status].sort()).toEqual(["applied", "duplicate"]);
    expect(again.results[0]!.status).toBe("duplicate");
    const rows = await detensionsOf(held.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      id: op.recordId,
      disposition_id: held.dispositionId,
      operator_name: "R. Okafor",
      strands_detensioned: 1,
      entered: { pressure: "1200", unit: "psi" },
      remarks: "Wedges released with the jack; strand slack at the live end.",
      recorded_by: w.crew.id,
    });
    // 1200 psi × 0.00689475729 MPa/psi (exact factor of the psi, NIST SP 811) = 8.2737 MPa.
    expect(rows[0]!.release_pressure_mpa).toBeCloseTo(8.27371, 4);
    const audit = await t.db
      .selectFrom("audit_events")
      .select("outcome")
      .where("action", "=", "detension.record")
      .where("target", "=", held.id)
      .execute();
    expect(audit).toEqual([{ outcome: "success" }]);
  });

  it("keeps the tendon held for tails cut until it is stressed again", async () => {
    const [cut] = (await push(tailCutOp(held))).results;
    expect(cut).toMatchObject({ status: "applied", tailCut: { held: true } });
    expect(cut!.tailCut!.reasons.join(" ")).toMatch(
      /Detensioned: restress required \(no record since the detension at end A\)/,
    );
  });

  it("is no longer what holds the tendon once a record made after it comes in", async () => {
    const [detension] = (await push(detensionOp({ pressure: undefined }, restressed))).results;
    expect(detension!.status).toBe("applied");
    expect((await detensionsOf(restressed.id))[0]).toMatchObject({ entered: null, release_pressure_mpa: null });
    // A restress made after the detension (07:40, after 07:10).
    const [restress] = (await push(createOp(w, restressed.id, {}, { deviceTime: RESTRESSED_AT }))).results;
    expect(restress!.status).toBe("applied");
    const [cut] = (await push(tailCutOp(restressed))).results;
    expect(cut!.status).toBe("applied");
    expect(cut!.tailCut!.reasons.join(" ")).not.toMatch(/Detensioned/);
  });

  it("comes back with the pull, naming the disposition it answers", async () => {
    const pulled = await pullChanges(app, { user: crewSession(), cursor: "0", pourIds: [held.pourId] });
    const mine = (pulled.detensions ?? []).filter((d) => d.tendonId === held.id);
    expect(mine).toHaveLength(1);
    expect(mine[0]).toMatchObject({
      dispositionId: held.dispositionId,
      operatorName: "R. Okafor",
      strandsDetensioned: 1,
      entered: { pressure: "1200", unit: "psi" },
    });
    expect(mine[0]!.recordedByName).toBeTruthy();
    const later = await pullChanges(app, { user: crewSession(), cursor: pulled.cursor, pourIds: [held.pourId] });
    expect(later.detensions ?? []).toHaveLength(0);
  });
});

describe("the office and the stressing report", () => {
  it("show each detension in the tendon's record sequence, and whether it waits for its restress", async () => {
    const report = await getPourReport(t.db, { projectId: w.projectId, pourId: held.pourId });
    const col = (name: (typeof RECORD_COLUMNS)[number]) => RECORD_COLUMNS.indexOf(name);
    const tagOf = async (id: string) =>
      (await t.db.selectFrom("tendons").select("tag").where("id", "=", id).executeTakeFirstOrThrow()).tag;
    const rowsOf = async (id: string) => {
      const tag = await tagOf(id);
      return recordRows(report).filter((r) => r[col("Tendon")] === tag);
    };
    const heldRows = await rowsOf(held.id);
    expect(heldRows.map((r) => r[col("Stressing")])).toEqual([
      expect.not.stringMatching(/Detension/),
      expect.stringMatching(/^Detension \(ordered by disposition D-\d{4}\)$/),
    ]);
    expect(heldRows[1]![col("Verdict")]).toBe("Detensioned: restress required");
    expect(heldRows[1]![col("Operator")]).toBe("R. Okafor");
    expect(heldRows[1]![col("Final pressure")]).toBe("at release: 1200 psi");
    expect(heldRows[1]![col("Readings as entered")]).toBe("1 strand detensioned");
    // Detensioned between the first stressing and the restress.
    const again = await rowsOf(restressed.id);
    expect(again.map((r) => /Detension/.test(r[col("Stressing")]!))).toEqual([false, true, false]);
    expect(again[1]![col("Verdict")]).toBe("Detensioned; stressed again after");
    expect(again[1]![col("Final pressure")]).toBe("at release: not read");

    const office = await getTendonCase(t.db, { projectId: w.projectId, tendonId: held.id });
    expect(office.detensions).toHaveLength(1);
    expect(office.detensions[0]!.dispositionId).toBe(held.dispositionId);
    expect(office.awaitingRestress).toEqual(["A"]);
    expect((await getTendonCase(t.db, { projectId: w.projectId, tendonId: restressed.id })).awaitingRestress).toEqual(
      [],
    );
  });
});
