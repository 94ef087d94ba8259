import { describe, expect, it } from "vitest";
import { MM_PER_INCH } from "@/lib/units";
import { showBandAsRead, showBandEdge, showPredictedAsRead, specifiedForceSourceWords } from "./display";

// A band printed wider than it is contradicts its own verdict ("short of the band 4 1/2 in to
// 5 1/4 in" for a 4 1/2 in reading): edges are rounded inward, never outward.
const us = { unitSystem: "us" as const, readingResolution: "1/8in" as const };
const si = { unitSystem: "si" as const, readingResolution: "1mm" as const };

describe("showBandEdge", () => {
  it.each([
    // [mm, edge, shown]
    [4.4963 * MM_PER_INCH, "lower", "4.50 in"], // rounded up, inside the band
    [5.2537 * MM_PER_INCH, "upper", "5.25 in"], // rounded down, inside the band
    [4.5 * MM_PER_INCH, "lower", "4.50 in"], // exactly on a step stays there despite conversion noise
    [5.25 * MM_PER_INCH, "upper", "5.25 in"],
    [112.04, "lower", "112.1 mm"],
    [131.96, "upper", "131.9 mm"],
  ] as const)("%f mm as the %s edge is %s", (mm, edge, shown) => {
    expect(showBandEdge(shown.endsWith("mm") ? si : us, mm, edge)).toBe(shown);
  });
});

describe("showBandAsRead", () => {
  // Hand-worked: predicted 5.525 in, ±7 % gives 5.13825 in to 5.91175 in; at 1/8 in the first
  // divisions inside are 5 1/4 (5.125 < 5.138) and 5 7/8 (5.875 ≤ 5.912 < 6.0).
  const lowerMm = 5.13825 * MM_PER_INCH;
  const upperMm = 5.91175 * MM_PER_INCH;

  it("shows fractions alone when the elongation judged is a reading on the division", () => {
    expect(showBandAsRead(us, { lowerMm, upperMm, measuredMm: 5.75 * MM_PER_INCH })).toEqual({
      read: "5 1/4 in to 5 7/8 in",
      decimals: null,
    });
  });

  it("adds the decimal band when the judged elongation is off the division", () => {
    // 5.13 in reads 5 1/8 on the tape but is corrected, not read: the decimals decide.
    expect(showBandAsRead(us, { lowerMm, upperMm, measuredMm: 5.13 * MM_PER_INCH })).toEqual({
      read: "5 1/4 in to 5 7/8 in",
      decimals: "5.14 in to 5.91 in",
    });
  });

  it("reads to 1/16 in where the project does", () => {
    const fine = { unitSystem: "us" as const, readingResolution: "1/16in" as const };
    expect(showBandAsRead(fine, { lowerMm, upperMm, measuredMm: 5.75 * MM_PER_INCH }).read).toBe(
      "5 3/16 in to 5 7/8 in",
    );
  });

  it("keeps the millimetre band as it was on an SI project", () => {
    expect(showBandAsRead(si, { lowerMm: 112.04, upperMm: 131.96, measuredMm: 120 })).toEqual({
      read: "112.1 mm to 131.9 mm",
      decimals: null,
    });
  });
});

describe("showPredictedAsRead", () => {
  it("rounds a prediction to the nearest division on an inch project", () => {
    expect(showPredictedAsRead(us, 5.525 * MM_PER_INCH)).toBe("5 1/2 in"); // 5.525 is 44.2 eighths → 44
    expect(showPredictedAsRead(si, 140.34)).toBe("140.3 mm");
  });
});

describe("specifiedForceSourceWords", () => {
  it("names the schedule, else the project's factor of fpu·A (0.80 on evaluations that stored none)", () => {
    expect(specifiedForceSourceWords("schedule", null)).toBe("from the schedule");
    expect(specifiedForceSourceWords("project", 0.75)).toBe("0.75·fpu·A");
    expect(specifiedForceSourceWords(null, null)).toBe("0.80·fpu·A");
  });
});
