import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import { fitApparentStiffness, totalFromInitial, totalFromSteps } from "./initial-stress";

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

describe("totalFromSteps", () => {
  const pj = 147_000;
  // Two steps are the single initial reading: marks set at 20 %, m + set = 160 mm between the steps,
  // read 154 mm after a 6 mm seating → 194 mm net, as the hand-worked case of totalFromInitial above.
  it("with two steps equals the initial-stress formula on the net and the gross basis", () => {
    const steps = [
      { forceN: 0.2 * pj, readingMm: 5 },
      { forceN: pj, readingMm: 165 },
    ];
    const net = totalFromSteps({ measuredMm: 154, referenceForceN: 0.2 * pj, steps });
    expect(net.totalMm).toBeCloseTo(
      totalFromInitial({ measuredMm: 154, initialForceN: 0.2 * pj, jackingForceN: pj, seatingMm: 6 }),
      9,
    );
    expect(net.totalMm).toBeCloseTo(194, 9);
    // Ram travel read 160 mm from 20 %: 160·Pj/(0.8·Pj) = 200 mm gross.
    const gross = totalFromSteps({ measuredMm: 160, referenceForceN: 0.2 * pj, steps });
    expect(gross.totalMm).toBeCloseTo(200, 9);
    expect(net.r2).toBeCloseTo(1, 12);
  });

  it("with five collinear steps at 20/40/60/80/100 % gives the same total as two", () => {
    const steps = [0.2, 0.4, 0.6, 0.8, 1].map((f) => ({ forceN: f * pj, readingMm: 5 + 200 * f }));
    const fit = totalFromSteps({ measuredMm: 154, referenceForceN: 0.2 * pj, steps });
    expect(fit.totalMm).toBeCloseTo(194, 9);
    expect(fit.zeroReadingMm).toBeCloseTo(5, 9);
    expect(fit.stiffnessNPerMm).toBeCloseTo(pj / 200, 9);
  });

  // Hand-computed least squares (force on reading, as fitApparentStiffness): readings 10, 36, 61, 87,
  // 112 mm at 20, 40, 60, 80, 100 kN. Mean reading 61.2 mm, mean force 60 kN; Sxy = 5100 kN·mm,
  // Sxx = 6502.8 mm², Syy = 4000 kN². Stiffness 5100/6502.8 kN/mm; below the 20 kN reference
  // 20·6502.8/5100 = 25.501176… mm; r² = 5100²/(6502.8·4000) = 0.9999538…; zero reading
  // 61.2 − 60·6502.8/5100 = −15.303529… mm.
  it("fits scattered steps by least squares (hand-computed)", () => {
    const steps = [10, 36, 61, 87, 112].map((r, i) => ({ forceN: (i + 1) * 20_000, readingMm: r }));
    const fit = totalFromSteps({ measuredMm: 96, referenceForceN: 20_000, steps });
    expect(fit.belowReferenceMm).toBeCloseTo(25.50117647, 7);
    expect(fit.totalMm).toBeCloseTo(121.50117647, 7);
    expect(fit.r2).toBeCloseTo(0.99995386, 7);
    expect(fit.zeroReadingMm).toBeCloseTo(-15.30352941, 7);
    expect(fit.stiffnessNPerMm).toBeCloseTo(5_100_000 / 6502.8, 6);
  });

  it("adds nothing when the elongation was read from zero force", () => {
    const steps = [10, 36, 61].map((r, i) => ({ forceN: (i + 1) * 20_000, readingMm: r }));
    expect(totalFromSteps({ measuredMm: 96, referenceForceN: 0, steps }).totalMm).toBe(96);
  });

  it("refuses steps that give no line", () => {
    const cases: [steps: { forceN: number; readingMm: number }[], code: "too-few" | "out-of-range"][] = [
      [[{ forceN: 1, readingMm: 2 }], "too-few"],
      [
        [
          { forceN: 20_000, readingMm: 2 },
          { forceN: 20_000, readingMm: 9 },
        ],
        "too-few",
      ],
      [
        [
          { forceN: 20_000, readingMm: 9 },
          { forceN: 40_000, readingMm: 2 },
        ],
        "out-of-range",
      ],
    ];
    for (const [steps, code] of cases) {
      expectInputError(() => totalFromSteps({ measuredMm: 96, referenceForceN: 0, steps }), "steps", code);
    }
  });
});
