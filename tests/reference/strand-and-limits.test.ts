import { describe, expect, it } from "vitest";
import {
  ASTM_A416_GRADE_270,
  checkStressLimits,
  DEFAULT_STRAND_MODULUS_MPA,
  findStrandSize,
  GRADE_270_FPU_MPA,
  stressLimits,
} from "../../lib/elongation/index";
import { in2ToMm2, kipToN, nToKip, nToKN } from "../../lib/units/index";

// Published strand properties and code limits. The inch-pound values are stored; the SI values
// printed beside them in the standard are what lib/units must reproduce to the printed digits.

/** `value` rounds to `printed` at the printed number of decimals (half a last digit either way). */
function expectPrinted(value: number, printed: number, decimals: number): void {
  expect(Math.abs(value - printed)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-9);
}

describe("ASTM A416 Grade 270 seven-wire strand (A416/A416M Tables 1 and 2, DOMAIN.md §2.1)", () => {
  // [nominal diameter, area in² → mm² as printed, breaking lbf → kN as printed]
  const table: [string, number, number, number, number, number][] = [
    ["0.375 in", 9.53, 0.085, 54.8, 23_000, 102.3],
    ["0.438 in", 11.11, 0.115, 74.2, 31_000, 137.9],
    ["0.5 in", 12.7, 0.153, 98.7, 41_300, 183.7],
    ["0.6 in", 15.24, 0.217, 140.0, 58_600, 260.7],
  ];

  it.each(table)("%s strand converts to the printed SI values", (designation, mm, in2, mm2, lbf, kN) => {
    const size = findStrandSize(designation)!;
    expect(size.areaIn2).toBe(in2);
    expect(size.minBreakingStrengthLbf).toBe(lbf);
    expectPrinted(size.nominalDiameterMm, mm, 2);
    expectPrinted(size.areaMm2, mm2, 1);
    expectPrinted(nToKN(size.minBreakingStrengthN), kN, 1);
  });

  it("lists exactly the four sizes of the table", () => {
    expect(ASTM_A416_GRADE_270.map((size) => size.designation)).toEqual(table.map((row) => row[0]));
  });

  it("has breaking strengths of fpu = 270 ksi times the nominal area (A416: strength on nominal area)", () => {
    for (const size of ASTM_A416_GRADE_270) {
      const fpuTimesArea = GRADE_270_FPU_MPA * size.areaMm2;
      expect(Math.abs(fpuTimesArea / size.minBreakingStrengthN - 1)).toBeLessThan(0.005);
    }
  });
});

describe("ACI 318 stress limits for post-tensioning strand (ACI 318-19 Table 20.3.2.5.1, from memory)", () => {
  const halfInch = { fpuMPa: GRADE_270_FPU_MPA, strandAreaMm2: in2ToMm2(0.153), strandCount: 1 };

  it("allows 0.80·fpu at jacking: 33.05 kips on a 0.5 in Grade 270 strand", () => {
    // 0.80 × 270 ksi × 0.153 in² = 33.05 kips (DOMAIN.md §2.3); gauges print "33.0 kips (80%)"
    // (EVstudio, "Reviewing Elongation Reports").
    expect(nToKip(stressLimits(halfInch).jackingLimitN)).toBeCloseTo(33.05, 2);
  });

  it("allows 0.70·fpu at anchorages after transfer: 28.9 kips on a 0.5 in Grade 270 strand", () => {
    expect(nToKip(stressLimits(halfInch).anchorLimitN)).toBeCloseTo(28.9, 1);
  });

  it("flags forces just above the limits and not those at them", () => {
    const atLimits = checkStressLimits({
      ...halfInch,
      jackingForceN: kipToN(0.8 * 270 * 0.153),
      anchorForceAfterN: kipToN(0.7 * 270 * 0.153),
    });
    expect(atLimits).toEqual([]);
    const above = checkStressLimits({ ...halfInch, jackingForceN: kipToN(33.1), anchorForceAfterN: kipToN(29.0) });
    expect(above.map((check) => check.code)).toEqual(["jacking-over-limit", "anchor-over-limit"]);
  });

  it("gives the same limits from the A416 breaking load: 0.80 × 41,300 lbf", () => {
    const limits = stressLimits({
      breakingLoadPerStrandN: findStrandSize("0.5 in")!.minBreakingStrengthN,
      strandCount: 1,
    });
    expect(nToKip(limits.jackingLimitN)).toBeCloseTo(33.04, 2);
  });
});

describe("default strand moduli when no mill certificate is linked", () => {
  it("uses 28,500 ksi = 196,500 MPa (AASHTO LRFD §5.4.4.2, from memory)", () => {
    expect(DEFAULT_STRAND_MODULUS_MPA.aashto).toBeCloseTo(196_500, -1);
  });

  it("uses 195 GPa in Eurocode practice (EN 1992-1-1 §3.3.6, from memory)", () => {
    expect(DEFAULT_STRAND_MODULUS_MPA.eurocode).toBe(195_000);
  });
});
