import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/connect";
import { pressureForForce } from "@/lib/elongation";
import type { LiftoffPayload } from "@/lib/schemas/liftoff";
import type { SyncOp } from "@/lib/schemas/sync";
import { pullChanges } from "@/lib/server/pull-changes";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { pushOps } from "@/lib/server/push-ops";
import { updateProjectSettings } from "@/lib/server/update-project-settings";
import { recordDisposition } from "@/lib/server/record-disposition";
import { predictTendon, projectBasisFromRow } from "@/lib/stressing/basis";
import { expectedAnchorForceN } from "@/lib/stressing/liftoff";
import { mpaToPsi } from "@/lib/units";
import type { TestDatabase } from "../support/database";
import { demoPerson, flagIdOf } from "../support/records";
import { syncWorld, createOp, type SyncWorld } from "./sync-fixtures";
import { settingsFields } from "@/lib/schemas/project-settings";

/**
 * Lift-off checks through the sync push on real PostgreSQL: the check answers an engineer's
 * lift-off order on a tendon read short, is converted on the set's calibration in force that day and judged
 * against the engine's force at that anchor after seating; stored once under repeated and
 * concurrent delivery; outside the band it raises one liftoff_out_of_band flag and one e-mail to
 * the engineer; bad input names the field and writes nothing; the pull sends the result back.
 */

let t: TestDatabase;
let w: SyncWorld;
let app: Db;
const DEVICE = "tablet-liftoff-01";
let tendon: { id: string; pourId: string; ends: "A" | "B" | "both"; tag: string };
let dispositionId: string;
let restressDispositionId: string;
let expectedN: number;
let line: { slope: number; intercept: number; minPressureMPa: number; maxPressureMPa: number };

const crewSession = () =>
  ({
    memberships: w.crew.memberships.map((m) => ({ ...m, projectName: "", projectCode: "" })),
  }) as unknown as Parameters<typeof pullChanges>[1]["user"];

/** The gauge pressure, typed in psi as a US crew would (whole psi), that lifts off at a share of the expected force. */
const psiFor = (shareOfExpected: number) =>
  String(Math.round(mpaToPsi(pressureForForce(line, expectedN * shareOfExpected))));

function liftoffOp(over: Partial<LiftoffPayload> = {}): SyncOp & { payload: LiftoffPayload } {
  const payload: LiftoffPayload = {
    projectId: w.projectId,
    pourId: tendon.pourId,
    tendonId: tendon.id,
    dispositionId,
    tendonEnd: tendon.ends === "B" ? "B" : "A",
    equipmentSetId: w.setA.id,
    pressure: psiFor(1.01),
    pressureUnit: "psi",
    checkedAt: "2026-12-02T10:15:00-08:00",
    authorUserId: w.crew.id,
    ...over,
  };
  return { opId: randomUUID(), kind: "liftoff_check", recordId: randomUUID(), payload };
}

const push = (...ops: SyncOp[]) => pushOps(app, { user: w.crew, deviceId: DEVICE, ops });
const checksOf = () => t.db.selectFrom("liftoff_checks").selectAll().where("tendon_id", "=", tendon.id).execute();
const liftoffFlags = () =>
  t.db
    .selectFrom("flags")
    .selectAll()
    .where("tendon_id", "=", tendon.id)
    .where("kind", "=", "liftoff_out_of_band")
    .execute();

