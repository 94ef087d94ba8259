import { describe, expect, it } from "vitest";
import { fitCalibration } from "@/lib/elongation";
import { predictTendon, type ProjectBasis } from "./basis";
import { expectedAnchorForceN, judgeLiftoff, liftoffEndProblem, liftoffLine, liftoffPressureProblem } from "./liftoff";
import { projectBasis } from "@/tests/support/judge-record";

// Our own worked example (invented figures, computed by hand below; not from a published source).
//
// Calibration of the set: two load-cell points, 10 MPa → 32,000 N and 50 MPa → 162,000 N.
//   slope     = (162,000 − 32,000) / (50 − 10) = 130,000 / 40 = 3,250 N/MPa
//   intercept = 32,000 − 3,250 × 10 = −500 N
// Expected force at the anchor after seating: 132,000 N; band ±5 %.
//   lift-off at 41.0 MPa: 3,250 × 41.0 − 500 = 132,750 N; (132,750 − 132,000) / 132,000 = +0.568 % → within
//   lift-off at 44.0 MPa: 3,250 × 44.0 − 500 = 142,500 N; 10,500 / 132,000 = +7.955 % → outside
//   lift-off at 36.0 MPa: 3,250 × 36.0 − 500 = 116,500 N; −15,500 / 132,000 = −11.742 % → outside
//   lift-off at 42.8 MPa: 3,250 × 42.8 − 500 = 138,600 N; 6,600 / 132,000 = +5.000 % → on the edge, within
const calibration = (() => {
  const fit = fitCalibration([
    { pressureMPa: 10, forceN: 32_000 },
    { pressureMPa: 50, forceN: 162_000 },
  ]);
  return { slope: fit.slope, intercept: fit.intercept, minPressureMPa: 10, maxPressureMPa: 50 };
})();
const si = { unitSystem: "si" as const };

describe("judgeLiftoff (our own worked example, arithmetic in the comment above)", () => {
  it("converts the gauge pressure on the calibration line", () => {
    expect(calibration.slope).toBeCloseTo(3_250, 9);
    expect(calibration.intercept).toBeCloseTo(-500, 6);
  });

  it.each([
    [41.0, 132_750, 0.568, true],
    [44.0, 142_500, 7.955, false],
    [36.0, 116_500, -11.742, false],
    [42.8, 138_600, 5.0, true],
  ])("%s MPa lifts off at %s N, %s %%, within: %s", (pressureMPa, forceN, pct, within) => {
    const j = judgeLiftoff({ pressureMPa, calibration, expectedForceN: 132_000, bandPct: 5 });
    expect(j.liftoffForceN).toBeCloseTo(forceN, 6);
    expect(j.deviationPct).toBeCloseTo(pct, 3);
    expect(j.withinBand).toBe(within);
    expect(j.expectedForceN).toBe(132_000);
    expect(j.bandPct).toBe(5);
  });

  it("follows the project's band", () => {
    // +7.955 % is outside ±5 % and inside ±8 %.
    expect(judgeLiftoff({ pressureMPa: 44, calibration, expectedForceN: 132_000, bandPct: 8 }).withinBand).toBe(true);
  });

  it("says the result in words in the project's units", () => {
    const j = judgeLiftoff({ pressureMPa: 44, calibration, expectedForceN: 132_000, bandPct: 5 });
    expect(liftoffLine(si, j)).toBe(
      "Lift-off 142.5 kN against 132.0 kN expected after seating: +8.0 %, outside the ±5 % band.",
    );
  });
});

