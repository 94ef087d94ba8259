import { describe, expect, it } from "vitest";
import { expectInputError, numbersIn, sampleTendon } from "../../tests/reference/support";
import { predictElongation } from "./predict";
import type { TendonInput } from "./types";

// Inputs here are arbitrary test tendons. Expected values come from the closed forms of
// DOMAIN.md §1.3 evaluated independently in the test (with Math.expm1, not the engine's code
// path), or from identities that hold whatever the numbers are.

const axial = (t: TendonInput): number => t.strandAreaMm2 * t.strandCount * t.modulusMPa;
const betaOf = (t: TendonInput, s: { lengthMm: number; angleRad: number }): number =>
  (t.wobblePerM * s.lengthMm) / 1000 + t.mu * s.angleRad;

/** Σ Pi·Li·(1 − e^-βi)/(βi·A·E) walking the given segments in order. */
function closedFormMm(t: TendonInput, segments: readonly { lengthMm: number; angleRad: number }[]): number {
  let force = t.jackingForceN;
  let total = 0;
  for (const segment of segments) {
    const beta = betaOf(t, segment);
    total += beta === 0 ? force * segment.lengthMm : (force * segment.lengthMm * -Math.expm1(-beta)) / beta;
    force *= Math.exp(-beta);
  }
  return total / axial(t);
}

describe("predictElongation — friction", () => {
  it("equals P·L/(A·E) with no friction", () => {
    const tendon = sampleTendon({ wobblePerM: 0, mu: 0, strandCount: 3, jackingForceN: 441_000 });
    const result = predictElongation(tendon);
    expect(result.grossMm).toBeCloseTo((441_000 * 30_000) / (98.7 * 3 * 196_500), 10);
    expect(result.farEndForceN).toBe(441_000);
    expect(result.averageForceN).toBeCloseTo(441_000, 8);
  });

  it("matches the segment-by-segment closed form from end A", () => {
    const tendon = sampleTendon();
    const result = predictElongation(tendon);
    expect(result.grossMm).toBeCloseTo(closedFormMm(tendon, tendon.segments), 10);
    expect(result.perEndMm).toEqual({ A: result.grossMm });
    const totalBeta = tendon.segments.reduce((sum, s) => sum + betaOf(tendon, s), 0);
    expect(result.farEndForceN).toBeCloseTo(tendon.jackingForceN * Math.exp(-totalBeta), 6);
    expect(result.averageForceN * result.lengthMm).toBeCloseTo(result.grossMm * axial(tendon), 3);
    expect(result.meetingPointMm).toBeNull();
    expect(result.lengthMm).toBe(30_000);
  });

  it("walks the segments in reverse when stressed from B", () => {
    const tendon = sampleTendon({ ends: "B" });
    const result = predictElongation(tendon);
    expect(result.grossMm).toBeCloseTo(closedFormMm(tendon, [...tendon.segments].reverse()), 10);
    expect(result.perEndMm).toEqual({ B: result.grossMm });
    // The curved segments sit nearer A, so pulling from B keeps more force in the straight part.
    expect(result.grossMm).not.toBeCloseTo(predictElongation(sampleTendon()).grossMm, 3);
  });

  it("splits a symmetric two-end tendon at mid-length into equal halves", () => {
    const half = [
      { lengthMm: 6_000, angleRad: 0.12 },
      { lengthMm: 9_000, angleRad: 0.05 },
    ];
    const tendon = sampleTendon({ segments: [...half, ...[...half].reverse()], ends: "both" });
    const result = predictElongation(tendon);
    const halfMm = closedFormMm(tendon, half);
    expect(result.perEndMm.A).toBeCloseTo(halfMm, 10);
    expect(result.perEndMm.B).toBeCloseTo(halfMm, 10);
    expect(result.grossMm).toBeCloseTo(2 * halfMm, 10);
    expect(result.meetingPointMm).toBeCloseTo(15_000, 6);
    const halfBeta = half.reduce((sum, s) => sum + betaOf(tendon, s), 0);
    expect(result.farEndForceN).toBeCloseTo(tendon.jackingForceN * Math.exp(-halfBeta), 6);
  });

  it("meets where the two friction paths carry equal force on an unsymmetric tendon", () => {
    const tendon = sampleTendon({ ends: "both" });
    const result = predictElongation(tendon);
    const x = result.meetingPointMm!;
    // Exponent from A up to x, with each segment's angle spread evenly along it.
    let fromA = 0;
    let start = 0;
    for (const s of tendon.segments) {
      const portion = Math.min(1, Math.max(0, (x - start) / s.lengthMm));
      fromA += portion * betaOf(tendon, s);
      start += s.lengthMm;
    }
    const total = tendon.segments.reduce((sum, s) => sum + betaOf(tendon, s), 0);
    expect(fromA).toBeCloseTo(total - fromA, 12);
    expect(result.farEndForceN).toBeCloseTo(tendon.jackingForceN * Math.exp(-total / 2), 6);
    expect(result.perEndMm.A! + result.perEndMm.B!).toBeCloseTo(result.grossMm, 12);
  });

  it("meets at mid-length when there is no friction at all", () => {
    const result = predictElongation(sampleTendon({ ends: "both", wobblePerM: 0, mu: 0 }));
    expect(result.meetingPointMm).toBeCloseTo(15_000, 9);
    expect(result.perEndMm.A).toBeCloseTo(result.perEndMm.B!, 10);
  });

  it("adds P·Lgrip/(A·E) at each stressed end for strand inside the jack", () => {
    for (const ends of ["A", "B", "both"] as const) {
      const without = predictElongation(sampleTendon({ ends }));
      const withGrip = predictElongation(sampleTendon({ ends, jackGripMm: 600 }));
      const perEnd = (147_000 * 600) / (98.7 * 196_500);
      expect(withGrip.grossMm - without.grossMm).toBeCloseTo(perEnd * (ends === "both" ? 2 : 1), 10);
    }
  });
});

