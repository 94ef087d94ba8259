import { describe, expect, it } from "vitest";
import { compareElongation, DEFAULT_TOLERANCE_PCT, resolutionEffect } from "../../lib/elongation/index";
import { inToMm, mmToIn, parseLength, resolutionStepMm } from "../../lib/units/index";

describe("elongation agreement for post-tensioning", () => {
  it("defaults to ±7 % (ACI 318-11 §18.20.1, quoted by EVstudio; carried into later editions)", () => {
    expect(DEFAULT_TOLERANCE_PCT).toBe(7);
    // A predicted value of 100 mm is an arbitrary test input.
    expect(compareElongation({ measuredMm: 107, predictedMm: 100, tolerancePct: DEFAULT_TOLERANCE_PCT }).verdict).toBe(
      "in band",
    );
    expect(
      compareElongation({ measuredMm: 107.2, predictedMm: 100, tolerancePct: DEFAULT_TOLERANCE_PCT }).verdict,
    ).toBe("long");
    expect(compareElongation({ measuredMm: 92.8, predictedMm: 100, tolerancePct: DEFAULT_TOLERANCE_PCT }).verdict).toBe(
      "short",
    );
  });
});

describe("short tendon read to 1/8 in (common practice in field procedures; eng-tips thread 151385, DOMAIN.md C12)", () => {
  // Calculated 2-3/4 in; readings to the nearest 1/8 in; 7 % of 2.75 in = 0.1925 in.
  const predictedMm = inToMm(2.75);
  const read = (typed: string): number => parseLength(typed, { field: "reading", system: "US" });
  const eighth = resolutionStepMm("1/8 in");

  it("has a band of 0.1925 in", () => {
    const result = compareElongation({ measuredMm: read("2 3/4"), predictedMm, tolerancePct: 7 });
    expect(mmToIn(result.bandMm)).toBeCloseTo(0.1925, 10);
  });

  it("calls a 3 in reading +9.1 %, long", () => {
    const result = compareElongation({ measuredMm: read("3"), predictedMm, tolerancePct: 7 });
    expect(result.deviationPct).toBeCloseTo(9.09, 2);
    expect(result.verdict).toBe("long");
  });

  it("calls a 2 7/8 in reading +4.5 %, in band", () => {
    const result = compareElongation({ measuredMm: read("2 7/8"), predictedMm, tolerancePct: 7 });
    expect(result.deviationPct).toBeCloseTo(4.5, 1);
    expect(result.verdict).toBe("in band");
  });

  it("shows that the 3 in verdict rests on the reading division, the 2 7/8 in one does not", () => {
    // The upper band edge is 2.9425 in; 3 in ± 1/16 in straddles it, 2 7/8 in ± 1/16 in does not.
    expect(
      resolutionEffect({ measuredMm: read("3"), predictedMm, tolerancePct: 7, resolutionMm: eighth })
        .couldChangeVerdict,
    ).toBe(true);
    expect(
      resolutionEffect({ measuredMm: read("2 7/8"), predictedMm, tolerancePct: 7, resolutionMm: eighth })
        .couldChangeVerdict,
    ).toBe(false);
  });
});
