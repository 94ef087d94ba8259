import { describe, expect, it } from "vitest";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { updateStrandLot } from "@/lib/server/update-strand-lot";
import { updateTendon } from "@/lib/server/update-tendon";
import type { TendonInput } from "@/lib/schemas/tendon";
import { AppError } from "@/lib/errors";
import { predictionAsRead, seededDemoPerFile, HALF_INCH, insertDemoRecord, pressureForForce } from "../support/records";
import { makePour, makeStrandLot, makeTendons } from "../support/factories";

// Editing what a prediction reads (a strand lot's modulus, a tendon's schedule) judges the stressed
// tendons again on real PostgreSQL, in the edit's own transaction: a new evaluation with the cause,
// flags raised and closed by the rules, and the edit audited with what it touched.
// Jacking at 0.80·fpu·A (ACI 318-19 Table 20.3.2.5.1, from memory), 0.5 in strand 41,300 lbf
// (ASTM A416 Table 1). Elongation P·L/(A·E): the gross prediction is inversely proportional to E.

const { t, fx } = seededDemoPerFile();

// Our test lot: certificate values near the ASTM A416 nominal 98.71 mm² and 196.5 GPa.
const LOT = {
  lotNumber: "RE-EDIT-1",
  strandSize: "0.5 in",
  areaMm2: 98.7,
  modulusMPa: 196_500,
  breakingLoadN: 186_000,
  certificateAttachmentId: null,
};

/** A pour of our own with one copy of the demo's one-end 2-1-U06 on our lot, read exactly as predicted. */
async function stressedTendon(tag: string) {
  const source = await t.db.selectFrom("tendons").selectAll().where("tag", "=", "2-1-U06").executeTakeFirstOrThrow();
  const sourcePour = await t.db
    .selectFrom("pours")
    .select("concrete_strength_mpa")
    .where("id", "=", source.pour_id)
    .executeTakeFirstOrThrow();
  const pour = await makePour(t.db, fx.projectId, {
    name: `Edit pour ${tag}`,
    concreteStrengthMPa: sourcePour.concrete_strength_mpa,
  });
  const lot = await makeStrandLot(t.db, fx.projectId, { ...LOT, lotNumber: `${LOT.lotNumber}-${tag}` });
  const values: TendonInput = {
    tag,
    kind: source.kind,
    strandSize: source.strand_size,
    strandCount: source.strand_count,
    segments: source.segments,
    ends: source.ends,
    jackGripMm: source.jack_grip_mm,
    shopElongationMm: null,
    strandLotId: lot.id,
  };
  const tendon = (await makeTendons(t.db, { projectId: fx.projectId, pourId: pour.id }, [tag], values))[0]!;
  const predicted = await predictionOf(tendon.id);
  await insertDemoRecord(t.db, fx, {
    tendon,
    measuredMm: predicted.mm,
    finalPressureMPa: await pressureForForce(t.db, fx.setA, 0.8 * HALF_INCH.minBreakingStrengthN),
  });
  const first = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
  expect(first).toMatchObject({ verdict: "in band", flagKinds: [] });
  return { tendonId: tendon.id, lotId: lot.id, values, measuredMm: predicted.mm, setMm: predicted.setMm };
}

/** The judge's prediction for marks read after lock-off on the tendon as stored now. */
const predictionOf = (tendonId: string) => predictionAsRead(t.db, { projectId: fx.projectId, tendonId });