beforeAll(async () => {
  ({ t, w, app } = await syncWorld(4));
  const engineer = await demoPerson(t.db, "engineer@demo.tautline.test");
  // Two one-end tendons read short: the engineer orders a lift-off check on the first and a
  // restress on the second.
  const [first, second] = w.tendons.filter((x) => x.ends === "A");
  const ordered: string[] = [];
  for (const [i, x] of [first!, second!].entries()) {
    const [pushed] = (await push(createOp(w, x.id, { marksAfter: "2" }))).results;
    expect(pushed).toMatchObject({ status: "applied", evaluation: { verdict: "short" } });
    const flagId = await flagIdOf(t.db, x.id, "out_of_band");
    const { dispositionId: id } = await recordDisposition(app, {
      projectId: w.projectId,
      flagId,
      engineer: { id: engineer.id, name: "Demo Engineer" },
      disposition: {
        decision: i === 0 ? "liftoff_check" : "restress",
        reasons: "Check the force at the live end by lift-off and report the gauge pressure.",
        licenceStatement: "Licensed professional engineer, test licence (invented)",
      },
    });
    ordered.push(id);
  }
  [dispositionId, restressDispositionId] = ordered as [string, string];
  const row = await t.db.selectFrom("tendons").selectAll().where("id", "=", first!.id).executeTakeFirstOrThrow();
  tendon = { id: row.id, pourId: row.pour_id, ends: row.ends, tag: row.tag };

  const project = await t.db.selectFrom("projects").selectAll().where("id", "=", w.projectId).executeTakeFirstOrThrow();
  expect(project.liftoff_band_pct).toBe(5); // the migration's default
  const lot = row.strand_lot_id
    ? await t.db.selectFrom("strand_lots").selectAll().where("id", "=", row.strand_lot_id).executeTakeFirstOrThrow()
    : null;
  const set = await t.db
    .selectFrom("equipment_sets")
    .select("jack_grip_mm")
    .where("id", "=", w.setA.id)
    .executeTakeFirstOrThrow();
  const predicted = predictTendon({
    project: projectBasisFromRow(project),
    tendon: {
      strandSize: row.strand_size,
      strandCount: row.strand_count,
      segments: row.segments,
      ends: row.ends,
      jackGripMm: row.jack_grip_mm,
    },
    lot: lot ? { areaMm2: lot.area_mm2, modulusMPa: lot.modulus_mpa, breakingLoadN: lot.breaking_load_n } : null,
    equipmentGripMm: set.jack_grip_mm,
  });
  expectedN = expectedAnchorForceN(predicted, tendon.ends === "B" ? "B" : "A");
  // The force after seating lies below the jacking force (the anchor set takes some).
  expect(expectedN).toBeLessThan(predicted.jackingForceN);
  const cal = await t.db
    .selectFrom("calibrations")
    .selectAll()
    .where("id", "=", w.setA.calibrationId)
    .executeTakeFirstOrThrow();
  line = {
    slope: cal.slope_n_per_mpa,
    intercept: cal.intercept_n,
    minPressureMPa: cal.min_pressure_mpa,
    maxPressureMPa: cal.max_pressure_mpa,
  };
});
afterAll(() => t.drop());

describe("bad input names the field and writes nothing", () => {
  it.each([
    ["a pressure above the calibrated range", () => ({ pressure: "20000" }), "pressure", /above the range/],
    ["an unreadable pressure", () => ({ pressure: "lots" }), "pressure", /cannot be read/],
    [
      "a disposition that ordered no lift-off",
      () => ({ dispositionId: restressDispositionId }),
      "dispositionId",
      /No lift-off check was ordered/,
    ],
    [
      "a set of another project",
      () => ({ equipmentSetId: w.foreign.setId }),
      "equipmentSetId",
      /No such equipment set/,
    ],
    ["a missing end", () => ({ tendonEnd: "C" as never }), "tendonEnd", /Choose the end/],
    [
      "a day before the set was calibrated",
      () => ({ checkedAt: "2020-01-01T10:00:00Z" }),
      "equipmentSetId",
      /no calibration in force/,
    ],
  ])("%s", async (_what, over, field, message) => {
    const claimsBefore = await t.db.selectFrom("applied_ops").select("op_id").execute();
    const [result] = (await push(liftoffOp(over()))).results;
    expect(result!.status).toBe("rejected");
    expect(result!.error!.fields![field]!.join(" ")).toMatch(message);
    expect(await checksOf()).toHaveLength(0);
    expect(await liftoffFlags()).toHaveLength(0);
    expect(await t.db.selectFrom("applied_ops").select("op_id").execute()).toHaveLength(claimsBefore.length);
  });

  it("refuses the dead end of a one-end tendon", async () => {
    if (tendon.ends === "both") return expect(tendon.ends).toBe("both");
    const dead = tendon.ends === "A" ? "B" : "A";
    const [result] = (await push(liftoffOp({ tendonEnd: dead }))).results;
    expect(result).toMatchObject({
      status: "rejected",
      error: { fields: { tendonEnd: [expect.stringMatching(/dead end/)] } },
    });
    expect(await checksOf()).toHaveLength(0);
  });
});

describe("a lift-off check within the band", () => {
  it("is stored once, linked to the disposition, and raises no flag", async () => {
    const op = liftoffOp();
    const [a, b] = await Promise.all([push(op), push(op)]);
    const again = await push(op);
    expect([a.results[0]!.status, b.results[0]!.status].sort()).toEqual(["applied", "duplicate"]);
    expect(again.results[0]).toMatchObject({ status: "duplicate", liftoffCheck: { withinBand: true, bandPct: 5 } });

    const rows = await checksOf();
    expect(rows).toHaveLength(1);
    const row = rows[0]!;
    expect(row.disposition_id).toBe(dispositionId);
    expect(row.calibration_id).toBe(w.setA.calibrationId);
    expect(row.entered).toEqual({ pressure: op.payload.pressure, unit: "psi" });
    expect(row.expected_force_n).toBeCloseTo(expectedN, 6);
    // The force is the calibration line at the typed pressure, and the deviation follows from it.
    const typedMPa = Number(op.payload.pressure) / mpaToPsi(1);
    expect(row.pressure_mpa).toBeCloseTo(typedMPa, 9);
    expect(row.liftoff_force_n).toBeCloseTo(line.slope * typedMPa + line.intercept, 6);
    expect(row.deviation_pct).toBeCloseTo(((row.liftoff_force_n - expectedN) / expectedN) * 100, 9);
    expect(row.deviation_pct).toBeGreaterThan(0.9);
    expect(row.deviation_pct).toBeLessThan(1.1);
    expect(row.within_band).toBe(true);
    expect(row.raised_flag_id).toBeNull();
    expect(await liftoffFlags()).toHaveLength(0);
    // The disposition's own flag stays with the engineer: the result informs the next decision.
    const order = await t.db
      .selectFrom("flags")
      .innerJoin("dispositions", "dispositions.flag_id", "flags.id")
      .select("flags.status")
      .where("dispositions.id", "=", dispositionId)
      .executeTakeFirstOrThrow();
    expect(order.status).toBe("with_engineer");
  });
});

