import { describe, expect, it } from "vitest";
import { storedGaugeOffTarget, storedGaugeSteps } from "./stored-entered";

// What a stored record's `entered` holds is read back on the tablet's tendon list, the server's
// evaluation and the office pages; anything that does not match reads as absent, never as a value.
describe("reading back what a stored record's entered carries", () => {
  const entered = {
    units: { length: "in", pressure: "psi" },
    finalPressure: "4200",
    gaugeSteps: [
      { pressure: "1000", reading: "1", pressureMPa: 7, readingMm: 24.6 },
      { pressure: "4200", reading: "4 1/2", pressureMPa: 29, readingMm: 110.2 },
    ],
    gaugeOffTarget: { pct: -8, reason: "pump lost pressure, held at the mark" },
  };

  it("gives the gauge steps in SI and the off-target confirmation", () => {
    expect(storedGaugeSteps(entered)).toEqual([
      { pressureMPa: 7, readingMm: 24.6 },
      { pressureMPa: 29, readingMm: 110.2 },
    ]);
    expect(storedGaugeOffTarget(entered)).toEqual({ pct: -8, reason: "pump lost pressure, held at the mark" });
  });

  it("gives null for a record without them, with none, or with what the schema refuses", () => {
    expect(storedGaugeSteps({ finalPressure: "4200" })).toBeNull();
    expect(storedGaugeSteps({ gaugeSteps: [] })).toBeNull();
    expect(storedGaugeSteps({ gaugeSteps: [{ pressureMPa: "7", readingMm: 24.6 }] })).toBeNull();
    expect(storedGaugeSteps(null)).toBeNull();
    expect(storedGaugeOffTarget({ finalPressure: "4200" })).toBeNull();
    expect(storedGaugeOffTarget({ gaugeOffTarget: { pct: -8, reason: "ok\u0000" } })).toBeNull();
    expect(storedGaugeOffTarget({ gaugeOffTarget: { pct: 1200, reason: "pump lost pressure" } })).toBeNull();
    expect(storedGaugeOffTarget({ gaugeOffTarget: { pct: -8, reason: "pump", extra: 1 } })).toBeNull();
  });
});
