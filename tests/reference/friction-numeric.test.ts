import { bignumber } from "mathjs";
import numeric from "numeric";
import { describe, expect, it } from "vitest";
import { meanForceFactor, mirrorLevelN, predictElongation, type TendonInput } from "../../lib/elongation/index";
import { sampleTendon } from "./support";

// Independent checks of the closed forms with general-purpose reference libraries:
// - numeric.dopri (Dormand–Prince, numericjs) integrates dP/dx = −k(x)·P and dI/dx = P along
//   the tendon, so neither exponentials nor the segment formula are used on this side;
// - mathjs BigNumber (64 significant digits by default) evaluates (1 − e^-β)/β for the precision of the β → 0 form.
// The tendons are arbitrary test inputs.

type Ode = (x: number, y: number[]) => number[];
const dopri = numeric.dopri as unknown as (
  x0: number,
  x1: number,
  y0: number[],
  f: Ode,
  tol?: number,
  maxit?: number,
) => { x: number[]; y: number[][] };

/**
 * Integrates `f` from `y0` over [0, span] and returns the final state. dopri's tolerance is
 * absolute, so callers integrate in scaled variables (force over Pj, length over the tendon
 * length) that stay of order one; the check on the last x guards against a run cut short.
 */
function integrate(y0: number[], span: number, f: Ode): number[] {
  const solution = dopri(0, span, y0, f, 1e-13, 1_000_000);
  expect(solution.x[solution.x.length - 1]).toBeCloseTo(span, 12);
  return solution.y[solution.y.length - 1]!;
}

const decayPerMm = (t: TendonInput, s: { lengthMm: number; angleRad: number }): number =>
  t.wobblePerM / 1000 + (t.mu * s.angleRad) / s.lengthMm;
const lengthOf = (t: TendonInput): number => t.segments.reduce((sum, s) => sum + s.lengthMm, 0);

/**
 * Walks the segments in the given order; returns [force at the end, ∫P dx] in N and N·mm.
 * Scaled state: p = P/Pj and i = ∫P dx/(Pj·L), over u = x/L.
 */
function frictionOde(t: TendonInput, segments: readonly { lengthMm: number; angleRad: number }[]): [number, number] {
  const total = lengthOf(t);
  let state = [1, 0];
  for (const segment of segments) {
    const kL = decayPerMm(t, segment) * total;
    state = integrate(state, segment.lengthMm / total, (_, y) => [-kL * y[0]!, y[0]!]);
  }
  return [state[0]! * t.jackingForceN, state[1]! * t.jackingForceN * total];
}

const tendons: [string, TendonInput][] = [
  ["three-segment slab tendon", sampleTendon()],
  [
    "draped girder tendon, 12 strands",
    sampleTendon({
      segments: [
        { lengthMm: 1_500, angleRad: 0 },
        { lengthMm: 9_000, angleRad: 0.18 },
        { lengthMm: 12_000, angleRad: 0.24 },
        { lengthMm: 9_000, angleRad: 0.18 },
        { lengthMm: 1_500, angleRad: 0 },
      ],
      strandAreaMm2: 140,
      strandCount: 12,
      jackingForceN: 12 * 195_300,
      wobblePerM: 0.00066,
      mu: 0.2,
    }),
  ],
  ["straight, wobble only", sampleTendon({ segments: [{ lengthMm: 45_000, angleRad: 0 }], mu: 0 })],
];

describe("closed-form segment integral against numeric.dopri", () => {
  it.each(tendons)("%s, stressed from A and from B", (_, tendon) => {
    const axial = tendon.strandAreaMm2 * tendon.strandCount * tendon.modulusMPa;
    for (const ends of ["A", "B"] as const) {
      const segments = ends === "A" ? tendon.segments : [...tendon.segments].reverse();
      const [endForce, integral] = frictionOde(tendon, segments);
      const result = predictElongation({ ...tendon, ends });
      expect(result.grossMm / (integral / axial) - 1).toBeCloseTo(0, 9);
      expect(result.farEndForceN / endForce - 1).toBeCloseTo(0, 9);
    }
  });

  it.each(tendons)("%s, stressed from both ends", (_, tendon) => {
    // Both friction paths at once across the tendon, scaled as above; the tendon carries the
    // larger of the two forces at each point.
    const axial = tendon.strandAreaMm2 * tendon.strandCount * tendon.modulusMPa;
    const total = lengthOf(tendon);
    const totalExponent = tendon.segments.reduce((sum, s) => sum + decayPerMm(tendon, s) * s.lengthMm, 0);
    let state = [1, Math.exp(-totalExponent), 0];
    for (const segment of tendon.segments) {
      const kL = decayPerMm(tendon, segment) * total;
      state = integrate(state, segment.lengthMm / total, (_, y) => [-kL * y[0]!, kL * y[1]!, Math.max(y[0]!, y[1]!)]);
    }
    const result = predictElongation({ ...tendon, ends: "both" });
    expect(state[1]!).toBeCloseTo(1, 10); // the path from B arrives at Pj at B
    const integralNmm = state[2]! * tendon.jackingForceN * total;
    expect(result.grossMm / (integralNmm / axial) - 1).toBeCloseTo(0, 7);
  });
});

describe("anchor-set zone against numeric.dopri", () => {
  it.each(tendons)("%s: area between the lines up to Lset is Δset·A·E", (_, base) => {
    const tendon = { ...base, anchorSetMm: 6 };
    const axial = tendon.strandAreaMm2 * tendon.strandCount * tendon.modulusMPa;
    const seating = predictElongation(tendon).seating!;
    const mirror = mirrorLevelN(tendon.jackingForceN, seating);
    // Scaled state: [P/Pj, area between P and its mirror/(Pj·L)], up to the engine's Lset (or L).
    const total = lengthOf(tendon);
    const level = mirror / tendon.jackingForceN;
    let state = [1, 0];
    let start = 0;
    for (const segment of tendon.segments) {
      const length = Math.min(segment.lengthMm, seating.influenceMm - start);
      if (length <= 0) break;
      const kL = decayPerMm(tendon, segment) * total;
      state = integrate(state, length / total, (_, y) => [-kL * y[0]!, 2 * (y[0]! - level)]);
      start += segment.lengthMm;
    }
    state = [state[0]! * tendon.jackingForceN, state[1]! * tendon.jackingForceN * total];
    expect(state[1]! / (6 * axial) - 1).toBeCloseTo(0, 8);
    if (!seating.shortTendon) expect(state[0]! / mirror - 1).toBeCloseTo(0, 10);
  });
});

describe("(1 − e^-β)/β against mathjs BigNumber", () => {
  it.each([1e-14, 1e-9, 1e-6, 1e-4, 9.999e-4, 1e-3, 1.0001e-3, 0.01, 0.1, 0.5, 1, 5, 40])(
    "β = %d is within 2e-13 relative",
    (beta) => {
      const b = bignumber(beta);
      const exact = Number(b.neg().exp().neg().plus(1).div(b));
      expect(Math.abs(meanForceFactor(beta) / exact - 1)).toBeLessThan(2e-13);
    },
  );
});