describe("predictElongation — anchor set", () => {
  it("returns no seating when no anchor set is given, and net equals gross", () => {
    const result = predictElongation(sampleTendon());
    expect(result.seating).toBeNull();
    expect(result.netMm).toBe(result.grossMm);
  });

  it("takes the set off once per stressed end for the net elongation", () => {
    expect(predictElongation(sampleTendon({ anchorSetMm: 6 })).netMm).toBeCloseTo(
      predictElongation(sampleTendon()).grossMm - 6,
      12,
    );
    const both = sampleTendon({ ends: "both", anchorSetMm: 6 });
    expect(predictElongation(both).netMm).toBeCloseTo(predictElongation(both).grossMm - 12, 12);
  });

  it("puts the end of the set zone where the area between the lines equals Δset·A·E", () => {
    // Straight tendon with wobble only: P(x) = Pj·e^-kx in closed form.
    const tendon = sampleTendon({ segments: [{ lengthMm: 40_000, angleRad: 0 }], mu: 0, anchorSetMm: 6 });
    const seating = predictElongation(tendon).seating!;
    const k = tendon.wobblePerM / 1000;
    const pj = tendon.jackingForceN;
    const at = (x: number): number => pj * Math.exp(-k * x);
    const integralTo = (x: number): number => (pj * -Math.expm1(-k * x)) / k;
    const ls = seating.influenceMm;
    expect(2 * (integralTo(ls) - ls * at(ls))).toBeCloseTo(6 * axial(tendon), 0);
    expect(seating.anchorForceAfterN).toBeCloseTo(2 * at(ls) - pj, 6);
    expect(seating.lossAtAnchorN).toBeCloseTo(2 * (pj - at(ls)), 6);
    expect(seating.shortTendon).toBe(false);
    expect(seating.farForceAfterN).toBeCloseTo(at(40_000), 6);
    expect(seating.end).toBe("A");
    expect(seating.otherEnd).toBeNull();
  });

  it("spreads the set over the whole length when there is no friction (short-tendon case)", () => {
    const tendon = sampleTendon({ wobblePerM: 0, mu: 0, anchorSetMm: 6 });
    const seating = predictElongation(tendon).seating!;
    const uniformLoss = (6 * axial(tendon)) / 30_000; // ΔP0 = Δset·A·E/L + p·L with p = 0
    expect(seating.shortTendon).toBe(true);
    expect(seating.influenceMm).toBe(30_000);
    expect(seating.lossAtAnchorN).toBeCloseTo(uniformLoss, 6);
    expect(seating.farForceAfterN).toBeCloseTo(147_000 - uniformLoss, 6);
  });

  it("joins the long- and short-tendon cases continuously at Lset = L", () => {
    const base = sampleTendon({ segments: [{ lengthMm: 8_000, angleRad: 0.05 }] });
    const k = betaOf(base, base.segments[0]!) / 8_000;
    const pj = base.jackingForceN;
    // The set whose zone ends exactly at the far end: area over the full length.
    const edgeSetMm = (2 * ((pj * -Math.expm1(-k * 8_000)) / k - 8_000 * pj * Math.exp(-k * 8_000))) / axial(base);
    const below = predictElongation({ ...base, anchorSetMm: edgeSetMm * (1 - 1e-9) }).seating!;
    const above = predictElongation({ ...base, anchorSetMm: edgeSetMm * (1 + 1e-9) }).seating!;
    expect(below.shortTendon).toBe(false);
    expect(above.shortTendon).toBe(true);
    expect(above.anchorForceAfterN).toBeCloseTo(below.anchorForceAfterN, 2);
    expect(below.influenceMm).toBeCloseTo(8_000, 2);
  });

  it("finds the set zone across several segments with different friction slopes", () => {
    const tendon = sampleTendon({
      segments: [
        { lengthMm: 2_000, angleRad: 0.02 },
        { lengthMm: 3_000, angleRad: 0.15 },
        { lengthMm: 4_000, angleRad: 0.01 },
        { lengthMm: 20_000, angleRad: 0.3 },
      ],
      anchorSetMm: 6,
    });
    const seating = predictElongation(tendon).seating!;
    expect(seating.influenceMm).toBeGreaterThan(9_000); // past the first three segments
    // Area condition summed over the exact exponential pieces up to Lset.
    let start = 0;
    let force = tendon.jackingForceN;
    let integral = 0;
    let forceAtSet = Number.NaN;
    for (const s of tendon.segments) {
      const k = betaOf(tendon, s) / s.lengthMm;
      const length = Math.min(s.lengthMm, seating.influenceMm - start);
      integral += (force * -Math.expm1(-k * length)) / k;
      if (start + s.lengthMm >= seating.influenceMm) {
        forceAtSet = force * Math.exp(-k * length);
        break;
      }
      force *= Math.exp(-k * s.lengthMm);
      start += s.lengthMm;
    }
    expect(2 * (integral - seating.influenceMm * forceAtSet)).toBeCloseTo(6 * axial(tendon), 0);
    expect(seating.anchorForceAfterN).toBeCloseTo(2 * forceAtSet - tendon.jackingForceN, 6);
  });

  it("gives the average force after seating as (∫P dx − Δset·A·E per end)/L", () => {
    const tendon = sampleTendon({ ends: "both", anchorSetMm: 6 });
    const result = predictElongation(tendon);
    expect(result.seating!.averageForceAfterN).toBeCloseTo(
      result.averageForceN - (2 * 6 * axial(tendon)) / result.lengthMm,
      6,
    );
  });

  it("reports both ends for two-end stressing, the higher anchor force governing", () => {
    const result = predictElongation(sampleTendon({ ends: "both", anchorSetMm: 6 }));
    const seating = result.seating!;
    const other = seating.otherEnd!;
    expect(new Set([seating.end, other.end])).toEqual(new Set(["A", "B"]));
    expect(seating.anchorForceAfterN).toBeGreaterThanOrEqual(other.anchorForceAfterN);
    // Each end's zone stays on its own side of the meeting point here.
    const ownSide = (end: "A" | "B"): number =>
      end === "A" ? result.meetingPointMm! : result.lengthMm - result.meetingPointMm!;
    expect(seating.influenceMm).toBeLessThanOrEqual(ownSide(seating.end));
    expect(other.influenceMm).toBeLessThanOrEqual(ownSide(other.end));
  });

  it("treats a zero set as no loss", () => {
    const seating = predictElongation(sampleTendon({ anchorSetMm: 0 })).seating!;
    expect(seating.lossAtAnchorN).toBe(0);
    expect(seating.influenceMm).toBe(0);
    expect(seating.anchorForceAfterN).toBe(147_000);
  });

  it("refuses a set that would release the whole force", () => {
    expectInputError(() => predictElongation(sampleTendon({ anchorSetMm: 400 })), "anchorSetMm", "out-of-range");
  });
});

