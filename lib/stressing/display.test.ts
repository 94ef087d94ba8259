import { describe, expect, it } from "vitest";
import { showBandEdge } from "./display";

// A band printed wider than it is contradicts its own verdict ("short of the band 4 1/2 in to
// 5 1/4 in" for a 4 1/2 in reading): edges are rounded inward, never outward.
const us = { unitSystem: "us" as const, readingResolution: "1/8in" as const };
const si = { unitSystem: "si" as const, readingResolution: "1mm" as const };

describe("showBandEdge", () => {
  it.each([
    // [mm, edge, shown]
    [4.4963 * 25.4, "lower", "4.50 in"], // rounded up, inside the band
    [5.2537 * 25.4, "upper", "5.25 in"], // rounded down, inside the band
    [4.5 * 25.4, "lower", "4.50 in"], // exactly on a step stays there despite conversion noise
    [5.25 * 25.4, "upper", "5.25 in"],
    [112.04, "lower", "112.1 mm"],
    [131.96, "upper", "131.9 mm"],
  ] as const)("%f mm as the %s edge is %s", (mm, edge, shown) => {
    expect(showBandEdge(shown.endsWith("mm") ? si : us, mm, edge)).toBe(shown);
  });
});
