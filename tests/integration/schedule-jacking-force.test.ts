import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ASTM_A416_GRADE_270 } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { importTendonSchedule } from "@/lib/server/import-tendon-schedule";
import { loadTendonBasis } from "@/lib/server/load-tendon-basis";
import { previewTendonEdit } from "@/lib/server/preview-schedule-edit";
import { pullChanges } from "@/lib/server/pull-changes";
import { updateTendon } from "@/lib/server/update-tendon";
import { judgeStressing } from "@/lib/stressing/judge";
import type { TendonInput } from "@/lib/schemas/tendon";
import { N_PER_KIP } from "@/lib/units";
import { seededDemo, type DemoFixture, insertDemoRecord } from "../support/records";
import { makePour } from "../support/factories";
import { judgeRecord } from "../support/judge-record";
import { type TestDatabase } from "../support/database";

// A tendon schedule imported with its own jacking force, on real PostgreSQL: the tendon is judged
// against that force, a tendon without one against the project's 0.80·fpu·A, an edit of the force
// judges the stressed tendon again (its preview counts it), and a force above 0.80·fpu·A is refused.
// 0.5 in grade 270 strand breaks at no less than 41,300 lbf (ASTM A416 Table 1, from memory), so
// 0.80·fpu·A = 33.04 kip and 0.75·fpu·A = 30.975 kip (ACI 318-19 Table 20.3.2.5.1, from memory; 0.75
// is the bridge practice the issue names, common practice).

let t: TestDatabase;
let fx: DemoFixture;
let pourId: string;
beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  const confirmed = await t.db
    .selectFrom("pours")
    .select("concrete_strength_mpa")
    .where("project_id", "=", fx.projectId)
    .where("concrete_strength_mpa", "is not", null)
    .executeTakeFirstOrThrow();
  pourId = (
    await makePour(t.db, fx.projectId, {
      name: "Jacking force pour",
      concreteStrengthMPa: confirmed.concrete_strength_mpa,
    })
  ).id;
});
afterAll(async () => {
  await t.drop();
});

const FPU_A = ASTM_A416_GRADE_270.find((s) => s.designation === "0.5 in")!.minBreakingStrengthN;
const HEADER =
  "tag,type,strand size [in],strands,ends,segments [ft@deg],jack grip [in],shop elongation [in],strand lot,member,stressing order,jacking force [kip]";

const tendonRow = (tag: string) =>
  t.db
    .selectFrom("tendons")
    .selectAll()
    .where("project_id", "=", fx.projectId)
    .where("tag", "=", tag)
    .executeTakeFirstOrThrow();
const flagsOf = (tendonId: string) =>
  t.db.selectFrom("flags").select(["kind", "status", "reason"]).where("tendon_id", "=", tendonId).execute();
