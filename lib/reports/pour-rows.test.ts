import { describe, expect, it } from "vitest";
import { MM_PER_INCH } from "@/lib/units";
import { gaugeStepsText, offTargetText } from "./pour-rows";

// Display only: the values shown are the stored ones, in the project's units.
const us = { unitSystem: "us", readingResolution: "1/8in" } as Parameters<typeof gaugeStepsText>[0];

describe("the pour report's gauge steps and off-target words", () => {
  it("lists each step as typed with the project's units, then the line's r² and what it adds", () => {
    const text = gaugeStepsText(us, {
      gaugeSteps: [
        { pressure: "800", reading: "1", pressureMPa: 5.5, readingMm: MM_PER_INCH },
        { pressure: "1600", reading: "2 1/4", pressureMPa: 11, readingMm: 57.15 },
      ],
      stepFit: { r2: 0.99987, belowReferenceMm: MM_PER_INCH },
    });
    expect(text).toMatch(
      /^gauge steps 800 psi: 1 in, 1600 psi: 2 1\/4 in; least-squares line r² 0\.9999, adds 1\.00 in below/,
    );
  });

  it("says when no line was judged", () => {
    expect(
      gaugeStepsText(us, {
        gaugeSteps: [{ pressure: "800", reading: "1", pressureMPa: 5.5, readingMm: MM_PER_INCH }],
        stepFit: null,
      }),
    ).toMatch(/; no line judged$/);
  });

  it("quotes the crew's confirmation of a gauge off its target, and nothing without one", () => {
    expect(offTargetText({ gaugeOffTarget: { pct: 9.46, reason: "needle sticks" } })).toBe(
      "final +9.5 % off target, confirmed by the crew: needle sticks",
    );
    expect(offTargetText({ gaugeOffTarget: null })).toBe("");
  });
});
