import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { PJ as PJ_DEFAULT, tendonCase, judgeOnBothPaths, strand } from "@/tests/support/reading-paths";

// Property: a reading generated from the prediction itself (the engine's elongation at the
// specified force, turned into what the crew would read by each method) is in band, with no
// deviation, on every basis, reading method and stressing order, on the tablet's path and on the
// server's path, and the two paths give the same numbers to the digit. The force it implies is the
// gauge force. And at any gauge force a reading generated from the prediction at that force
// (elongation proportional to force, P·L/(A·E) with friction losses proportional to P; the seating
// a fixed draw-in) implies that force: elongation and gauge agree, on both paths, and no
// force_disagreement is raised. The specified force is the project's 0.80·fpu·A or, when the
// tendon's schedule row gives one, that force (0.60 to 0.80·fpu·A): both paths read it alike.

describe("a perfect reading is in band on every basis, method and order", () => {
  // Gauge steps at 20/40/60/80/100 % on marks (net) and on ram travel (gross) are among the plans.
  it("on the tablet and on the server, to the digit", () => {
    fc.assert(
      fc.property(
        tendonCase,
        fc.constantFrom(1, 1, 0.9, 0.95, 0.97, 1.02, 1.05),
        fc.double({ min: 0.9, max: 1.05, noNaN: true }),
        fc.option(fc.double({ min: 0.6, max: 0.8, noNaN: true }), { nil: null }),
        (tc, kA, kB, scheduleShare) => {
          // The schedule's force when the row gives one, else the project's 0.80·fpu·A.
          const PJ = scheduleShare === null ? PJ_DEFAULT : scheduleShare * strand.minBreakingStrengthN;
          // The gauge force of each end, a share k of the specified force; with kA = 1 both ends are
          // pulled to the specified force and the reading is also the prediction itself (in band, 0 %).
          const kOf = (end: "A" | "B") => (end === "A" ? kA : kA === 1 ? 1 : kB);
          const { tablet, server } = judgeOnBothPaths({
            ...tc,
            kOf,
            scheduleForceN: scheduleShare === null ? null : PJ,
          });
          // The force the elongation implies is the gauge force, on every basis and method.
          for (const f of tablet.forces!) {
            expect(f.gaugeForceN).toBeCloseTo(kOf(f.end) * PJ, 6);
            expect(Math.abs(f.impliedForceN! - f.gaugeForceN!)).toBeLessThan(1e-6 * PJ);
            expect(Math.abs(f.differencePct!)).toBeLessThan(1e-6);
          }
          expect(tablet.flagKinds).not.toContain("force_disagreement");
          expect(tablet.specifiedForceN).toBe(PJ);
          expect(tablet.specifiedForceFrom).toBe(scheduleShare === null ? "0.80·fpu·A" : "from the schedule");
          if (kA === 1) {
            expect(tablet.verdict).toBe("in band");
            expect(Math.abs(tablet.deviationPct!)).toBeLessThan(1e-9);
          }

          expect(server.outcome.verdict).toBe(tablet.verdict);
          expect(server.outcome.deviationPct).toBe(tablet.deviationPct);
          expect(server.outcome.flagKinds).not.toContain("force_disagreement");
          const stored = JSON.parse(String(server.evaluation.inputs)) as {
            jackingForceN: number;
            jackingForceSource: string;
            readings: { end: "A" | "B"; impliedForceN: number; gaugeForceN: number; forceDifferencePct: number }[];
          };
          expect(stored.jackingForceN).toBe(tablet.specifiedForceN);
          expect(stored.jackingForceSource).toBe(scheduleShare === null ? "project" : "schedule");
          expect(stored.readings.map((r) => [r.end, r.impliedForceN, r.forceDifferencePct])).toEqual(
            tablet.forces!.map((f) => [f.end, f.impliedForceN, f.differencePct]),
          );
          if (kA === 1) expect(server.outcome.flagKinds).not.toContain("out_of_band");
        },
      ),
      { numRuns: 150 },
    );
  }, 120_000);
});
