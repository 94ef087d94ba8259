import { describe, expect, it } from "vitest";
import { uuidv7 } from "uuidv7";
import { equipmentSetSchema } from "@/lib/schemas/equipment";
import { addCalibration } from "@/lib/server/add-calibration";
import { createEquipmentSet } from "@/lib/server/create-equipment-set";
import { evaluateTendon } from "@/lib/server/evaluate-tendon";
import { getPourReport } from "@/lib/server/get-pour-report";
import { RECORD_COLUMNS, recordRows } from "@/lib/reports/pour-rows";
import { listEquipmentSets } from "@/lib/server/list-equipment-sets";
import { pourOfDemoCopies, predictionAsRead, seededDemoPerFile, HALF_INCH } from "../support/records";
import { equipmentSetBody } from "../support/api-routes";

// An equipment set's draw-in per re-grip, on real PostgreSQL: stored with the set, listed, and used
// by the server's evaluation for a ram-travel record that types none, which says which value it used.
// Jacking at 0.80·fpu·A (ACI 318-19 Table 20.3.2.5.1, from memory), 0.5 in strand 41,300 lbf
// (ASTM A416 Table 1). The 1/4 in draw-in and 18 in grip are our test values.

const { t, fx } = seededDemoPerFile();

const DRAW_IN_MM = 6.35; // 1/4 in
const GRIP_MM = 457.2; // 18 in
const SLOPE = 6000; // N per MPa, zero intercept (our test calibration)

async function setWithDrawIn(name: string, drawInMm: number | null) {
  const { setId } = await createEquipmentSet(t.db, {
    projectId: fx.projectId,
    values: equipmentSetSchema.parse({
      ...equipmentSetBody(name, `${name}-J`, `${name}-G`),
      jackGripMm: GRIP_MM,
      drawInMm,
    }),
  });
  await addCalibration(t.db, {
    projectId: fx.projectId,
    setId,
    values: {
      calibratedOn: "2026-11-20",
      validUntil: null,
      laboratory: "Test lab",
      certificateAttachmentId: null,
      points: [10, 20, 30, 40].map((p) => ({ pressureMPa: p, forceN: SLOPE * p })),
    },
  });
  return setId;
}

/** A one-end tendon of our own (a copy of the demo's 2-1-U06, no grip of its own) in a pour of our own. */
async function tendonCopy(tag: string) {
  const { tendons } = await pourOfDemoCopies(t.db, fx.projectId, `Draw-in ${tag}`, [tag], {
    templateTag: "2-1-U06",
    jackGripMm: null,
  });
  return tendons[0]!;
}

/** Gross plus grip for ram travel on this tendon, from the judge (one stroke, nothing deducted). */
async function ramTravelPrediction(tendonId: string) {
  return (await predictionAsRead(t.db, { projectId: fx.projectId, tendonId, method: "strokes", jackGripMm: GRIP_MM }))
    .mm;
}

/** Three strokes summing `measuredMm`, with the draw-in typed or not. */
async function insertStrokes(
  tendon: { id: string; pour_id: string },
  setId: string,
  measuredMm: number,
  drawInMm: number | null,
) {
  const id = uuidv7();
  const third = (measuredMm / 3).toFixed(2);
  await t.db
    .insertInto("records")
    .values({
      id,
      project_id: fx.projectId,
      pour_id: tendon.pour_id,
      tendon_id: tendon.id,
      tendon_end: "A",
      chain_id: id,
      revision: 1,
      equipment_set_id: setId,
      final_pressure_mpa: (0.8 * HALF_INCH.minBreakingStrengthN) / SLOPE,
      reading_method: "strokes",
      entered: JSON.stringify({
        unit: "mm",
        strokes: [third, third, third],
        drawIn: drawInMm === null ? null : String(drawInMm),
      }),
      measured_mm: measuredMm,
      draw_in_mm: drawInMm,
      wire_breaks: 0,
      device_time: "2026-12-01T16:00:00Z",
      device_time_zone: "America/Chicago",
      device_id: "test-device",
      author_user_id: fx.crewId,
    })
    .execute();
}