const latest = (tendonId: string) =>
  t.db
    .selectFrom("evaluations")
    .select(["verdict", "reason", "deviation_pct", "predicted_mm"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .executeTakeFirstOrThrow();
const flags = (tendonId: string) =>
  t.db
    .selectFrom("flags")
    .select(["kind", "status", "close_reason"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at")
    .execute();
const audits = (action: string, target: string) =>
  t.db
    .selectFrom("audit_events")
    .select(["detail", "actor_user_id"])
    .where("action", "=", action)
    .where("target", "=", target)
    .execute();

describe("editing a strand lot judges its stressed tendons again", () => {
  it("a modulus 10 % lower flips a perfect reading out of band and opens a flag; restoring it closes the flag", async () => {
    const s = await stressedTendon("RE-L1");
    // Gross ∝ 1/E (P·L/(A·E)); marks compare with gross − set. With E 10 % lower the net
    // prediction becomes (m + set)·E0/E1 − set, and the same reading falls short of it.
    const lowered = 0.9 * LOT.modulusMPa;
    const expectedPredicted = ((s.measuredMm + s.setMm) * LOT.modulusMPa) / lowered - s.setMm;
    const expectedDeviation = (s.measuredMm / expectedPredicted - 1) * 100;
    expect(expectedDeviation).toBeLessThan(-7); // outside the demo's ±7 % band

    const edited = await updateStrandLot(t.db, {
      projectId: fx.projectId,
      strandLotId: s.lotId,
      values: { ...LOT, lotNumber: `${LOT.lotNumber}-RE-L1`, modulusMPa: lowered },
      by: fx.crewId,
    });
    expect(edited).toMatchObject({ reevaluated: 1, changed: 1, closedFlags: 0 });
    const after = await latest(s.tendonId);
    expect(after.verdict).toBe("short");
    expect(after.reason).toBe(`strand lot ${LOT.lotNumber}-RE-L1 edited: modulus`);
    expect(after.predicted_mm!).toBeCloseTo(expectedPredicted, 6);
    expect(after.deviation_pct!).toBeCloseTo(expectedDeviation, 6);
    expect(await flags(s.tendonId)).toEqual([expect.objectContaining({ kind: "out_of_band", status: "open" })]);
    const [audit] = await audits("strand_lot.update", s.lotId);
    expect(audit!.detail).toMatchObject({
      changed: [{ field: "modulus MPa", from: LOT.modulusMPa, to: lowered }],
      reevaluated: 1,
      verdictsChanged: 1,
      reason: `strand lot ${LOT.lotNumber}-RE-L1 edited: modulus`,
    });

    const restored = await updateStrandLot(t.db, {
      projectId: fx.projectId,
      strandLotId: s.lotId,
      values: { ...LOT, lotNumber: `${LOT.lotNumber}-RE-L1` },
      by: fx.crewId,
    });
    expect(restored).toMatchObject({ reevaluated: 1, changed: 1, closedFlags: 1 });
    const back = await latest(s.tendonId);
    expect(back.verdict).toBe("in band");
    expect(back.deviation_pct!).toBeCloseTo(0, 9);
    const closed = await flags(s.tendonId);
    expect(closed).toEqual([expect.objectContaining({ kind: "out_of_band", status: "closed" })]);
    expect(closed[0]!.close_reason).toMatch(/strand lot RE-EDIT-1-RE-L1 edited: modulus/);

    // A change no prediction reads (the breaking load) judges nothing again, and is still audited.
    const breaking = await updateStrandLot(t.db, {
      projectId: fx.projectId,
      strandLotId: s.lotId,
      values: { ...LOT, lotNumber: `${LOT.lotNumber}-RE-L1`, breakingLoadN: 187_000 },
      by: fx.crewId,
    });
    expect(breaking.reevaluated).toBe(0);
    expect(await audits("strand_lot.update", s.lotId)).toHaveLength(3);
  });

  it("refuses a strand size that the lot's tendons do not have, naming the field and writing nothing", async () => {
    const s = await stressedTendon("RE-L2");
    const before = await t.db.selectFrom("evaluations").select("id").where("tendon_id", "=", s.tendonId).execute();
    const refused = await updateStrandLot(t.db, {
      projectId: fx.projectId,
      strandLotId: s.lotId,
      values: { ...LOT, lotNumber: `${LOT.lotNumber}-RE-L2`, strandSize: "0.6 in", modulusMPa: 150_000 },
      by: fx.crewId,
    }).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).fields?.strandSize?.[0]).toMatch(/RE-L2/);
    const lot = await t.db.selectFrom("strand_lots").selectAll().where("id", "=", s.lotId).executeTakeFirstOrThrow();
    expect(lot.modulus_mpa).toBe(LOT.modulusMPa);
    expect(await t.db.selectFrom("evaluations").select("id").where("tendon_id", "=", s.tendonId).execute()).toEqual(
      before,
    );
  });
});

describe("editing a tendon's schedule judges it again", () => {
  it("a length 20 % longer flips a perfect reading short and opens a flag; the length put back closes it", async () => {
    const s = await stressedTendon("RE-T1");
    const longer = { ...s.values, segments: s.values.segments.map((g) => ({ ...g, lengthMm: g.lengthMm * 1.2 })) };
    const edited = await updateTendon(t.db, {
      projectId: fx.projectId,
      tendonId: s.tendonId,
      values: longer,
      by: fx.crewId,
    });
    expect(edited).toMatchObject({ reevaluated: 1, changed: 1 });
    const after = await latest(s.tendonId);
    expect(after.reason).toBe("tendon RE-T1 schedule edited: segments");
    expect(after.verdict).toBe("short");
    // Against the judge's own prediction for the stored schedule: the same reading, a longer tendon.
    const predicted = await predictionOf(s.tendonId);
    expect(predicted.mm).toBeGreaterThan(s.measuredMm * 1.1);
    expect(after.predicted_mm!).toBeCloseTo(predicted.mm, 6);
    expect(after.deviation_pct!).toBeCloseTo((s.measuredMm / predicted.mm - 1) * 100, 6);
    expect(await flags(s.tendonId)).toEqual([expect.objectContaining({ kind: "out_of_band", status: "open" })]);
    const [audit] = await audits("tendon.update", s.tendonId);
    expect(audit!.detail).toMatchObject({ changed: ["segments"], reevaluated: 1, verdictChanged: true });

    const back = await updateTendon(t.db, {
      projectId: fx.projectId,
      tendonId: s.tendonId,
      values: s.values,
      by: fx.crewId,
    });
    expect(back).toMatchObject({ reevaluated: 1, closedFlags: 1 });
    expect((await latest(s.tendonId)).verdict).toBe("in band");
    expect(await flags(s.tendonId)).toEqual([expect.objectContaining({ kind: "out_of_band", status: "closed" })]);

    // The same row saved again, or only a new tag: no number moved, nothing judged again.
    const same = await updateTendon(t.db, {
      projectId: fx.projectId,
      tendonId: s.tendonId,
      values: { ...s.values, tag: "RE-T1b" },
      by: fx.crewId,
    });
    expect(same.reevaluated).toBe(0);
    expect((await latest(s.tendonId)).reason).toBe("tendon RE-T1 schedule edited: segments");
  });

  it("refuses an edit of a tendon on another project as not found", async () => {
    const s = await stressedTendon("RE-T2");
    const other = await t.db
      .insertInto("projects")
      .values({ code: "REX", name: "Another project" })
      .returning("id")
      .executeTakeFirstOrThrow();
    const refused = await updateTendon(t.db, {
      projectId: other.id,
      tendonId: s.tendonId,
      values: s.values,
      by: fx.crewId,
    }).catch((e: unknown) => e);
    expect(refused).toMatchObject({ code: "NOT_FOUND" });
  });
});
