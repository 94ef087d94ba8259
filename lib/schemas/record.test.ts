import { describe, expect, it } from "vitest";
import { deriveFromEntered, EMPTY_RECORD_FORM, recordFormSchema, type Entered } from "./record";

// Conversion factors are exact by definition: 1 in = 25.4 mm (NIST SP 811, B.8);
// 1 psi = 6.894 757 kPa (NIST SP 811, B.8, to seven figures).
const US: Entered["units"] = { length: "in", pressure: "psi" };

describe("deriveFromEntered", () => {
  it("reads marks in fractional inches and gauge pressure in psi into mm and MPa", () => {
    const { values, problems } = deriveFromEntered(
      {
        units: US,
        initialPressure: "1000",
        finalPressure: "4227",
        marks: { before: "1 1/4", after: "8 3/8" },
        strokes: null,
        seating: "1/4",
      },
      "marks",
    );
    expect(problems).toEqual([]);
    expect(values!.measuredMm).toBeCloseTo((8.375 - 1.25) * 25.4, 9); // 180.975 mm
    expect(values!.finalPressureMPa).toBeCloseTo(29.1441, 4); // 4227 × 6.894757 kPa
    expect(values!.initialPressureMPa).toBeCloseTo(6.894757, 5);
    expect(values!.seatingMm).toBeCloseTo(6.35, 9);
  });

  it("sums ram strokes", () => {
    const { values } = deriveFromEntered(
      {
        units: { length: "mm", pressure: "MPa" },
        initialPressure: null,
        finalPressure: "29.1",
        marks: null,
        strokes: ["180", "95.5"],
        seating: null,
      },
      "strokes",
    );
    expect(values!.measuredMm).toBe(275.5);
  });

  it("names each box that does not read", () => {
    const { values, problems } = deriveFromEntered(
      {
        units: US,
        initialPressure: "5000",
        finalPressure: "4000",
        marks: { before: "3", after: "2" },
        strokes: null,
        seating: "abc",
      },
      "marks",
    );
    expect(values).toBeNull();
    expect(problems.map((p) => p.field).sort()).toEqual(["initialPressure", "marksAfter", "seating"]);
  });
});

describe("recordFormSchema", () => {
  const context = { units: US, expiredSetIds: ["set-old"], ends: ["A"] as const, correction: false };

  it("accepts a complete form", () => {
    const ok = recordFormSchema({ ...context, ends: ["A"] }).safeParse({
      ...EMPTY_RECORD_FORM,
      equipmentSetId: "set-new",
      finalPressure: "4200",
      marksBefore: "0",
      marksAfter: "4 1/2",
    });
    expect(ok.success).toBe(true);
  });

  it("wants a reason for an expired set, a reason for a correction, an end the tendon has, and readable strokes", () => {
    const result = recordFormSchema({ ...context, ends: ["A"], correction: true }).safeParse({
      ...EMPTY_RECORD_FORM,
      tendonEnd: "B",
      equipmentSetId: "set-old",
      readingMethod: "strokes",
      finalPressure: "4200",
      strokes: [{ value: "6" }, { value: "two" }],
    });
    expect(result.success).toBe(false);
    const paths = result.error!.issues.map((i) => i.path.join("."));
    expect(paths.sort()).toEqual(["expiredCalibrationReason", "revisionReason", "strokes.1.value", "tendonEnd"]);
  });
});