const latestReading = async (tendonId: string) => {
  const ev = await t.db
    .selectFrom("evaluations")
    .select(["verdict", "deviation_pct", "inputs"])
    .where("tendon_id", "=", tendonId)
    .orderBy("created_at", "desc")
    .executeTakeFirstOrThrow();
  const readings = (ev.inputs as { readings: Record<string, unknown>[] }).readings;
  return { ...ev, reading: readings[0]! };
};

describe("an equipment set's draw-in per re-grip", () => {
  it("is stored and listed with the set; a negative value is refused naming the field", async () => {
    const setId = await setWithDrawIn("DI listed", DRAW_IN_MM);
    const listed = (await listEquipmentSets(t.db, fx.projectId)).find((s) => s.id === setId)!;
    expect(listed.drawInMm).toBe(DRAW_IN_MM);
    const bad = equipmentSetSchema.safeParse({ ...equipmentSetBody("x", "j", "g"), drawInMm: -1 });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({ path: ["drawInMm"], message: "Draw-in cannot be negative." });
    // Left out, it is none (sets made before it existed).
    expect(equipmentSetSchema.parse(equipmentSetBody("x", "j", "g")).drawInMm).toBeNull();
  });

  it("three strokes typed without a draw-in are judged with the set's, and the evaluation says so", async () => {
    const setId = await setWithDrawIn("DI used", DRAW_IN_MM);
    const tendon = await tendonCopy("DI-1");
    const predicted = await ramTravelPrediction(tendon.id);
    // A perfect pull in three strokes: the sum holds two re-grips' draw-in on top of the elongation.
    await insertStrokes(tendon, setId, predicted + 2 * DRAW_IN_MM, null);
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: tendon.id, reason: "sync" });
    expect(outcome.verdict).toBe("in band");
    expect(outcome.deviationPct!).toBeCloseTo(0, 9);
    const { reading } = await latestReading(tendon.id);
    expect(reading).toMatchObject({
      method: "strokes",
      strokeCount: 3,
      drawInMm: null,
      drawInSource: "equipment set",
      drawInUsedMm: DRAW_IN_MM,
    });
    expect(reading.drawInDeductedMm as number).toBeCloseTo(2 * DRAW_IN_MM, 12);
    // The report's row shows each stroke and the draw-in taken off, and whose it was (a US project).
    const report = await getPourReport(t.db, { projectId: fx.projectId, pourId: tendon.pour_id });
    const row = recordRows(report).find((r) => r[0] === "DI-1")!;
    expect(row[RECORD_COLUMNS.indexOf("Readings as entered")]).toMatch(
      /^stroke 1: .*, stroke 2: .*, stroke 3: .*; less 0\.50 in draw-in \(0\.25 in per re-grip, the equipment set's\)$/,
    );
  });

  it("a draw-in typed on the record wins; a set without one deducts nothing", async () => {
    const setId = await setWithDrawIn("DI typed", DRAW_IN_MM);
    const typed = await tendonCopy("DI-2");
    const predicted = await ramTravelPrediction(typed.id);
    await insertStrokes(typed, setId, predicted + 2 * 4, 4);
    expect((await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: typed.id, reason: "sync" })).verdict).toBe(
      "in band",
    );
    expect((await latestReading(typed.id)).reading).toMatchObject({ drawInSource: "record", drawInUsedMm: 4 });

    const bare = await setWithDrawIn("DI none", null);
    const plain = await tendonCopy("DI-3");
    // The same perfect pull on a set with no draw-in: 12.7 mm of re-grip loss counted as elongation.
    await insertStrokes(plain, bare, predicted + 2 * DRAW_IN_MM, null);
    const outcome = await evaluateTendon(t.db, { projectId: fx.projectId, tendonId: plain.id, reason: "sync" });
    expect(outcome.deviationPct!).toBeCloseTo(((2 * DRAW_IN_MM) / predicted) * 100, 9);
    expect((await latestReading(plain.id)).reading).toMatchObject({ drawInSource: "none", drawInDeductedMm: 0 });
  });
});
