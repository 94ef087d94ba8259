import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import { checkReadingInCalibration, fitCalibration, forceFromPressure, pressureForForce } from "./calibration";

// Arbitrary calibration points. A set lying exactly on force = 20 000·p − 1 500 (N, MPa) must fit
// that line with r² = 1; perturbed sets are judged against r² computed in the test.

const exactLine = [10, 20, 30, 40, 50, 60].map((p) => ({ pressureMPa: p, forceN: 20_000 * p - 1_500 }));

describe("fitCalibration", () => {
  it("recovers an exact line and raises no checks", () => {
    const fit = fitCalibration(exactLine);
    expect(fit.slope).toBeCloseTo(20_000, 8);
    expect(fit.intercept).toBeCloseTo(-1_500, 6);
    expect(fit.r2).toBeCloseTo(1, 12);
    expect(fit.pointCount).toBe(6);
    expect(fit.minPressureMPa).toBe(10);
    expect(fit.maxPressureMPa).toBe(60);
    expect(fit.checks).toEqual([]);
  });

  it("matches the least-squares formulas on scattered points", () => {
    const points = [
      { pressureMPa: 5, forceN: 98_000 },
      { pressureMPa: 15, forceN: 305_000 },
      { pressureMPa: 25, forceN: 497_000 },
      { pressureMPa: 35, forceN: 702_000 },
    ];
    const n = points.length;
    const sx = points.reduce((s, q) => s + q.pressureMPa, 0);
    const sy = points.reduce((s, q) => s + q.forceN, 0);
    const sxx = points.reduce((s, q) => s + q.pressureMPa ** 2, 0);
    const sxy = points.reduce((s, q) => s + q.pressureMPa * q.forceN, 0);
    const slope = (n * sxy - sx * sy) / (n * sxx - sx * sx);
    const intercept = (sy - slope * sx) / n;
    const mean = sy / n;
    const ssTot = points.reduce((s, q) => s + (q.forceN - mean) ** 2, 0);
    const ssRes = points.reduce((s, q) => s + (q.forceN - slope * q.pressureMPa - intercept) ** 2, 0);
    const fit = fitCalibration(points);
    expect(fit.slope).toBeCloseTo(slope, 6);
    expect(fit.intercept).toBeCloseTo(intercept, 4);
    expect(fit.r2).toBeCloseTo(1 - ssRes / ssTot, 12);
  });

  it("flags fewer than three points", () => {
    const fit = fitCalibration(exactLine.slice(0, 2));
    expect(fit.checks.map((c) => c.code)).toEqual(["calibration-few-points"]);
    expect(fit.checks[0]).toMatchObject({ value: 2, limit: 3, quantity: "count" });
  });

  it("flags a scattered chart with r² below 0.99", () => {
    const fit = fitCalibration([
      { pressureMPa: 10, forceN: 200_000 },
      { pressureMPa: 20, forceN: 300_000 },
      { pressureMPa: 30, forceN: 700_000 },
      { pressureMPa: 40, forceN: 750_000 },
    ]);
    expect(fit.r2).toBeLessThan(0.99);
    const check = fit.checks.find((c) => c.code === "calibration-poor-fit");
    expect(check).toMatchObject({ value: fit.r2, limit: 0.99, quantity: "ratio" });
  });

  it("names the bad point or the problem in its errors", () => {
    expectInputError(() => fitCalibration([exactLine[0]!]), "points", "too-few");
    expectInputError(() => fitCalibration([exactLine[0]!, null as never]), "points[1]", "required");
    expectInputError(
      () => fitCalibration([...exactLine, { pressureMPa: -1, forceN: 0 }]),
      "points[6].pressureMPa",
      "negative",
    );
    expectInputError(
      () => fitCalibration([exactLine[1]!, { pressureMPa: 30, forceN: Number.NaN }]),
      "points[1].forceN",
      "not-finite",
    );
    expectInputError(
      () =>
        fitCalibration([
          { pressureMPa: 10, forceN: 1 },
          { pressureMPa: 10, forceN: 2 },
        ]),
      "points",
      "out-of-range",
    );
    expectInputError(
      () =>
        fitCalibration([
          { pressureMPa: 10, forceN: 200 },
          { pressureMPa: 20, forceN: 100 },
        ]),
      "points",
      "out-of-range",
    );
  });
});

describe("force and pressure from the fitted line", () => {
  const fit = fitCalibration(exactLine);

  it("are inverse to each other and follow the line", () => {
    expect(forceFromPressure(fit, 25)).toBeCloseTo(20_000 * 25 - 1_500, 6);
    expect(pressureForForce(fit, 147_000)).toBeCloseTo((147_000 + 1_500) / 20_000, 10);
    for (const force of [50_000, 147_000, 260_700]) {
      expect(forceFromPressure(fit, pressureForForce(fit, force))).toBeCloseTo(force, 6);
    }
  });

  it("name the bad argument", () => {
    expectInputError(() => forceFromPressure(fit, -1), "pressureMPa", "negative");
    expectInputError(() => pressureForForce(fit, 0), "forceN", "not-positive");
    expectInputError(() => forceFromPressure({ slope: 0, intercept: 0 }, 10), "fit.slope", "not-positive");
    expectInputError(() => pressureForForce({ slope: 1, intercept: Number.NaN }, 10), "fit.intercept", "not-finite");
  });
});

describe("checkReadingInCalibration", () => {
  const fit = fitCalibration(exactLine.slice(1)); // 20–60 MPa

  it("passes readings inside the calibrated range, edges included", () => {
    expect(checkReadingInCalibration(fit, 20)).toEqual([]);
    expect(checkReadingInCalibration(fit, 33)).toEqual([]);
    expect(checkReadingInCalibration(fit, 60)).toEqual([]);
  });

  it("flags a reading above or below the range with the edge as the limit", () => {
    expect(checkReadingInCalibration(fit, 62)).toEqual([
      expect.objectContaining({ code: "reading-outside-calibration", value: 62, limit: 60, quantity: "pressure" }),
    ]);
    expect(checkReadingInCalibration(fit, 4)[0]).toMatchObject({ value: 4, limit: 20 });
  });

  it("names the reading field when the value is bad", () => {
    expectInputError(() => checkReadingInCalibration(fit, Number.NaN, "gaugeA"), "gaugeA", "not-finite");
  });
});
