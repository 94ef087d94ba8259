import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import { compareElongation, resolutionEffect } from "./compare";

// Arbitrary readings against an arbitrary prediction of 200 mm; expected figures follow from
// deviation % = (measured − predicted)/predicted·100 and band = max(tol·predicted, floor).

describe("compareElongation", () => {
  it("reports deviation, band, absolute deviation and verdict", () => {
    const result = compareElongation({ measuredMm: 210, predictedMm: 200, tolerancePct: 7 });
    expect(result.deviationPct).toBeCloseTo(5, 12);
    expect(result.verdict).toBe("in band");
    expect(result.bandMm).toBeCloseTo(14, 12);
    expect(result.lowerMm).toBeCloseTo(186, 12);
    expect(result.upperMm).toBeCloseTo(214, 12);
    expect(result.absoluteDeviationMm).toBeCloseTo(10, 12);
    expect(result.impliedForceN).toBeNull();
    expect(result.checks).toEqual([]);
  });

  it("calls readings above the band long and below it short, the edges in band", () => {
    expect(compareElongation({ measuredMm: 214.5, predictedMm: 200, tolerancePct: 7 }).verdict).toBe("long");
    expect(compareElongation({ measuredMm: 185.5, predictedMm: 200, tolerancePct: 7 }).verdict).toBe("short");
    expect(compareElongation({ measuredMm: 214, predictedMm: 200, tolerancePct: 7 }).verdict).toBe("in band");
    expect(compareElongation({ measuredMm: 186, predictedMm: 200, tolerancePct: 7 }).verdict).toBe("in band");
  });

  it("widens the band to the absolute floor on short tendons", () => {
    const withoutFloor = compareElongation({ measuredMm: 44, predictedMm: 40, tolerancePct: 7 });
    const withFloor = compareElongation({ measuredMm: 44, predictedMm: 40, tolerancePct: 7, floorMm: 5 });
    expect(withoutFloor.verdict).toBe("long");
    expect(withFloor.bandMm).toBe(5);
    expect(withFloor.verdict).toBe("in band");
    // The floor never narrows a band: 7 % of 200 mm is wider than 5 mm.
    expect(compareElongation({ measuredMm: 210, predictedMm: 200, tolerancePct: 7, floorMm: 5 }).bandMm).toBeCloseTo(
      14,
      12,
    );
  });

  it("gives the force the measured elongation implies", () => {
    const result = compareElongation({ measuredMm: 190, predictedMm: 200, tolerancePct: 7, jackingForceN: 147_000 });
    expect(result.impliedForceN).toBeCloseTo((147_000 * 190) / 200, 9);
  });

  it("flags a measured elongation that is zero or negative", () => {
    for (const measuredMm of [0, -3]) {
      const result = compareElongation({ measuredMm, predictedMm: 200, tolerancePct: 7 });
      expect(result.verdict).toBe("short");
      expect(result.checks).toEqual([
        expect.objectContaining({ code: "elongation-not-positive", value: measuredMm, limit: 0, quantity: "length" }),
      ]);
    }
  });

  it("names the bad field", () => {
    const base = { measuredMm: 210, predictedMm: 200, tolerancePct: 7 };
    expectInputError(() => compareElongation({ ...base, predictedMm: 0 }), "predictedMm", "not-positive");
    expectInputError(() => compareElongation({ ...base, measuredMm: Number.NaN }), "measuredMm", "not-finite");
    expectInputError(() => compareElongation({ ...base, tolerancePct: -1 }), "tolerancePct", "negative");
    expectInputError(() => compareElongation({ ...base, floorMm: -1 }), "floorMm", "negative");
    expectInputError(() => compareElongation({ ...base, jackingForceN: 0 }), "jackingForceN", "not-positive");
    expectInputError(() => compareElongation({ ...base, measuredMm: undefined as never }), "measuredMm", "required");
  });
});

describe("resolutionEffect", () => {
  it("says when half a division either way straddles a band edge", () => {
    const near = resolutionEffect({ measuredMm: 213.6, predictedMm: 200, tolerancePct: 7, resolutionMm: 1 });
    expect(near).toEqual({ couldChangeVerdict: true, verdictAtLowMm: "in band", verdictAtHighMm: "long" });
    const clear = resolutionEffect({ measuredMm: 205, predictedMm: 200, tolerancePct: 7, resolutionMm: 1 });
    expect(clear.couldChangeVerdict).toBe(false);
  });

  it("names a bad resolution", () => {
    expectInputError(
      () => resolutionEffect({ measuredMm: 1, predictedMm: 2, tolerancePct: 7, resolutionMm: 0 }),
      "resolutionMm",
      "not-positive",
    );
  });
});
