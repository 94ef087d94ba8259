import { sql } from "kysely";
import { beforeEach, describe, expect, it } from "vitest";
import { MPA_PER_PSI } from "@/lib/units";
import { ASTM_A416_GRADE_270 } from "@/lib/elongation";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { getPourReport } from "@/lib/server/get-pour-report";
import { getTendonCase } from "@/lib/server/get-tendon-case";
import { RECORD_COLUMNS, recordRows } from "@/lib/reports/pour-rows";
import {
  insertRecord,
  seededDemoPerFile,
  insertDemoRecord,
  pressureForForce,
  demoPrediction,
} from "../support/records";

const { t, fx } = seededDemoPerFile();

const predictedFor = (tendonId: string) => demoPrediction(t.db, { projectId: fx.projectId, tendonId });

/** The gauge pressure on demo Set A that gives a force, from its stored calibration line. */
const pressureOnSetA = (forceN: number) => pressureForForce(t.db, fx.setA, forceN);

const flagsOf = (tendonId: string) =>
  t.db
    .selectFrom("flags")
    .select(["kind", "reason", "status"])
    .where("tendon_id", "=", tendonId)
    .orderBy("kind")
    .execute();
const notificationsOf = (tendonId: string) =>
  t.db
    .selectFrom("notifications")
    .innerJoin("flags", "flags.id", "notifications.flag_id")
    .select(["notifications.to_emails", "notifications.subject", "notifications.text_body"])
    .where("flags.tendon_id", "=", tendonId)
    .execute();

// The jacking force of one 0.5 in strand worked by hand, outside the code under test:
// - ASTM A416/A416M, Grade 270, 0.5 in seven-wire strand: minimum breaking strength 41,300 lbf (from memory).
// - ACI 318-19 Table 20.3.2.5.1: jacking force at most 0.80·fpu (from memory); the demo project keeps
//   the default jacking factor 0.80.
// - 1 lbf = 4.4482216152605 N exactly (NIST SP 811, Appendix B.8).
// 0.80 × 41,300 lbf = 33,040 lbf = 33.04 kip; 33,040 × 4.4482216152605 N = 146,969.24 N.
// 41,300 × 4.4482216152605 N = 183,711.55 N.
const BREAKING_HALF_INCH_N = 183_711.55;
const JACKING_TARGET_N = 146_969.24;

