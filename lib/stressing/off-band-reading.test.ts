import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { BASIS_WORDS } from "@/lib/stressing/judge";
import { tendonCase, judgeOnBothPaths } from "@/tests/support/reading-paths";

// Property, the other half of perfect-reading.test.ts: a reading generated from the prediction
// itself and then moved off by more than the band, long or short, is judged out of band and flagged
// out_of_band, on every reading method (marks net of anchor set, ram travel gross plus grip, with
// an initial pressure, gauge steps, several strokes with draw-in), every stressing order (one end,
// two ends one after the other, two ends at once) and either form default basis, on the tablet's
// path and on the server's path alike, with the same verdict and deviation to the digit and the
// basis written on the verdict. The tendon is pulled to the specified force and stretches (1 + d)
// times the prediction, |d| more than the band: on ram travel the deviation is d itself; on marks
// the anchor set is the same either way, so the deviation is d·gross/(gross − set), larger still.

describe("a reading off by more than the band is out of band and flagged on every basis, method and order", () => {
  it("on the tablet and on the server, to the digit", () => {
    fc.assert(
      fc.property(
        tendonCase,
        // ±7 % is the usual building band (ACI 318-11 §18.20.1, from memory), ±5 % common on bridges.
        fc.constantFrom(5, 7, 10),
        fc.constantFrom(1, -1),
        // How far past the band edge, as a fraction of the prediction.
        fc.double({ min: 0.002, max: 0.2, noNaN: true }),
        fc.constantFrom("gross" as const, "net" as const),
        (tc, bandPct, sign, past, comparisonBasis) => {
          const { ends, planA, planB } = tc;
          const d = sign * (bandPct / 100 + past);
          const { tablet, server } = judgeOnBothPaths({
            ...tc,
            kOf: () => 1,
            stretch: 1 + d,
            project: { tolerancePct: bandPct, comparisonBasis },
          });
          const expected = d > 0 ? "long" : "short";
          // The tablet: every end is in, the verdict is final and out of band, and it is flagged.
          expect(tablet.provisional).toBe(false);
          expect(tablet.verdict).toBe(expected);
          expect(Math.sign(tablet.deviationPct!)).toBe(sign);
          expect(Math.abs(tablet.deviationPct!)).toBeGreaterThan(bandPct);
          expect(tablet.flagKinds).toContain("out_of_band");
          // The basis each record was read on is written on the verdict.
          const methods = (ends === "A" ? [planA] : [planA, planB]).map((p) =>
            p.method === "marks" ? "net" : "gross",
          );
          if (new Set(methods).size === 1) expect(tablet.basisLabel).toBe(BASIS_WORDS[methods[0]!]);
          else expect(tablet.basisLabel).toBe(`end A ${BASIS_WORDS[methods[0]!]}; end B ${BASIS_WORDS[methods[1]!]}`);

          // The server: the same verdict and deviation to the digit, the same flag, the same basis.
          expect(server.outcome.verdict).toBe(expected);
          expect(server.outcome.deviationPct).toBe(tablet.deviationPct);
          expect(server.outcome.flagKinds).toContain("out_of_band");
          const result = JSON.parse(String(server.evaluation.result)) as { basis: string };
          expect(result.basis).toBe(tablet.basisLabel);
        },
      ),
      { numRuns: 200 },
    );
  }, 120_000);
});
