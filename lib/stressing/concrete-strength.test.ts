import { describe, expect, it } from "vitest";
import { concreteGateMet, confirmedStrength } from "./concrete-strength";

describe("confirmedStrength (the project's rule in concrete-strength.ts)", () => {
  it("is unconfirmed without results", () => {
    expect(confirmedStrength([])).toMatchObject({ strengthMPa: null, specimens: 0 });
  });

  it("averages the specimens at the latest age, weighted by each set's count", () => {
    // Hand check: (3 × 24 + 2 × 27) / 5 = (72 + 54) / 5 = 25.2 MPa; the 3-day set is superseded.
    const r = confirmedStrength([
      { strengthMPa: 18, ageDays: 3, specimenCount: 2 },
      { strengthMPa: 24, ageDays: 5, specimenCount: 3 },
      { strengthMPa: 27, ageDays: 5, specimenCount: 2 },
    ]);
    expect(r.strengthMPa).toBeCloseTo(25.2, 10);
    expect(r).toMatchObject({ ageDays: 5, specimens: 5 });
  });

  it("a later weaker break replaces an earlier one (the latest age counts)", () => {
    const r = confirmedStrength([
      { strengthMPa: 26, ageDays: 3, specimenCount: 2 },
      { strengthMPa: 22, ageDays: 4, specimenCount: 2 },
    ]);
    expect(r.strengthMPa).toBe(22);
  });

  it("one specimen alone does not confirm", () => {
    const r = confirmedStrength([{ strengthMPa: 30, ageDays: 7, specimenCount: 1 }]);
    expect(r.strengthMPa).toBeNull();
    expect(r.basis).toContain("at least 2");
  });
});

describe("concreteGateMet", () => {
  it("needs a confirmed strength at or above the required one", () => {
    expect(concreteGateMet(null, 20.7)).toBe(false);
    expect(concreteGateMet(20.6, 20.7)).toBe(false);
    expect(concreteGateMet(20.7, 20.7)).toBe(true);
    expect(concreteGateMet(null, null)).toBe(true);
  });
});
