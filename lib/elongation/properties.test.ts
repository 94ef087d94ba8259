import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { numbersIn } from "../../tests/reference/support";
import { predictElongation } from "./predict";
import type { StressedEnds, TendonInput } from "./types";

// Random tendons in (and somewhat beyond) the range met on site: 1–12 segments of 0.5–40 m,
// angle changes up to 0.6 rad per segment, K up to 0.01 /m, μ up to 0.3, 1–19 strands.
const segmentArb = fc.record({
  lengthMm: fc.double({ min: 500, max: 40_000, noNaN: true }),
  angleRad: fc.double({ min: 0, max: 0.6, noNaN: true }),
});

const tendonArb = fc.record({
  segments: fc.array(segmentArb, { minLength: 1, maxLength: 12 }),
  strandAreaMm2: fc.constantFrom(98.7, 140, 150),
  strandCount: fc.integer({ min: 1, max: 19 }),
  modulusMPa: fc.double({ min: 190_000, max: 200_000, noNaN: true }),
  jackingForceN: fc.double({ min: 50_000, max: 4_000_000, noNaN: true }),
  wobblePerM: fc.double({ min: 0, max: 0.01, noNaN: true }),
  mu: fc.double({ min: 0, max: 0.3, noNaN: true }),
  jackGripMm: fc.option(fc.double({ min: 0, max: 900, noNaN: true }), { nil: undefined }),
  ends: fc.constantFrom<StressedEnds>("A", "B", "both"),
});

/**
 * An anchor set scaled to the tendon: up to a tenth of the shortest stressed end's friction-path
 * elongation, which on an exponential force line always leaves more than 0.7·Pj at the end of
 * the set zone, so no random tendon is asked to release its whole force (that refusal is tested
 * separately).
 */
function withSet(tendon: TendonInput, share: number): TendonInput {
  const perEnd = Object.values(predictElongation({ ...tendon, jackGripMm: undefined }).perEndMm);
  return { ...tendon, anchorSetMm: Math.min(6, 0.1 * share * Math.min(...perEnd)) };
}

const relativeClose = (a: number, b: number, tolerance = 1e-10): void => {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(tolerance * Math.max(Math.abs(a), Math.abs(b)));
};

describe("elongation properties", () => {
  it("is proportional to the jacking force", () => {
    fc.assert(
      fc.property(tendonArb, fc.double({ min: 0.1, max: 10, noNaN: true }), (tendon, factor) => {
        const base = predictElongation(tendon);
        const scaled = predictElongation({ ...tendon, jackingForceN: tendon.jackingForceN * factor });
        relativeClose(scaled.grossMm, base.grossMm * factor);
        relativeClose(scaled.farEndForceN, base.farEndForceN * factor);
      }),
    );
  });

  it("does not change when a segment is split in two with length and angle in proportion", () => {
    fc.assert(
      fc.property(tendonArb, fc.nat(), fc.double({ min: 0.05, max: 0.95, noNaN: true }), (tendon, pick, share) => {
        const index = pick % tendon.segments.length;
        const segment = tendon.segments[index]!;
        const split = [
          ...tendon.segments.slice(0, index),
          { lengthMm: segment.lengthMm * share, angleRad: segment.angleRad * share },
          { lengthMm: segment.lengthMm * (1 - share), angleRad: segment.angleRad * (1 - share) },
          ...tendon.segments.slice(index + 1),
        ];
        const setMm = withSet(tendon, 1).anchorSetMm;
        const whole = predictElongation({ ...tendon, anchorSetMm: setMm });
        const parts = predictElongation({ ...tendon, segments: split, anchorSetMm: setMm });
        relativeClose(parts.grossMm, whole.grossMm, 1e-9);
        relativeClose(parts.farEndForceN, whole.farEndForceN, 1e-9);
        relativeClose(parts.seating!.anchorForceAfterN, whole.seating!.anchorForceAfterN, 1e-9);
        relativeClose(parts.seating!.influenceMm, whole.seating!.influenceMm, 1e-7);
      }),
    );
  });

  it("never gives more elongation for more friction", () => {
    fc.assert(
      fc.property(
        tendonArb,
        fc.double({ min: 0, max: 0.2, noNaN: true }),
        fc.double({ min: 0, max: 0.005, noNaN: true }),
        (tendon, extraMu, extraWobble) => {
          const base = predictElongation(tendon);
          const rougher = predictElongation({
            ...tendon,
            mu: tendon.mu + extraMu,
            wobblePerM: tendon.wobblePerM + extraWobble,
          });
          expect(rougher.grossMm).toBeLessThanOrEqual(base.grossMm * (1 + 1e-12));
          expect(rougher.farEndForceN).toBeLessThanOrEqual(base.farEndForceN * (1 + 1e-12));
        },
      ),
    );
  });

  it("gives at least the one-end total when both ends are stressed", () => {
    fc.assert(
      fc.property(tendonArb, (tendon) => {
        const both = predictElongation({ ...tendon, ends: "both" }).grossMm;
        expect(both).toBeGreaterThanOrEqual(predictElongation({ ...tendon, ends: "A" }).grossMm * (1 - 1e-12));
        expect(both).toBeGreaterThanOrEqual(predictElongation({ ...tendon, ends: "B" }).grossMm * (1 - 1e-12));
      }),
    );
  });

  it("never has a far-end force above the jacking force, nor seating that adds force", () => {
    fc.assert(
      fc.property(tendonArb, fc.double({ min: 0, max: 1, noNaN: true }), (tendon, share) => {
        const result = predictElongation(withSet(tendon, share));
        expect(result.farEndForceN).toBeLessThanOrEqual(tendon.jackingForceN);
        expect(result.averageForceN).toBeLessThanOrEqual(tendon.jackingForceN * (1 + 1e-12));
        expect(result.seating!.anchorForceAfterN).toBeLessThanOrEqual(tendon.jackingForceN);
        expect(result.seating!.averageForceAfterN).toBeLessThanOrEqual(result.averageForceN);
        expect(numbersIn(result).every(Number.isFinite)).toBe(true);
      }),
    );
  });
});
