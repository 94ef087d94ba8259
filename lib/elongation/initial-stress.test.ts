import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import { fitApparentStiffness, totalFromInitial } from "./initial-stress";

// Arbitrary readings. Expected values follow from linear load–elongation: Δ(0→Pj) =
// Δ(Pi→Pj)·Pj/(Pj − Pi), and for steps on a line F = k·(reading − r0) the slope is k, the zero r0.

describe("totalFromInitial", () => {
  it("scales a 20 %→100 % reading to the full elongation", () => {
    expect(totalFromInitial({ measuredMm: 160, initialForceN: 0.2 * 147_000, jackingForceN: 147_000 })).toBeCloseTo(
      200,
      10,
    );
  });

  // Net basis: marks set at 20 % and read after lock-off. A tendon whose gross elongation at Pj is
  // 200 mm and whose anchor seats 6 mm shows m = 200·0.8 − 6 = 154 mm at the marks; its net total is
  // 194 mm. Worked by hand from the linear load–elongation relation (PTI field procedure for
  // initial-stress readings, from memory): (154 + 6)·Pj/(Pj − 0.2·Pj) − 6 = 194.
  it("on the net basis adds the seating back before scaling and takes it off after", () => {
    expect(
      totalFromInitial({ measuredMm: 154, initialForceN: 0.2 * 147_000, jackingForceN: 147_000, seatingMm: 6 }),
    ).toBeCloseTo(194, 10);
    // Scaling the net reading alone would give 192.5 mm: the seating scaled as if it were elongation.
    expect(totalFromInitial({ measuredMm: 154, initialForceN: 0.2 * 147_000, jackingForceN: 147_000 })).toBeCloseTo(
      192.5,
      10,
    );
  });

  it("on the net basis leaves a reading from zero force unchanged", () => {
    expect(totalFromInitial({ measuredMm: 206, initialForceN: 0, jackingForceN: 147_000, seatingMm: 6 })).toBe(206);
  });

  it("leaves a reading from zero force unchanged", () => {
    expect(totalFromInitial({ measuredMm: 212, initialForceN: 0, jackingForceN: 147_000 })).toBe(212);
  });

  it("names the bad field", () => {
    expectInputError(
      () => totalFromInitial({ measuredMm: 160, initialForceN: 147_000, jackingForceN: 147_000 }),
      "initialForceN",
      "out-of-range",
    );
    expectInputError(
      () => totalFromInitial({ measuredMm: 160, initialForceN: -1, jackingForceN: 147_000 }),
      "initialForceN",
      "negative",
    );
    expectInputError(
      () => totalFromInitial({ measuredMm: Number.NaN, initialForceN: 0, jackingForceN: 1 }),
      "measuredMm",
      "not-finite",
    );
    expectInputError(
      () => totalFromInitial({ measuredMm: 1, initialForceN: 0, jackingForceN: 1, seatingMm: -1 }),
      "seatingMm",
      "negative",
    );
    expectInputError(
      () => totalFromInitial({ measuredMm: 1, initialForceN: 0, jackingForceN: 0 }),
      "jackingForceN",
      "not-positive",
    );
  });
});

describe("fitApparentStiffness", () => {
  // Steps on F = 646.5·(reading − 37.5): stiffness 646.5 N/mm, slack-free zero at 37.5 mm.
  const k = 646.5;
  const zero = 37.5;
  const steps = [0.2, 0.4, 0.6, 0.8, 1].map((share) => {
    const forceN = share * 147_000;
    return { forceN, readingMm: zero + forceN / k };
  });

  it("recovers the stiffness, the apparent modulus and the slack-free zero", () => {
    const result = fitApparentStiffness({
      steps,
      lengthMm: 30_000,
      strandAreaMm2: 98.7,
      strandCount: 1,
      millModulusMPa: 196_500,
    });
    expect(result.stiffnessNPerMm).toBeCloseTo(k, 9);
    expect(result.r2).toBeCloseTo(1, 12);
    expect(result.apparentModulusMPa).toBeCloseTo((k * 30_000) / 98.7, 6);
    expect(result.millModulusMPa).toBe(196_500);
    expect(result.modulusRatio).toBeCloseTo((k * 30_000) / 98.7 / 196_500, 12);
    expect(result.zeroReadingMm).toBeCloseTo(zero, 9);
    expect(result.elongationFromZeroMm).toBeCloseTo(147_000 / k, 9);
  });

  it("leaves the ratio empty when no mill value is given", () => {
    const result = fitApparentStiffness({ steps, lengthMm: 30_000, strandAreaMm2: 98.7, strandCount: 2 });
    expect(result.millModulusMPa).toBeNull();
    expect(result.modulusRatio).toBeNull();
    expect(result.apparentModulusMPa).toBeCloseTo((k * 30_000) / (2 * 98.7), 6);
  });

  it("names the bad field", () => {
    const base = { lengthMm: 30_000, strandAreaMm2: 98.7, strandCount: 1 };
    expectInputError(() => fitApparentStiffness({ ...base, steps: steps.slice(0, 1) }), "steps", "too-few");
    expectInputError(
      () => fitApparentStiffness({ ...base, steps: [steps[0]!, { forceN: 1, readingMm: Number.NaN }] }),
      "steps[1].readingMm",
      "not-finite",
    );
    expectInputError(
      () =>
        fitApparentStiffness({
          ...base,
          steps: [
            { forceN: 1, readingMm: 5 },
            { forceN: 2, readingMm: 5 },
          ],
        }),
      "steps",
      "out-of-range",
    );
    expectInputError(
      () =>
        fitApparentStiffness({
          ...base,
          steps: [
            { forceN: 2, readingMm: 5 },
            { forceN: 1, readingMm: 9 },
          ],
        }),
      "steps",
      "out-of-range",
    );
    expectInputError(() => fitApparentStiffness({ ...base, steps, lengthMm: 0 }), "lengthMm", "not-positive");
    expectInputError(
      () => fitApparentStiffness({ ...base, steps, millModulusMPa: -5 }),
      "millModulusMPa",
      "not-positive",
    );
  });
});