describe("liftoffPressureProblem", () => {
  it("refuses a pressure outside the calibrated range, naming the range", () => {
    const above = liftoffPressureProblem(si, calibration, 52);
    expect(above?.field).toBe("pressure");
    expect(above?.message).toMatch(/above the range this set was calibrated over/);
    expect(above?.message).toMatch(/10\.00 MPa to 50\.00 MPa/);
    expect(liftoffPressureProblem(si, calibration, 8)?.message).toMatch(/below the range/);
    expect(liftoffPressureProblem(si, calibration, 0)?.message).toMatch(/above zero/);
  });

  it("accepts the range's own ends", () => {
    expect(liftoffPressureProblem(si, calibration, 10)).toBeNull();
    expect(liftoffPressureProblem(si, calibration, 50)).toBeNull();
  });

  it("speaks psi on a US project", () => {
    expect(liftoffPressureProblem({ unitSystem: "us" }, calibration, 52)?.message).toMatch(/psi/);
  });
});

describe("expectedAnchorForceN", () => {
  const project: ProjectBasis = projectBasis();
  const straight = { strandSize: "0.5 in", strandCount: 1, segments: [{ lengthMm: 30_000, angleRad: 0 }] };

  // Our own worked example, by hand with the friction taken as a straight line near the anchor
  // (slope p = Pj·K) and the set zone Lset = √(Δset·A·E/p), loss at the anchor 2·p·Lset:
  //   Pj   = 0.80 × 41,300 lbf (ASTM A416 0.5 in) × 4.448222 N/lbf = 146,969 N
  //   p    = 146,969 × 0.0033 / 1,000 = 0.48500 N/mm
  //   A·E  = 98.709 mm² × 196,500.6 MPa (28,500 ksi, AASHTO LRFD §5.4.4.2, from memory) = 19,396,400 N
  //   Lset = √(6 × 19,396,400 / 0.48500) = 15,490 mm
  //   loss = 2 × 0.48500 × 15,490 = 15,026 N → after seating 146,969 − 15,026 = 131,943 N
  // The engine follows the exponential, whose slope flattens along the zone, so it finds a little
  // more force left (≈ 0.1 %); the check allows 0.2 %.
  it("is the force after seating at the stressed anchor of a one-end tendon", () => {
    const predicted = predictTendon({ project, tendon: { ...straight, ends: "A", jackGripMm: null }, lot: null });
    const expected = expectedAnchorForceN(predicted, "A");
    expect(predicted.jackingForceN).toBeCloseTo(146_969, 0);
    expect(Math.abs(expected - 131_943) / 131_943).toBeLessThan(0.002);
    expect(expected).toBe(predicted.prediction.seating!.anchorForceAfterN);
  });

  it("takes each end's own seating on a two-end tendon", () => {
    // A curve near end B makes the two ends' set zones differ.
    const tendon = {
      strandSize: "0.5 in",
      strandCount: 1,
      segments: [
        { lengthMm: 20_000, angleRad: 0 },
        { lengthMm: 10_000, angleRad: 0.4 },
      ],
      ends: "both" as const,
      jackGripMm: null,
    };
    const predicted = predictTendon({ project, tendon, lot: null });
    const seating = predicted.prediction.seating!;
    const a = expectedAnchorForceN(predicted, "A");
    const b = expectedAnchorForceN(predicted, "B");
    expect(a).not.toBeCloseTo(b, 0);
    expect([a, b]).toContain(seating.anchorForceAfterN);
    expect([a, b]).toContain(seating.otherEnd!.anchorForceAfterN);
    expect(seating.end === "A" ? a : b).toBe(seating.anchorForceAfterN);
  });

  it("is the jacking force when the basis has no anchor set", () => {
    const predicted = predictTendon({
      project: { ...project, anchorSetMm: 0 },
      tendon: { ...straight, ends: "A", jackGripMm: null },
      lot: null,
    });
    expect(expectedAnchorForceN(predicted, "A")).toBe(predicted.jackingForceN);
  });
});

describe("liftoffEndProblem", () => {
  it("refuses the dead end and accepts a stressed end", () => {
    expect(liftoffEndProblem("A", "B")?.field).toBe("tendonEnd");
    expect(liftoffEndProblem("A", "B")?.message).toMatch(/dead end/);
    expect(liftoffEndProblem("A", "A")).toBeNull();
    expect(liftoffEndProblem("both", "B")).toBeNull();
  });
});