const latest = (tendonId: string) =>
  t.db
    .selectFrom("evaluations")
    .select(["verdict", "reason", "inputs"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .executeTakeFirstOrThrow();

/** The judge's net prediction for marks read after lock-off on the tendon as stored now. */
async function netPrediction(tendonId: string) {
  const basis = await loadTendonBasis(t.db, { projectId: fx.projectId, tendonId });
  const probe = judgeStressing({
    ...basis,
    sets: [{ id: "s", name: "s", jackGripMm: null, maxForceN: null, calibrations: [] }],
    records: [judgeRecord({ id: "p", chainId: "p", equipmentSetId: "s" })],
  });
  return probe.ends[0]!.predictedMm;
}

/** The crew imports these schedule rows (under HEADER) into our pour. */
const importRows = (...rows: string[]) =>
  importTendonSchedule(t.db, { projectId: fx.projectId, pourId, csv: [HEADER, ...rows].join("\n"), by: fx.crewId });

describe("the schedule's jacking force, imported and judged", () => {
  it("judges a tendon against the schedule's force and one without against the project's; an edit re-judges", async () => {
    const imported = await importRows(
      "JF-SCHED,monostrand,0.5,1,A,30@0,18,,,,,30.975",
      "JF-PROJ,monostrand,0.5,1,A,30@0,18,,,,,",
    );
    expect(imported).toEqual({ imported: 2 });
    const sched = await tendonRow("JF-SCHED");
    const proj = await tendonRow("JF-PROJ");
    expect(sched.jacking_force_n!).toBeCloseTo(30.975 * N_PER_KIP, 6);
    expect(sched.jacking_force_n!).toBeCloseTo(0.75 * FPU_A, 6);
    expect(proj.jacking_force_n).toBeNull();

    // The pull carries the force to the tablet, so its target pressure and judge read the same.
    const user = {
      memberships: [{ projectId: fx.projectId, role: "crew", projectName: "", projectCode: "" }],
    } as unknown as Parameters<typeof pullChanges>[1]["user"];
    const pulled = await pullChanges(t.db, { user, cursor: "0", pourIds: [pourId] });
    expect(Object.fromEntries(pulled.tendons.map((x) => [x.tag, x.jackingForceN]))).toEqual({
      "JF-SCHED": sched.jacking_force_n,
      "JF-PROJ": null,
    });

    // Both pulled to 0.75·fpu·A on Set A's calibration, read exactly as the schedule's force predicts.
    const c = await t.db
      .selectFrom("calibrations")
      .select(["slope_n_per_mpa", "intercept_n"])
      .where("equipment_set_id", "=", fx.setA)
      .executeTakeFirstOrThrow();
    const pressure = (0.75 * FPU_A - c.intercept_n) / c.slope_n_per_mpa;
    const measuredMm = await netPrediction(sched.id);
    for (const tendon of [sched, proj])
      await insertDemoRecord(t.db, fx, {
        tendon,
        measuredMm,
        finalPressureMPa: pressure,
      });

    const judgedSched = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: sched.id, reason: "sync" });
    expect(judgedSched).toMatchObject({ verdict: "in band", flagKinds: [] });
    expect(await flagsOf(sched.id)).toEqual([]);
    expect((await latest(sched.id)).inputs).toMatchObject({
      jackingForceN: sched.jacking_force_n,
      jackingForceSource: "schedule",
      jackingForceFactor: null,
    });

    // 0.75 of the project's 0.80·fpu·A is 93.75 %: more than 2 % short.
    const judgedProj = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: proj.id, reason: "sync" });
    expect(judgedProj.flagKinds).toContain("under_force");
    const under = (await flagsOf(proj.id)).find((f) => f.kind === "under_force")!;
    expect(under.reason).toMatch(/0\.80·fpu·A; more than 2 % short/);
    expect((await latest(proj.id)).inputs).toMatchObject({ jackingForceSource: "project", jackingForceFactor: 0.8 });

    // Clearing the schedule's force: the preview counts the stressed tendon, the save judges it
    // again against the project's force and opens the under-force flag.
    const values: TendonInput = {
      tag: "JF-SCHED",
      kind: sched.kind,
      strandSize: "0.5 in",
      strandCount: 1,
      segments: sched.segments,
      ends: "A",
      jackGripMm: sched.jack_grip_mm,
      shopElongationMm: null,
      strandLotId: null,
      jackingForceN: null,
    };
    const preview = await previewTendonEdit(t.db, {
      projectId: fx.projectId,
      tendonId: sched.id,
      values,
      by: fx.crewId,
    });
    expect(preview).toMatchObject({ rejudged: 1, verdictsChanging: 1, flagsClosing: 0 });
    expect(await flagsOf(sched.id)).toEqual([]);
    const edited = await updateTendon(t.db, { projectId: fx.projectId, tendonId: sched.id, values, by: fx.crewId });
    expect(edited).toMatchObject({ reevaluated: 1 });
    expect((await latest(sched.id)).reason).toBe("tendon JF-SCHED schedule edited: jacking force");
    expect((await flagsOf(sched.id)).map((f) => [f.kind, f.status])).toContainEqual(["under_force", "open"]);

    // Put back (0.75·fpu·A): judged again, in band, and the under-force flag closes.
    const back = await updateTendon(t.db, {
      projectId: fx.projectId,
      tendonId: sched.id,
      values: { ...values, jackingForceN: sched.jacking_force_n },
      by: fx.crewId,
    });
    expect(back).toMatchObject({ reevaluated: 1 });
    expect((await latest(sched.id)).verdict).toBe("in band");
    expect((await flagsOf(sched.id)).filter((f) => f.status === "open")).toEqual([]);
  });

  it("refuses a schedule force above 0.80·fpu·A, naming the line and column, and imports nothing", async () => {
    const refused = await importRows(
      "JF-OVER,monostrand,0.5,1,A,30@0,18,,,,,33.05",
      "JF-FINE,monostrand,0.5,1,A,30@0,18,,,,,33",
    ).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).code).toBe("INVALID_INPUT");
    expect((refused as AppError).fields).toEqual({
      "line 2 · jacking force": [
        "The jacking force is above 0.80·fpu·A = 33.04 kip (146.96 kN) for 1 × 0.5 in strand (ACI 318-19 Table 20.3.2.5.1); give at most that, or leave it empty for the project's factor.",
      ],
    });
    const written = await t.db
      .selectFrom("tendons")
      .select("tag")
      .where("project_id", "=", fx.projectId)
      .where("tag", "in", ["JF-OVER", "JF-FINE"])
      .execute();
    expect(written).toEqual([]);
  });
});
