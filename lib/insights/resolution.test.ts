import { describe, expect, it } from "vitest";
import { MM_PER_INCH } from "@/lib/units";
import { resolutionShare, type ResolutionItem } from "./resolution";

// Constructed tendons read to 1/8 in (3.175 mm) on a ±7 % band. A 60 ft monostrand tendon
// predicts about 125 mm; a 120 ft one about 250 mm (rounded figures for constructed data).
const EIGHTH = MM_PER_INCH / 8;
const item = (tag: string, predictedMm: number, measuredMm: number, endsRead = 1): ResolutionItem => ({
  tag,
  predictedMm,
  measuredMm,
  tolerancePct: 7,
  divisionMm: EIGHTH,
  endsRead,
});

describe("share of verdicts the reading division could change", () => {
  it("counts a reading within half a division of a band edge, and calls the narrow bands short", () => {
    // 125 mm predicted: band ±8.75 mm (under 4 divisions, 12.7 mm: short), edge at 133.75 mm.
    // 250 mm predicted: band ±17.5 mm (over 4 divisions: not short), edge at 267.5 mm.
    const result = resolutionShare([
      item("S-1", 125, 133), // 133 ± 1.59 straddles 133.75: could change
      item("S-2", 125, 125), // in the middle of the band
      item("S-3", 125, 116.5), // 116.5 ± 1.59 straddles the lower edge 116.25
      item("L-1", 250, 266.8), // straddles 267.5
      item("L-2", 250, 240),
      item("L-3", 250, 290), // well outside
    ]);
    expect(result.all).toEqual({ n: 6, couldChange: 3, share: 0.5 });
    expect(result.short).toEqual({ n: 3, couldChange: 2, share: 2 / 3 });
    expect(result.tendons.map((t) => [t.tag, t.short])).toEqual([
      ["S-1", true],
      ["S-3", true],
      ["L-1", false],
    ]);
  });

  it("gives two ends read twice the uncertainty of one", () => {
    // 130.5 mm against an edge at 133.75: 3.25 mm away. One end (±1.59 mm) cannot reach it,
    // two ends summed (±3.175 mm) cannot either; a reading 2.5 mm away is reached by two ends only.
    expect(resolutionShare([item("T", 125, 130.5, 1)]).all.couldChange).toBe(0);
    expect(resolutionShare([item("T", 125, 131.25, 1)]).all.couldChange).toBe(0);
    expect(resolutionShare([item("T", 125, 131.25, 2)]).all.couldChange).toBe(1);
  });

  it("has no share to give when nothing was evaluated", () => {
    expect(resolutionShare([])).toEqual({
      all: { n: 0, couldChange: 0, share: null },
      short: { n: 0, couldChange: 0, share: null },
      tendons: [],
    });
  });
});
