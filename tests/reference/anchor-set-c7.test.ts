import { describe, expect, it } from "vitest";
import { influenceLengthMm, mirrorLevelN, seatPolyline } from "../../lib/elongation/index";
import { ftToMm, in2ToMm2, inToMm, ksiToMPa, mmToFt, MPA_PER_KSI } from "../../lib/units/index";

// DOMAIN.md §5 case C7: public 90-ft girder example ("PT Losses" calculation, scribd 187603860):
// fj = 0.75·270 ksi = 202.5 ksi, Δset = 0.375 in, E = 28,000 ksi, friction slope p ≈ 0.3676 ksi/ft.
// Published results: Lc = 48.79 ft, loss at anchor 35.87 ksi, stress at Lc 184.6 ksi, after
// seating 166.6 ksi at 0 ft and 177.7 ksi at 30 ft. Only the anchor-set part of that example is
// used (its segment angles appear rounded), on a constant-slope line that reproduces p.
// Stresses are carried as forces on one 0.5 in strand; the area cancels out of every figure.

const area = in2ToMm2(0.153);
const ksi = (stressKsi: number): number => ksiToMPa(stressKsi) * area; // as a force, N
const toKsi = (forceN: number): number => forceN / area / MPA_PER_KSI;
const pNPerMm = ksi(0.3676) / ftToMm(1);
const axialStiffnessN = area * ksiToMPa(28_000);
const jackingForceN = ksi(202.5);
const jackingAt = (feet: number): number => jackingForceN - pNPerMm * ftToMm(feet);

const seating = seatPolyline({
  points: [
    { xMm: 0, forceN: jackingForceN },
    { xMm: ftToMm(90), forceN: jackingAt(90) },
  ],
  anchorSetMm: inToMm(0.375),
  axialStiffnessN,
});

describe("anchor set on the 90-ft girder of DOMAIN.md C7 (scribd 187603860)", () => {
  it("has an influence length of 48.79 ft", () => {
    expect(mmToFt(seating.influenceMm)).toBeCloseTo(48.79, 2);
    expect(mmToFt(influenceLengthMm(inToMm(0.375), axialStiffnessN, pNPerMm))).toBeCloseTo(48.79, 2);
    expect(seating.shortTendon).toBe(false);
  });

  it("loses 35.87 ksi at the anchor", () => {
    expect(toKsi(seating.lossAtAnchorN)).toBeCloseTo(35.87, 2);
  });

  it("has 184.6 ksi at the end of the set zone", () => {
    expect(toKsi(mirrorLevelN(jackingForceN, seating))).toBeCloseTo(184.6, 1);
  });

  it("leaves 166.6 ksi at the anchor and 177.7 ksi at 30 ft after seating", () => {
    expect(toKsi(seating.anchorForceAfterN)).toBeCloseTo(166.6, 1);
    const at30 = 2 * mirrorLevelN(jackingForceN, seating) - jackingAt(30);
    expect(toKsi(at30)).toBeCloseTo(177.7, 1);
  });
});
