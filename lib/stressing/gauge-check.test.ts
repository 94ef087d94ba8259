import { describe, expect, it } from "vitest";
import { deviationSamples, gaugeCheckFigures, gaugeChecks, type JudgedTendon } from "./gauge-check";

const A = { id: "set-a", name: "Set A" };
const B = { id: "set-b", name: "Set B" };
const done = (deviationPct: number, ...sets: { id: string; name: string }[]): JudgedTendon => ({
  verdict: Math.abs(deviationPct) > 7 ? (deviationPct > 0 ? "long" : "short") : "in band",
  provisional: false,
  deviationPct,
  sets,
});

// Worked by hand (Welch's two-sample statistic, any statistics text):
// Set A: 0, +1, −1, +0.5, −0.5 → mean 0, squares 2.5, sample variance 2.5/4 = 0.625.
// Set B: 4, 5, 3, 4.5, 3.5 → mean 4, the same spread, variance 0.625.
// t = (4 − 0) / √(0.625/5 + 0.625/5) = 4 / 0.5 = 8.0. Set B's own mean stands 4 / √(0.625/5)
// = 11.3 standard errors clear of zero, Set A's does not, so Set B is the one marked.
const setA = [0, 1, -1, 0.5, -0.5].map((d) => done(d, A, A));
const setB = [4, 5, 3, 4.5, 3.5].map((d) => done(d, B, B));

describe("the gauge check during the shift", () => {
  it("names the set whose tendons come out long, with its figures", () => {
    const checks = gaugeChecks([...setA, ...setB]);
    expect(checks.map((c) => c.setName)).toEqual(["Set B"]);
    const b = checks[0]!;
    expect(b.meanPct).toBeCloseTo(4, 12);
    expect(b.n).toBe(5);
    expect(b.t).toBeCloseTo(8, 12);
    expect(gaugeCheckFigures(b)).toBe(
      "Set B: mean deviation +4.0 % over 5 tendons, against 0.0 % over 5 tendons of the other sets (4.0 points long, t = 8.0)",
    );
  });

  it("says short when the set reads short", () => {
    const short = [-4, -5, -3, -4.5, -3.5].map((d) => done(d, B));
    const [b] = gaugeChecks([...setA, ...short]);
    expect(gaugeCheckFigures(b!)).toContain("4.0 points short");
  });

  it("says nothing until the set has the insight's minimum of tendons", () => {
    expect(gaugeChecks([...setA, ...setB.slice(0, 4)])).toEqual([]);
  });

  it("leaves out provisional and incomplete evaluations, and counts a tendon stressed by two sets apart", () => {
    const tendons: JudgedTendon[] = [
      ...setA,
      ...setB.slice(0, 4),
      { ...done(4.2, B), provisional: true },
      { verdict: "incomplete", provisional: false, deviationPct: null, sets: [B] },
      done(4.2, A, B),
    ];
    const { samples, mixed } = deviationSamples(tendons);
    expect(samples.filter((s) => s.setId === "set-b")).toHaveLength(4);
    expect(mixed).toBe(1);
    expect(gaugeChecks(tendons)).toEqual([]);
  });

  it("does not mark a set whose difference is inside the scatter", () => {
    const wide = [8, -6, 7, -5, 6].map((d) => done(d, B));
    expect(gaugeChecks([...setA, ...wide])).toEqual([]);
  });
});