describe("the server's evaluation of a tendon", () => {
  let normalPressure: number;
  beforeEach(async () => {
    normalPressure = await pressureOnSetA(JACKING_TARGET_N);
  });

  it("jacks a demo 0.5 in monostrand tendon to 0.80·fpu·A = 33.04 kip (worked by hand above)", async () => {
    const half = ASTM_A416_GRADE_270.find((s) => s.designation === "0.5 in")!;
    expect(half.minBreakingStrengthN).toBeCloseTo(BREAKING_HALF_INCH_N, 1);
    const tendon = await fx.tendon("2-1-U01");
    const basis = await loadTendonBasis(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    expect(basis.tendon).toMatchObject({ strandSize: "0.5 in", strandCount: 1 });
    const predicted = await predictedFor(tendon.id);
    expect(predicted.jackingForceN).toBeCloseTo(JACKING_TARGET_N, 1);
    expect(predicted.engineInput.jackingForceN).toBeCloseTo(JACKING_TARGET_N, 1);
  });

  it("stores an in-band verdict with every input and raises nothing", async () => {
    const tendon = await fx.tendon("2-1-U01");
    const predicted = await predictedFor(tendon.id);
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm * 1.02,
      finalPressureMPa: normalPressure,
    });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome).toMatchObject({ verdict: "in band", provisional: false, flagKinds: [] });
    expect(outcome.deviationPct).toBeCloseTo(2, 9);
    const stored = await t.db
      .selectFrom("evaluations")
      .selectAll()
      .where("id", "=", outcome.evaluationId)
      .executeTakeFirstOrThrow();
    expect(stored.engine_version).toMatch(/^tautline-elongation\//);
    expect(stored.inputs).toMatchObject({
      project: { tolerancePct: 7, comparisonBasis: "net" },
      lot: { lotNumber: "AY-0871" },
    });
    expect(await flagsOf(tendon.id)).toEqual([]);
  });

  it("flags a long tendon once, queues one e-mail to the engineer with the inspector copied, and a replay adds nothing", async () => {
    const tendon = await fx.tendon("2-1-U02");
    const predicted = await predictedFor(tendon.id);
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm * 1.1,
      finalPressureMPa: normalPressure,
    });
    const first = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(first).toMatchObject({ verdict: "long", flagKinds: ["out_of_band"] });
    const flags = await flagsOf(tendon.id);
    expect(flags).toHaveLength(1);
    expect(flags[0]!.reason).toMatch(/\+10\.0 %, long of the ±7 % band/);
    const mails = await notificationsOf(tendon.id);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.to_emails.sort()).toEqual(["engineer@demo.tautline.test", "inspector@demo.tautline.test"]);
    expect(mails[0]!.text_body).toContain("2-1-U02");
    expect(mails[0]!.text_body).toContain("Caution");
    // The e-mail names the flag by the same reference as the engineer's page.
    const shown = await getTendonCase(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    expect(shown.flags[0]!.reference).toMatch(/^F-\d{4}$/);
    expect(mails[0]!.text_body).toContain(`Flag ${shown.flags[0]!.reference} (Out of band):`);

    const again = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(again.flagKinds).toEqual([]);
    expect(await flagsOf(tendon.id)).toHaveLength(1);
    expect(await notificationsOf(tendon.id)).toHaveLength(1);
  });

  it("keeps a lone end of a two-end tendon provisional and flags the total only when both ends are in", async () => {
    const tendon = await fx.tendon("2-1-B01");
    expect(tendon.ends).toBe("both");
    const predicted = await predictedFor(tendon.id);
    const a = predicted.prediction.perEndMm.A!;
    const b = predicted.prediction.perEndMm.B!;
    const share = (x: number) => (x / predicted.prediction.grossMm) * predicted.predictedMm;
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: share(a) * 0.9,
      finalPressureMPa: normalPressure,
    });
    const lone = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(lone).toMatchObject({ provisional: true, verdict: "short", flagKinds: [] });
    await insertRecord(t.db, {
      projectId: fx.projectId,
      tendon,
      end: "B",
      equipmentSetId: fx.setA,
      authorId: fx.crewId,
      measuredMm: share(b) * 0.9,
      finalPressureMPa: normalPressure,
    });
    const both = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(both).toMatchObject({ provisional: false, verdict: "short", flagKinds: ["out_of_band"] });
    expect(both.deviationPct).toBeCloseTo(-10, 6);
  });

  it("flags a jacking force above 0.80·fpu·A read from the gauge through the calibration", async () => {
    const tendon = await fx.tendon("2-1-U03");
    const predicted = await predictedFor(tendon.id);
    const over = await pressureOnSetA(JACKING_TARGET_N * 1.04);
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm,
      finalPressureMPa: over,
    });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.flagKinds).toContain("jacking_over_limit");
    const flag = (await flagsOf(tendon.id)).find((f) => f.kind === "jacking_over_limit")!;
    expect(flag.reason).toMatch(/above 0\.80·fpu·A = 33\.04 kip/);
  });

  // A dial is read to its graduation: the rule takes the lowest force the reading allows, half a
  // 100 psi graduation under it (UFGS 02490, from memory). The jacking target sits exactly at
  // 0.80·fpu·A, so 40 psi over it is still at the mark, 60 psi over it is past it.
  it("reads a gauge within half a 100 psi graduation of the mark as at the mark, and one past it as over the limit", async () => {
    const judgedWithGaugeOver = async (tag: string, psiOver: number) => {
      const tendon = await fx.tendon(tag);
      const predicted = await predictedFor(tendon.id);
      const ends = tendon.ends === "both" ? (["A", "B"] as const) : [tendon.ends];
      for (const end of ends) {
        await insertRecord(t.db, {
          projectId: fx.projectId,
          tendon,
          end,
          equipmentSetId: fx.setA,
          authorId: fx.crewId,
          measuredMm: (predicted.predictedMm * predicted.prediction.perEndMm[end]!) / predicted.prediction.grossMm,
          finalPressureMPa: normalPressure + psiOver * MPA_PER_PSI,
        });
      }
      return evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    };
    expect((await judgedWithGaugeOver("2-1-U05", 40)).flagKinds).not.toContain("jacking_over_limit");
    expect((await judgedWithGaugeOver("2-1-U08", 60)).flagKinds).toContain("jacking_over_limit");
  });

  it("flags a wire break, an expired calibration with the crew's reason, and a reading outside the calibrated range", async () => {
    const tendon = await fx.tendon("2-1-U04");
    const predicted = await predictedFor(tendon.id);
    // Demo Set B is calibrated up to 40 MPa and valid for 8 more days after seeding.
    await t.db
      .insertInto("records")
      .values({
        id: "01900000-0000-7000-8000-000000000001",
        project_id: fx.projectId,
        pour_id: tendon.pour_id,
        tendon_id: tendon.id,
        tendon_end: "A",
        chain_id: "01900000-0000-7000-8000-000000000001",
        revision: 1,
        equipment_set_id: fx.setB,
        expired_calibration_reason: "Set A in for repair",
        final_pressure_mpa: 41,
        reading_method: "marks",
        entered: JSON.stringify({}),
        measured_mm: predicted.predictedMm,
        wire_breaks: 1,
        device_time: new Date(Date.now() + 20 * 86_400_000).toISOString(),
        device_time_zone: "America/Chicago",
        device_id: "test-device",
        author_user_id: fx.crewId,
      })
      .execute();
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.flagKinds.sort()).toEqual(
      expect.arrayContaining(["calibration_expired", "calibration_range", "wire_break"]),
    );
    const flags = await flagsOf(tendon.id);
    expect(flags.find((f) => f.kind === "calibration_expired")!.reason).toContain("Set A in for repair");
    expect(flags.find((f) => f.kind === "wire_break")!.reason).toBe("1 wire break reported at end A.");
  });

  it("flags stressing before the required concrete strength is confirmed", async () => {
    const pour = await t.db.selectFrom("pours").select("id").where("name", "=", "L3 Pour 1").executeTakeFirstOrThrow();
    const tendon = await t.db
      .selectFrom("tendons")
      .select(["id", "pour_id"])
      .where("pour_id", "=", pour.id)
      .where("tag", "=", "3-1-U01")
      .executeTakeFirstOrThrow();
    const predicted = await predictedFor(tendon.id);
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm,
      finalPressureMPa: normalPressure,
    });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.flagKinds).toEqual(["concrete_unconfirmed"]);
  });

  it("flags an end stressed twice without a disposition", async () => {
    const tendon = await fx.tendon("2-1-U06");
    const predicted = await predictedFor(tendon.id);
    const base = {
      projectId: fx.projectId,
      tendon,
      end: "A" as const,
      equipmentSetId: fx.setA,
      authorId: fx.crewId,
      measuredMm: predicted.predictedMm,
      finalPressureMPa: normalPressure,
    };
    await insertRecord(t.db, { ...base, deviceTime: new Date(Date.now() - 2 * 3600_000).toISOString() });
    await insertRecord(t.db, { ...base, deviceTime: new Date(Date.now() - 3600_000).toISOString() });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.flagKinds).toEqual(["stressed_twice"]);
  });

  // Force agreement (ACI 318-11 §18.20.1, from memory: the force by elongation and by the gauge, a
  // difference over 7 % to be explained). A perfect net reading implies Pj = 33.04 kip (worked above);
  // the gauge at 92 % of it reads 0.92 × 33.04 = 30.40 kip, and 33.04/30.40 − 1 = +8.7 %.
  it("flags an elongation and a gauge that disagree on the force, naming both on the flag, the e-mail, the sheet and the report", async () => {
    const tendon = await fx.tendon("2-1-U07");
    const predicted = await predictedFor(tendon.id);
    await insertDemoRecord(t.db, fx, {
      tendon,
      measuredMm: predicted.predictedMm,
      finalPressureMPa: await pressureOnSetA(JACKING_TARGET_N * 0.92),
    });
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.verdict).toBe("in band");
    expect([...outcome.flagKinds].sort()).toEqual(["force_disagreement", "under_force"]);
    const flag = (await flagsOf(tendon.id)).find((f) => f.kind === "force_disagreement")!;
    expect(flag.reason).toMatch(/^End A: gauge 30\.40 kip, elongation implies 33\.04 kip \(\+8\.7 %, outside ±7 %\)/);
    const [mail] = await notificationsOf(tendon.id);
    expect(mail!.text_body).toContain(
      "Force, gauge and elongation: End A: gauge 30.40 kip, elongation implies 33.04 kip (+8.7 %, outside ±7 %).",
    );

    const c = await getTendonCase(t.db, { projectId: fx.projectId, tendonId: tendon.id });
    expect(c.figures!.ends).toHaveLength(1);
    expect(c.figures!.ends[0]!.gaugeForceN).toBeCloseTo(JACKING_TARGET_N * 0.92, 1);
    expect(c.figures!.ends[0]!.impliedForceN).toBeCloseTo(JACKING_TARGET_N, 1);
    expect(c.figures!.ends[0]!.forceDifferencePct).toBeCloseTo((1 / 0.92 - 1) * 100, 4);
    expect(c.figures!.ends[0]!.forceBandPct).toBe(7);

    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId: tendon.pour_id });
    const row = recordRows(report).find((r) => r[RECORD_COLUMNS.indexOf("Tendon")] === "2-1-U07")!;
    expect(row[RECORD_COLUMNS.indexOf("Force")]).toBe("30.40 kip");
    expect(row[RECORD_COLUMNS.indexOf("Force from elongation")]).toBe("33.04 kip (+8.7 %)");
  });

  it("never rewrites an evaluation: the database refuses UPDATE and DELETE", async () => {
    await expect(sql`update evaluations set verdict = 'in band'`.execute(t.db)).rejects.toThrow(/append-only/);
    await expect(sql`delete from evaluations`.execute(t.db)).rejects.toThrow(/append-only/);
    await expect(sql`update records set measured_mm = 1`.execute(t.db)).rejects.toThrow(/append-only/);
  });

  it("answers NOT_FOUND for another project's tendon", async () => {
    const other = await t.db.selectFrom("projects").select("id").where("code", "=", "QHM").executeTakeFirstOrThrow();
    const tendon = await fx.tendon("2-1-U01");
    await expect(
      evaluateTendon(t.db, { projectId: other.id, tendonId: tendon.id, reason: "sync" }),
    ).rejects.toMatchObject({ code: "NOT_FOUND" });
  });
});