describe("a lift-off check outside the band", () => {
  it("raises one liftoff_out_of_band flag and one e-mail to the engineer, even when delivered twice", async () => {
    const op = liftoffOp({ pressure: psiFor(1.1) });
    const [a, b] = await Promise.all([push(op), push(op)]);
    expect([a.results[0]!.status, b.results[0]!.status].sort()).toEqual(["applied", "duplicate"]);
    const applied = [a, b].map((r) => r.results[0]!).find((r) => r.status === "applied")!;
    expect(applied.liftoffCheck!.withinBand).toBe(false);
    expect(applied.liftoffCheck!.deviationPct).toBeGreaterThan(9.9);

    const row = (await checksOf()).find((c) => c.id === op.recordId)!;
    expect(row.within_band).toBe(false);
    const flags = await liftoffFlags();
    expect(flags).toHaveLength(1);
    expect(row.raised_flag_id).toBe(flags[0]!.id);
    expect(flags[0]!.status).toBe("open");
    expect(flags[0]!.reason).toMatch(/outside the ±5 % band/);
    expect(flags[0]!.reason).toContain(`${op.payload.pressure} psi`);

    const mail = await t.db
      .selectFrom("notifications")
      .selectAll()
      .where("dedupe_key", "=", `liftoff:${op.recordId}`)
      .execute();
    expect(mail).toHaveLength(1);
    expect(mail[0]!.flag_id).toBe(flags[0]!.id);
    expect(mail[0]!.to_emails).toContain("engineer@demo.tautline.test");
    expect(mail[0]!.subject).toMatch(/Lift-off force outside band/);
    expect(mail[0]!.text_body).toContain("kip"); // the project's units
    // The e-mail names the flag by the reference the engineer's page shows.
    const shown = await getTendonCase(t.db, { projectId: w.projectId, tendonId: flags[0]!.tendon_id });
    const ref = shown.flags.find((f) => f.id === flags[0]!.id)!.reference;
    expect(mail[0]!.text_body).toContain(`Flag ${ref} (Lift-off force outside band):`);
  });

  it("follows the project's band, as saved on the settings screen", async () => {
    const settings = settingsFields(await getProjectSettings(t.db, w.projectId));
    expect(settings.liftoffBandPct).toBe(5);
    const save = (liftoffBandPct: number) =>
      updateProjectSettings(t.db, { projectId: w.projectId, values: { ...settings, liftoffBandPct }, by: w.crew.id });
    await save(12);
    try {
      const [result] = (await push(liftoffOp({ pressure: psiFor(1.1) }))).results;
      expect(result).toMatchObject({ status: "applied", liftoffCheck: { withinBand: true, bandPct: 12 } });
      expect(await liftoffFlags()).toHaveLength(1);
    } finally {
      await save(5);
    }
  });
});

describe("the pull", () => {
  it("sends each check with its result and the disposition ids it answers", async () => {
    const pulled = await pullChanges(app, { user: crewSession(), cursor: "0", pourIds: [tendon.pourId] });
    const checks = (pulled.liftoffChecks ?? []).filter((c) => c.tendonId === tendon.id);
    expect(checks).toHaveLength(3);
    expect(checks.every((c) => c.dispositionId === dispositionId)).toBe(true);
    expect(checks.map((c) => c.withinBand).sort()).toEqual([false, true, true]);
    expect(checks[0]!.checkedByName).toBeTruthy();
    const order = pulled.flags.flatMap((f) => f.dispositions ?? []).find((d) => d.decision === "liftoff_check");
    expect(order?.id).toBe(dispositionId);
    expect(pulled.flags.some((f) => f.tendonId === tendon.id && f.kind === "liftoff_out_of_band")).toBe(true);

    // A later pull from that cursor sends nothing new.
    const later = await pullChanges(app, { user: crewSession(), cursor: pulled.cursor, pourIds: [tendon.pourId] });
    expect(later.liftoffChecks ?? []).toHaveLength(0);
  });
});
