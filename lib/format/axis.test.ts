import { describe, expect, it } from "vitest";
import { niceAxis } from "./axis";

// Each expectation worked by hand: the step is the member of the 1, 2, 5 × 10ⁿ series nearest to
// (hi − lo) ÷ count (d3-array takes 5 once the raw step passes √10 ≈ 3.16 of its decade, 2 past √2,
// 10 past √50), and the domain runs out to the multiples of the step around lo and hi.
describe("niceAxis", () => {
  it("puts an elongation axis in inches on whole inches", () => {
    // 2.31 to 7.9 in, 5 ticks: 5.59 ÷ 5 = 1.12 → step 1; 2 ≤ 2.31, 8 ≥ 7.9.
    expect(niceAxis(2.31, 7.9, 5)).toEqual({ domain: [2, 8], ticks: [2, 3, 4, 5, 6, 7, 8], decimals: 0 });
  });

  it("puts a deviation axis on multiples of 5 % either side of zero", () => {
    // −12.8 to +12.8 %, 6 ticks: 25.6 ÷ 6 = 4.27 → step 5 (4.27 > 3.16); ±15 covers ±12.8.
    expect(niceAxis(-12.8, 12.8, 6)).toEqual({
      domain: [-15, 15],
      ticks: [-15, -10, -5, 0, 5, 10, 15],
      decimals: 0,
    });
  });

  it("puts a force axis in kip on multiples of 5", () => {
    // 131.2 to 146.9 kip, 4 ticks: 15.7 ÷ 4 = 3.9 → step 5; 130 and 150 around the ends.
    expect(niceAxis(131.2, 146.9, 4)).toEqual({ domain: [130, 150], ticks: [130, 135, 140, 145, 150], decimals: 0 });
  });

  it("gives the decimals a fine step needs and no float noise", () => {
    // 0.42 to 0.58 in, 5 ticks: 0.16 ÷ 5 = 0.032 → step 0.05 (0.032 > 0.0316); two decimals.
    const axis = niceAxis(0.42, 0.58, 5);
    expect(axis.domain).toEqual([0.4, 0.6]);
    expect(axis.ticks).toEqual([0.4, 0.45, 0.5, 0.55, 0.6]);
    expect(axis.decimals).toBe(2);
    // 1.2 to 2.9 mm, 5 ticks: 1.7 ÷ 5 = 0.34 → step 0.5 (0.34 > 0.316); one decimal.
    expect(niceAxis(1.2, 2.9, 5)).toEqual({ domain: [1, 3], ticks: [1, 1.5, 2, 2.5, 3], decimals: 1 });
  });

  it("takes the ends in either order and opens an axis around a single value", () => {
    expect(niceAxis(7.9, 2.31, 5).domain).toEqual([2, 8]);
    // 50 alone: opened by a tenth either way, 45 to 55, 5 ticks: 10 ÷ 5 = 2 → step 2; 44 to 56.
    expect(niceAxis(50, 50, 5)).toEqual({ domain: [44, 56], ticks: [44, 46, 48, 50, 52, 54, 56], decimals: 0 });
    expect(niceAxis(0, 0, 2).domain).toEqual([-1, 1]);
  });

  it("refuses an end that is not a number, naming the axis", () => {
    expect(() => niceAxis(Number.NaN, 3)).toThrow(/axis/);
    expect(() => niceAxis(0, Number.POSITIVE_INFINITY)).toThrow(/axis/);
  });
});