describe("predictElongation — bad input", () => {
  const cases: [string, Partial<TendonInput> | ((t: TendonInput) => unknown), string, string][] = [
    ["empty segments", { segments: [] }, "segments", "required"],
    ["missing segment", { segments: [{ lengthMm: 1000, angleRad: 0 }, null as never] }, "segments[1]", "required"],
    [
      "zero length",
      {
        segments: [
          { lengthMm: 1000, angleRad: 0 },
          { lengthMm: 0, angleRad: 0 },
        ],
      },
      "segments[1].lengthMm",
      "not-positive",
    ],
    ["NaN length", { segments: [{ lengthMm: Number.NaN, angleRad: 0 }] }, "segments[0].lengthMm", "not-finite"],
    ["text length", { segments: [{ lengthMm: "12" as never, angleRad: 0 }] }, "segments[0].lengthMm", "not-a-number"],
    ["negative angle", { segments: [{ lengthMm: 1000, angleRad: -0.1 }] }, "segments[0].angleRad", "negative"],
    ["missing angle", { segments: [{ lengthMm: 1000 } as never] }, "segments[0].angleRad", "required"],
    ["zero area", { strandAreaMm2: 0 }, "strandAreaMm2", "not-positive"],
    ["fractional strand count", { strandCount: 1.5 }, "strandCount", "not-integer"],
    ["zero strands", { strandCount: 0 }, "strandCount", "not-positive"],
    ["infinite modulus", { modulusMPa: Number.POSITIVE_INFINITY }, "modulusMPa", "not-finite"],
    ["negative force", { jackingForceN: -1 }, "jackingForceN", "not-positive"],
    ["negative wobble", { wobblePerM: -0.001 }, "wobblePerM", "negative"],
    ["NaN mu", { mu: Number.NaN }, "mu", "not-finite"],
    ["negative set", { anchorSetMm: -1 }, "anchorSetMm", "negative"],
    ["negative grip", { jackGripMm: -1 }, "jackGripMm", "negative"],
    ["unknown end", { ends: "C" as never }, "ends", "not-allowed"],
  ];
  it.each(cases)("%s", (_, change, field, code) => {
    const input = typeof change === "function" ? sampleTendon() : sampleTendon(change);
    expectInputError(() => predictElongation(input), field, code as never);
  });

  it("rejects a missing input object", () => {
    expectInputError(() => predictElongation(null as never), "input", "required");
  });

  it("accepts null for the optional inputs and treats it as absent", () => {
    const result = predictElongation(sampleTendon({ anchorSetMm: null as never, jackGripMm: null as never }));
    expect(result.seating).toBeNull();
    expect(result.grossMm).toBeCloseTo(predictElongation(sampleTendon()).grossMm, 12);
  });

  it("never puts NaN or Infinity in a result", () => {
    for (const ends of ["A", "B", "both"] as const) {
      for (const anchorSetMm of [undefined, 0, 6, 25]) {
        const values = numbersIn(predictElongation(sampleTendon({ ends, anchorSetMm, jackGripMm: 500 })));
        expect(values.length).toBeGreaterThan(5);
        expect(values.every(Number.isFinite)).toBe(true);
      }
    }
  });
});
