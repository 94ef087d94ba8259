import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { addConcreteResult } from "@/lib/server/add-concrete-result";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { listConcreteResults } from "@/lib/server/list-concrete-results";
import { copyDemoTendons, demoPerson, demoStressing, seededDemo, type DemoFixture } from "../support/records";
import { makePour, makeProject } from "../support/factories";
import { type TestDatabase } from "../support/database";
import { MPA_PER_PSI } from "@/lib/units";

// The concrete gate on real PostgreSQL: one concrete flag per pour however many tendons are
// stressed before the strength is confirmed, the pour's strength from the lab's results by the
// rule of lib/stressing/concrete-strength.ts, and the flag closed by results that confirm it.
// The demo project requires 3,000 psi before stressing (its seed): 3000 × 0.006894757293168 =
// 20.684 MPa (psi to MPa, NIST SP 811 Appendix B factor).
const REQUIRED_MPA = 3000 * MPA_PER_PSI;

let t: TestDatabase;
let fx: DemoFixture;
let inspector: { id: string; name: string };
let stressing: Awaited<ReturnType<typeof demoStressing>>;

beforeAll(async () => {
  ({ t, fx } = await seededDemo());
  inspector = await demoPerson(t.db, "inspector@demo.tautline.test");
  stressing = await demoStressing(t.db, fx);
});
afterAll(async () => {
  await t.drop();
});

/** A new pour with no confirmed concrete and `count` one-end tendons copied from the demo schedule. */
async function newPour(name: string, count: number) {
  const pour = await makePour(t.db, fx.projectId, { name });
  const tags = Array.from({ length: count }, (_, i) => `C-${i + 1}`);
  const tendons = await copyDemoTendons(t.db, { projectId: fx.projectId, pourId: pour.id }, tags);
  return { pourId: pour.id, tendons };
}

/** Each end of the tendon read as predicted, then the tendon evaluated. */
async function stress(tendon: { id: string; pour_id: string }) {
  return (await stressing.stress(tendon, 1)).evaluation;
}

const concreteFlags = (pourId: string) =>
  t.db
    .selectFrom("flags")
    .select(["id", "tendon_id", "status", "close_reason", "closed_by"])
    .where("pour_id", "=", pourId)
    .where("kind", "=", "concrete_unconfirmed")
    .execute();

