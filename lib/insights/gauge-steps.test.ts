import { describe, expect, it } from "vitest";
import { apparentModuli } from "./gauge-steps";

// A tendon that behaves exactly as P·L/(A·E): 30 000 mm of one 0.5 in strand (98.7 mm², ASTM
// A416 nominal area) with E = 196 500 MPa gives a stiffness A·E/L = 646.5 N/mm. The calibration
// line (5 000 N per MPa, −1 000 N) and the steps are constructed to lie on it exactly.
const calibration = { slope: 5000, intercept: -1000 };
const stiffness = (98.7 * 196_500) / 30_000;
const step = (pressureMPa: number) => ({ pressureMPa, readingMm: 12 + (5000 * pressureMPa - 1000) / stiffness });

describe("apparent modulus from gauge steps", () => {
  it("recovers the modulus the steps were built with, beside the mill value", () => {
    const [fit] = apparentModuli([
      {
        tag: "U1",
        end: "A",
        steps: [step(8), step(16), step(24), step(30)],
        calibration,
        lengthMm: 30_000,
        strandAreaMm2: 98.7,
        strandCount: 1,
        millModulusMPa: 197_000,
      },
    ]);
    expect(fit && "apparentModulusMPa" in fit).toBe(true);
    if (!fit || !("apparentModulusMPa" in fit)) return;
    expect(fit.apparentModulusMPa).toBeCloseTo(196_500, 6);
    expect(fit.modulusRatio).toBeCloseTo(196_500 / 197_000, 9);
    expect(fit.r2).toBeCloseTo(1, 12);
    expect(fit.steps).toBe(4);
  });

  it("skips single readings and explains steps it cannot fit", () => {
    const result = apparentModuli([
      {
        tag: "U2",
        end: "A",
        steps: [step(30)],
        calibration,
        lengthMm: 30_000,
        strandAreaMm2: 98.7,
        strandCount: 1,
        millModulusMPa: null,
      },
      {
        tag: "U3",
        end: "B",
        steps: [step(8), step(16)],
        calibration: null,
        lengthMm: 30_000,
        strandAreaMm2: 98.7,
        strandCount: 1,
        millModulusMPa: null,
      },
      {
        tag: "U4",
        end: "A",
        steps: [
          { pressureMPa: 8, readingMm: 40 },
          { pressureMPa: 16, readingMm: 40 },
        ],
        calibration,
        lengthMm: 30_000,
        strandAreaMm2: 98.7,
        strandCount: 1,
        millModulusMPa: null,
      },
    ]);
    expect(result.map((r) => r.tag)).toEqual(["U3", "U4"]);
    expect(result[0]).toMatchObject({ problem: expect.stringMatching(/No calibration/) });
    expect(result[1]).toMatchObject({ problem: expect.stringMatching(/did not change/) });
  });
});
