import { describe, expect, it } from "vitest";
import { expectInputError, sampleTendon } from "../../tests/reference/support";
import { influenceLengthMm, mirrorLevelN, seatPolyline } from "./anchor-set";
import { predictElongation } from "./predict";

// Arbitrary test lines. Expected values are the textbook results for a straight force line
// (Lset = √(Δset·A·E/p), loss 2·p·Lset, short tendon ΔP0 = Δset·A·E/L + p·L, DOMAIN.md §1.4) or
// the area condition itself, evaluated in the test.

const AE = 98.7 * 196_500;

describe("seatPolyline", () => {
  it("reproduces the constant-slope formulas when the zone ends inside the line", () => {
    const p = 0.9; // N per mm
    const seating = seatPolyline({
      points: [
        { xMm: 0, forceN: 147_000 },
        { xMm: 40_000, forceN: 147_000 - p * 40_000 },
      ],
      anchorSetMm: 6,
      axialStiffnessN: AE,
    });
    const lset = Math.sqrt((6 * AE) / p);
    expect(seating.influenceMm).toBeCloseTo(lset, 6);
    expect(seating.lossAtAnchorN).toBeCloseTo(2 * p * lset, 6);
    expect(seating.shortTendon).toBe(false);
    expect(influenceLengthMm(6, AE, p)).toBeCloseTo(lset, 9);
  });

  it("uses ΔP0 = Δset·A·E/L + p·L when the set reaches past the far end", () => {
    const p = 0.9;
    const length = 5_000;
    const seating = seatPolyline({
      points: [
        { xMm: 0, forceN: 147_000 },
        { xMm: length, forceN: 147_000 - p * length },
      ],
      anchorSetMm: 6,
      axialStiffnessN: AE,
    });
    const loss = (6 * AE) / length + p * length;
    expect(seating.shortTendon).toBe(true);
    expect(seating.influenceMm).toBe(length);
    expect(seating.lossAtAnchorN).toBeCloseTo(loss, 6);
    // Far-end loss ΔP0 − 2·p·L (DOMAIN.md §1.4).
    expect(147_000 - p * length - seating.farForceAfterN).toBeCloseTo(loss - 2 * p * length, 6);
  });

  it("walks a line whose slope changes until the area between the lines equals Δset·A·E", () => {
    const points = [
      { xMm: 0, forceN: 150_000 },
      { xMm: 3_000, forceN: 148_500 }, // p = 0.5
      { xMm: 6_000, forceN: 144_000 }, // p = 1.5
      { xMm: 30_000, forceN: 132_000 }, // p = 0.5
    ];
    const seating = seatPolyline({ points, anchorSetMm: 6, axialStiffnessN: AE });
    const mirror = mirrorLevelN(150_000, seating);
    // Area between the jacking line and its mirror up to Lset, by the trapezoid rule on the
    // straight pieces (exact for straight lines).
    const forceAt = (x: number): number => {
      for (let i = 1; i < points.length; i++) {
        const a = points[i - 1]!;
        const b = points[i]!;
        if (x <= b.xMm) return a.forceN + ((b.forceN - a.forceN) * (x - a.xMm)) / (b.xMm - a.xMm);
      }
      return points[points.length - 1]!.forceN;
    };
    const knots = [0, 3_000, 6_000, seating.influenceMm].filter((x) => x <= seating.influenceMm).sort((a, b) => a - b);
    let area = 0;
    for (let i = 1; i < knots.length; i++) {
      const a = knots[i - 1]!;
      const b = knots[i]!;
      area += ((2 * (forceAt(a) - mirror) + 2 * (forceAt(b) - mirror)) / 2) * (b - a);
    }
    expect(seating.influenceMm).toBeGreaterThan(6_000);
    expect(area).toBeCloseTo(6 * AE, 0);
    expect(mirror).toBeCloseTo(forceAt(seating.influenceMm), 6);
  });

  it("agrees with the exponential engine when given the engine's force line finely sampled", () => {
    const tendon = sampleTendon({
      segments: [
        { lengthMm: 8_000, angleRad: 0.3 },
        { lengthMm: 20_000, angleRad: 0.05 },
      ],
      anchorSetMm: 6,
    });
    const engine = predictElongation(tendon).seating!;
    const points = [];
    for (let x = 0; x <= 28_000; x += 10) {
      const beta =
        x <= 8_000
          ? (0.0033 * x) / 1000 + (0.07 * 0.3 * x) / 8_000
          : (0.0033 * x) / 1000 + 0.07 * 0.3 + (0.07 * 0.05 * (x - 8_000)) / 20_000;
      points.push({ xMm: x, forceN: 147_000 * Math.exp(-beta) });
    }
    const sampled = seatPolyline({ points, anchorSetMm: 6, axialStiffnessN: AE });
    expect(sampled.influenceMm).toBeCloseTo(engine.influenceMm, -1); // within 5 mm on ~13 m
    expect(sampled.anchorForceAfterN).toBeCloseTo(engine.anchorForceAfterN, 0);
  });

  it("names the offending point in its errors", () => {
    const ok = { xMm: 0, forceN: 100_000 };
    expectInputError(() => seatPolyline({ points: [ok], anchorSetMm: 6, axialStiffnessN: AE }), "points", "too-few");
    expectInputError(
      () => seatPolyline({ points: [ok, { xMm: 0, forceN: 90_000 }], anchorSetMm: 6, axialStiffnessN: AE }),
      "points[1].xMm",
      "out-of-range",
    );
    expectInputError(
      () => seatPolyline({ points: [ok, { xMm: 1000, forceN: 110_000 }], anchorSetMm: 6, axialStiffnessN: AE }),
      "points[1].forceN",
      "out-of-range",
    );
    expectInputError(
      () => seatPolyline({ points: [ok, { xMm: 1000, forceN: Number.NaN }], anchorSetMm: 6, axialStiffnessN: AE }),
      "points[1].forceN",
      "not-finite",
    );
    expectInputError(
      () => seatPolyline({ points: [ok, { xMm: 1000, forceN: 90_000 }], anchorSetMm: -1, axialStiffnessN: AE }),
      "anchorSetMm",
      "negative",
    );
    expectInputError(() => influenceLengthMm(6, AE, 0), "frictionSlopeNPerMm", "not-positive");
  });
});
