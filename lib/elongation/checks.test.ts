import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import { fitCalibration, checkReadingInCalibration } from "./calibration";
import { CHECK_CODES, type CheckCode, checkStressLimits, stressLimits } from "./checks";
import { compareElongation } from "./compare";

// Arbitrary forces against an arbitrary breaking load of 200 kN per strand; the limits are the
// fractions 0.80 and 0.70 of fpu·A (ACI 318-19 Table 20.3.2.5.1, from memory).

describe("checkStressLimits", () => {
  const strand = { breakingLoadPerStrandN: 200_000, strandCount: 2 };

  it("passes forces at or below the limits", () => {
    expect(checkStressLimits({ ...strand, jackingForceN: 320_000, anchorForceAfterN: 280_000 })).toEqual([]);
  });

  it("flags jacking above 0.80·fpu·A and the anchor after seating above 0.70·fpu·A", () => {
    const checks = checkStressLimits({ ...strand, jackingForceN: 321_000, anchorForceAfterN: 281_000 });
    expect(checks).toEqual([
      expect.objectContaining({ code: "jacking-over-limit", value: 321_000, limit: 320_000, quantity: "force" }),
      expect.objectContaining({ code: "anchor-over-limit", value: 281_000, limit: 280_000, quantity: "force" }),
    ]);
    expect(checks[0]!.message).toMatch(/321\.0 kN.*320\.0 kN/);
  });

  it("flags jacking above the equipment's rated maximum", () => {
    const checks = checkStressLimits({ ...strand, jackingForceN: 300_000, equipmentMaxForceN: 290_000 });
    expect(checks.map((c) => c.code)).toEqual(["jacking-over-equipment"]);
  });

  it("accepts fpu and strand area instead of a breaking load", () => {
    expect(stressLimits({ fpuMPa: 1860, strandAreaMm2: 140, strandCount: 1 })).toEqual({
      breakingLoadN: 1860 * 140,
      jackingLimitN: 0.8 * 1860 * 140,
      anchorLimitN: 0.7 * 1860 * 140,
    });
  });

  it("names the missing or bad field", () => {
    expectInputError(() => stressLimits({ strandCount: 1 } as never), "breakingLoadPerStrandN", "required");
    expectInputError(() => stressLimits({ fpuMPa: 1860, strandCount: 1 } as never), "strandAreaMm2", "required");
    expectInputError(() => stressLimits({ breakingLoadPerStrandN: 1, strandCount: 0 }), "strandCount", "not-positive");
    expectInputError(() => checkStressLimits({ ...strand, jackingForceN: Number.NaN }), "jackingForceN", "not-finite");
    expectInputError(
      () => checkStressLimits({ ...strand, jackingForceN: 1, anchorForceAfterN: -1 }),
      "anchorForceAfterN",
      "not-positive",
    );
  });
});

describe("the closed set of check codes", () => {
  it("is produced in full by the checks, each code by at least one situation", () => {
    const seen = new Set<CheckCode>();
    const add = (checks: { code: CheckCode }[]): void => checks.forEach((c) => seen.add(c.code));
    add(
      checkStressLimits({
        breakingLoadPerStrandN: 100,
        strandCount: 1,
        jackingForceN: 90,
        anchorForceAfterN: 80,
        equipmentMaxForceN: 85,
      }),
    );
    const scattered = fitCalibration([
      { pressureMPa: 10, forceN: 100 },
      { pressureMPa: 20, forceN: 400 },
    ]);
    add(scattered.checks);
    add(
      fitCalibration([
        { pressureMPa: 10, forceN: 200 },
        { pressureMPa: 20, forceN: 300 },
        { pressureMPa: 30, forceN: 700 },
        { pressureMPa: 40, forceN: 750 },
      ]).checks,
    );
    add(checkReadingInCalibration(scattered, 25));
    add(compareElongation({ measuredMm: 0, predictedMm: 10, tolerancePct: 7 }).checks);
    expect([...seen].sort()).toEqual([...CHECK_CODES].sort());
  });
});
