import { describe, expect, it } from "vitest";
import { expectInputError, sampleTendon } from "../../tests/reference/support";
import { predictElongation } from "./predict";
import { forceProfile } from "./profile";

// Arbitrary tendons. The profile must agree with predictElongation (same end forces, same
// seating, area under the jacking line = gross·A·E) and with the mirror rule.

function trapezoidArea(points: { xMm: number; jackingN: number }[]): number {
  let area = 0;
  for (let i = 1; i < points.length; i++) {
    area += ((points[i]!.jackingN + points[i - 1]!.jackingN) / 2) * (points[i]!.xMm - points[i - 1]!.xMm);
  }
  return area;
}

describe("forceProfile", () => {
  it("runs from 0 to L in order with the jacking and seated forces of the prediction", () => {
    const tendon = sampleTendon({ anchorSetMm: 6 });
    const { points, lengthMm } = forceProfile(tendon);
    const prediction = predictElongation(tendon);
    expect(points[0]!.xMm).toBe(0);
    expect(points[points.length - 1]!.xMm).toBe(lengthMm);
    expect(points.every((p, i) => i === 0 || p.xMm > points[i - 1]!.xMm)).toBe(true);
    expect(points[0]!.jackingN).toBe(147_000);
    expect(points[0]!.afterSeatingN).toBeCloseTo(prediction.seating!.anchorForceAfterN, 6);
    expect(points[points.length - 1]!.jackingN).toBeCloseTo(prediction.farEndForceN, 6);
    const zoneEnd = points.find((p) => Math.abs(p.xMm - prediction.seating!.influenceMm) < 1e-9)!;
    expect(zoneEnd.afterSeatingN).toBeCloseTo(zoneEnd.jackingN, 6);
    for (const p of points) {
      expect(p.afterSeatingN).toBeLessThanOrEqual(p.jackingN);
      if (p.xMm > prediction.seating!.influenceMm) expect(p.afterSeatingN).toBe(p.jackingN);
    }
  });

  it("encloses the predicted elongation: ∫P dx over A·E", () => {
    const tendon = sampleTendon({ ends: "both" });
    const { points } = forceProfile(tendon, { samplesPerSegment: 400 });
    const prediction = predictElongation(tendon);
    expect(trapezoidArea(points) / prediction.axialStiffnessN).toBeCloseTo(prediction.grossMm, 2);
  });

  it("dips to the far-end force at the meeting point for two-end stressing", () => {
    const tendon = sampleTendon({ ends: "both", anchorSetMm: 6 });
    const profile = forceProfile(tendon);
    const prediction = predictElongation(tendon);
    const lowest = Math.min(...profile.points.map((p) => p.jackingN));
    expect(lowest).toBeCloseTo(prediction.farEndForceN, 6);
    expect(profile.meetingPointMm).toBe(prediction.meetingPointMm);
    expect(profile.points[profile.points.length - 1]!.afterSeatingN).toBeLessThan(147_000);
  });

  it("leaves the seated line equal to the jacking line when no set is given", () => {
    const { points } = forceProfile(sampleTendon({ ends: "B" }), { samplesPerSegment: 3 });
    expect(points.every((p) => p.afterSeatingN === p.jackingN)).toBe(true);
    expect(points[points.length - 1]!.jackingN).toBe(147_000);
  });

  it("names a bad sample count and passes tendon errors through", () => {
    expectInputError(() => forceProfile(sampleTendon(), { samplesPerSegment: 0 }), "samplesPerSegment", "out-of-range");
    expectInputError(() => forceProfile(sampleTendon({ mu: -1 })), "mu", "negative");
  });
});