describe("the concrete gate of a pour", () => {
  it("raises one concrete flag for the pour, not one per tendon, and closes it when results confirm the strength", async () => {
    const { pourId, tendons } = await newPour("Gate pour", 3);
    const first = await stress(tendons[0]!);
    expect(first.flagKinds).toContain("concrete_unconfirmed");
    expect((await stress(tendons[1]!)).flagKinds).not.toContain("concrete_unconfirmed");
    expect((await stress(tendons[2]!)).flagKinds).not.toContain("concrete_unconfirmed");
    const raised = await concreteFlags(pourId);
    expect(raised).toHaveLength(1);
    expect(raised[0]).toMatchObject({ tendon_id: tendons[0]!.id, status: "open" });

    // One specimen does not confirm (at least two are needed): the flag stays open.
    const one = await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 25, ageDays: 3, specimenCount: 1 },
    });
    expect(one).toMatchObject({ met: false, closedFlags: 0, confirmed: { strengthMPa: null } });

    // Two at 3 days average 18 MPa: confirmed but below the 20.68 MPa required.
    const low = await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 18, ageDays: 3, specimenCount: 2 },
    });
    // Hand check at 3 days: (1 × 25 + 2 × 18) / 3 = 61 / 3 = 20.33 MPa, below 20.68.
    expect(low.confirmed.strengthMPa).toBeCloseTo(61 / 3, 10);
    expect(low).toMatchObject({ met: false, closedFlags: 0, requiredMPa: REQUIRED_MPA });
    expect((await concreteFlags(pourId))[0]!.status).toBe("open");

    // At 4 days, 2 × 22 MPa: 22.0 MPa ≥ 20.68, the earlier age no longer counts, and the flag closes.
    const met = await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 22, ageDays: 4, specimenCount: 2 },
    });
    expect(met.confirmed.strengthMPa).toBe(22);
    expect(met).toMatchObject({ met: true, closedFlags: 1 });
    // A further set at 4 days: (2 × 22 + 1 × 25) / 3 = 23.0 MPa; nothing is left to close.
    const more = await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 25, ageDays: 4, specimenCount: 1 },
    });
    expect(more.confirmed.strengthMPa).toBeCloseTo(23, 10);
    expect(more).toMatchObject({ met: true, closedFlags: 0 });
    const [closed] = await concreteFlags(pourId);
    expect(closed).toMatchObject({ status: "closed", closed_by: inspector.id });
    // The demo project is in US units: 22.0 MPa / 0.006894757 MPa per psi (NIST SP 811) = 3,190.8 psi.
    expect(closed!.close_reason).toContain("3,191 psi (average of 2 specimens at 4 days) reaches");
    const pour = await t.db
      .selectFrom("pours")
      .select(["concrete_strength_mpa", "concrete_confirmed_by", "concrete_confirmed_at"])
      .where("id", "=", pourId)
      .executeTakeFirstOrThrow();
    expect(pour.concrete_strength_mpa).toBeCloseTo(23, 10);
    expect(pour.concrete_confirmed_by).toBe(inspector.id);
    expect(pour.concrete_confirmed_at).not.toBeNull();

    const listed = await listConcreteResults(t.db, { projectId: fx.projectId, pourId });
    expect(listed.results).toHaveLength(4);
    expect(listed.results.every((r) => r.enteredBy === inspector.name)).toBe(true);
    expect(listed).toMatchObject({ met: true, requiredMPa: REQUIRED_MPA });
    expect(listed.confirmed.strengthMPa).toBeCloseTo(23, 10);
  });

  it("tendons evaluated at the same moment still raise one open concrete flag for the pour", async () => {
    const { pourId, tendons } = await newPour("Race pour", 6);
    // Records first, then every evaluation at once: each reads "no concrete flag yet" before any writes.
    for (const tendon of tendons) await stressing.record(tendon, 1);
    const outcomes = await Promise.all(
      tendons.map((tendon) => evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" })),
    );
    const open = (await concreteFlags(pourId)).filter((f) => f.status === "open");
    expect(open).toHaveLength(1);
    expect(outcomes.filter((o) => o.flagKinds.includes("concrete_unconfirmed"))).toHaveLength(1);
    // The database itself refuses a second open one, whatever path it comes by.
    await expect(
      t.db
        .insertInto("flags")
        .values({
          project_id: fx.projectId,
          pour_id: pourId,
          tendon_id: tendons[1]!.id,
          kind: "concrete_unconfirmed",
          reason: "A second one",
        })
        .execute(),
    ).rejects.toThrow(/flags_one_open_concrete_per_pour/);
  });

  it("results entered before stressing: a clean pour of 5 tendons raises no concrete flag", async () => {
    const { pourId, tendons } = await newPour("Confirmed first", 5);
    const gate = await addConcreteResult(t.db, {
      projectId: fx.projectId,
      pourId,
      by: inspector,
      result: { specimen: "cylinder", strengthMPa: 24.1, ageDays: 5, specimenCount: 3 },
    });
    expect(gate.met).toBe(true);
    for (const tendon of tendons) expect((await stress(tendon)).flagKinds).toEqual([]);
    expect(await concreteFlags(pourId)).toHaveLength(0);
  });

  it("refuses a pour of another project and a lab report that was not uploaded, and writes nothing", async () => {
    const { pourId } = await newPour("Refusals", 1);
    const other = await makeProject(t.db, { name: "Elsewhere", code: "ELSE-1" });
    const result = { specimen: "cube" as const, strengthMPa: 30, ageDays: 7, specimenCount: 3 };
    await expect(addConcreteResult(t.db, { projectId: other.id, pourId, by: inspector, result })).rejects.toMatchObject(
      { code: "NOT_FOUND" },
    );
    await expect(
      addConcreteResult(t.db, {
        projectId: fx.projectId,
        pourId,
        by: inspector,
        result: { ...result, attachmentId: "0193a0a0-0000-7000-8000-000000000000" },
      }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT" });
    expect((await listConcreteResults(t.db, { projectId: fx.projectId, pourId })).results).toHaveLength(0);
    const pour = await t.db
      .selectFrom("pours")
      .select("concrete_strength_mpa")
      .where("id", "=", pourId)
      .executeTakeFirstOrThrow();
    expect(pour.concrete_strength_mpa).toBeNull();
  });
});
