import { describe, expect, it } from "vitest";
import {
  in2ToMm2,
  M2_PER_FT2,
  METRES_PER_FOOT,
  MM_PER_FOOT,
  MM_PER_INCH,
  MPA_PER_KSI,
  MPA_PER_PSI,
  N_PER_KIP,
} from "@/lib/units";
import {
  showPlanArea,
  displayUnit,
  fromDisplayUnit,
  groupedNumber,
  inDisplayUnit,
  showAngle,
  showBandPct,
  showArea,
  showComputedLength,
  showForce,
  showForcePerPressure,
  showLength,
  showLongLength,
  showModulus,
  showPct,
  showNumber,
  showPctPoints,
  showPressure,
  pressureAsTyped,
  typedPressure,
  showShare,
  showSteelStress,
  showStrength,
  showWobble,
} from "./quantities";

const us = { unitSystem: "us", readingResolution: "1/8in" } as const;
const us16 = { unitSystem: "us", readingResolution: "1/16in" } as const;
const si = { unitSystem: "si", readingResolution: "1mm" } as const;

describe("quantities in the project's units", () => {
  it("prints a 0.5 in strand's area as the mill certificate does, never with float noise", () => {
    // ASTM A416 Table 1: 0.500 in strand = 0.153 in² (98.7 mm²).
    expect(showArea(us, 98.709)).toBe("0.153 in²");
    expect(showArea(si, 98.77399600000001)).toBe("98.8 mm²");
    expect(showArea(si, 140)).toBe("140.0 mm²");
  });

  it("prints moduli in ksi on a US project and GPa on an SI project", () => {
    // AASHTO LRFD §5.4.4.2: 28,500 ksi (from memory); 28,500 ksi = 196,500 MPa (DOMAIN.md §2.1, computed).
    expect(showModulus(us, 28_500 * MPA_PER_KSI)).toBe("28,500 ksi");
    expect(showModulus(si, 195_000)).toBe("195.0 GPa");
    expect(showModulus(us, 196_500)).not.toMatch(/MPa|GPa/);
  });

  it("prints concrete strengths in psi or MPa and steel stresses in ksi or MPa", () => {
    expect(showStrength(us, 4000 * MPA_PER_PSI)).toBe("4,000 psi");
    expect(showStrength(si, 30)).toBe("30.0 MPa");
    // ASTM A416 Grade 270: fpu = 270 ksi = 1860 MPa (nominal SI grade).
    expect(showSteelStress(us, 270 * MPA_PER_KSI)).toBe("270.0 ksi");
    expect(showSteelStress(si, 1860)).toBe("1,860 MPa");
  });

  it("prints readings to the reading division and computed lengths one step finer", () => {
    expect(showLength(us, 8.375 * MM_PER_INCH)).toBe("8 3/8 in");
    expect(showLength(us16, 8.4375 * MM_PER_INCH)).toBe("8 7/16 in");
    expect(showLength(si, 212.4)).toBe("212 mm");
    expect(showComputedLength(us, 2.754 * MM_PER_INCH)).toBe("2.75 in");
    expect(showComputedLength(us, 130 * MM_PER_INCH)).toBe("10.83 ft");
    expect(showComputedLength(si, 70.04)).toBe("70.0 mm");
    expect(showLongLength(us, 90 * MM_PER_FOOT)).toBe("90.0 ft");
    expect(showLongLength(si, 27_432)).toBe("27.43 m");
  });

  it("prints forces and gauge pressures in the project's units", () => {
    // ACI 318-19 Table 20.3.2.5.1 (from memory): 0.80·fpu·A = 0.80 × 270 ksi × 0.153 in² = 33.05 kip.
    expect(showForce(us, 33.048 * N_PER_KIP)).toBe("33.05 kip");
    expect(showForce(si, 147_000)).toBe("147.0 kN");
    expect(showPressure(us, 4227 * MPA_PER_PSI)).toBe("4227 psi");
    expect(showPressure(si, 29.14)).toBe("29.14 MPa");
    expect(showPressure(us, 29.14)).not.toContain("MPa");
  });

  it("shows a gauge pressure as typed, with the project's reading beside it only when they differ", () => {
    // The unit is added to a bare number only; a typed unit stays as typed.
    expect(typedPressure({ pressure: "4227", unit: "psi" })).toBe("4227 psi");
    expect(typedPressure({ pressure: "29.14 MPa", unit: "psi" })).toBe("29.14 MPa");
    // The same reading in the project's units (thousands separators aside): nothing beside it.
    expect(pressureAsTyped(us, { pressure: "4,227", unit: "psi" }, 4227 * MPA_PER_PSI)).toBe("4,227 psi");
    // A bare MPa on a psi job: the psi reading beside it.
    expect(pressureAsTyped(us, { pressure: "29.14", unit: "MPa" }, 29.14)).toBe(
      `29.14 MPa (${showPressure(us, 29.14)})`,
    );
    // Not read by the server yet: only what was typed.
    expect(pressureAsTyped(si, { pressure: "29.14", unit: "MPa" }, null)).toBe("29.14 MPa");
  });

  it("prints the wobble coefficient per foot or per metre", () => {
    // K per ft × 3.2808 = K per m (DOMAIN.md §1.2).
    expect(showWobble(us, 0.001 / METRES_PER_FOOT)).toBe("0.0010 per ft");
    expect(showWobble(si, 0.0033)).toBe("0.0033 per m");
  });

  it("prints percentages with their sign and no minus zero", () => {
    // eng-tips 151385 via DOMAIN.md C12: 3.0 in against 2.75 in is +9.09 %.
    expect(showPct(((3 - 2.75) / 2.75) * 100)).toBe("+9.1 %");
    expect(showPct(-12)).toBe("−12.0 %");
    expect(showPct(-0.01)).toBe("0.0 %");
    expect(groupedNumber(-0.0001, 2)).toBe("0.00");
  });

  it("refuses a value that is not finite, naming what it is", () => {
    expect(() => showArea(us, Number.NaN)).toThrow(/area/);
    expect(() => showModulus(si, Number.POSITIVE_INFINITY)).toThrow(/modulus/);
  });

  it("gives a chart the project's unit and the value in it", () => {
    // NIST SP 811 Appendix B.8: 1 in = 2.54 cm exactly, so 63.5 mm = 2.5 in.
    expect(displayUnit(us, "length")).toBe("in");
    expect(inDisplayUnit(us, "length", 63.5)).toBeCloseTo(2.5, 12);
    expect(fromDisplayUnit(us, "length", 2.5)).toBeCloseTo(63.5, 12);
    expect(displayUnit(si, "length")).toBe("mm");
    expect(inDisplayUnit(si, "length", 63.5)).toBe(63.5);
    // NIST SP 811 Appendix B.8: 1 kip = 4.448222 kN, so 30 kip = 133.4467 kN.
    expect(displayUnit(us, "force")).toBe("kip");
    expect(inDisplayUnit(us, "force", 133_446.7)).toBeCloseTo(30, 4);
    expect(displayUnit(si, "force")).toBe("kN");
    expect(inDisplayUnit(si, "force", 133_446.7)).toBeCloseTo(133.4467, 10);
    expect(fromDisplayUnit(si, "force", 150)).toBe(150_000);
    // NIST SP 811 Appendix B.8: 1 psi = 6.894757 kPa, so 4,000 psi = 27.579 MPa.
    expect(displayUnit(us, "pressure")).toBe("psi");
    expect(inDisplayUnit(us, "pressure", 27.579)).toBeCloseTo(4000, 1);
    expect(fromDisplayUnit(us, "pressure", 4000)).toBeCloseTo(27.579, 3);
    expect(() => inDisplayUnit(us, "force", Number.NaN)).toThrow(/force/);
  });

  it("prints a calibration line's slope in force per unit of gauge pressure", () => {
    // Force = pressure × ram area: 1 psi on 15.5 in² is 15.5 lbf = 0.0155 kip; 1 MPa on 10,000 mm² is 10 kN.
    expect(showForcePerPressure(us, in2ToMm2(15.5))).toBe("0.01550 kip/psi");
    expect(showForcePerPressure(si, 10_000)).toBe("10.0000 kN/MPa");
    expect(() => showForcePerPressure(si, Number.NaN)).toThrow(/slope/);
  });

  it("prints the wobble coefficient to more decimals on a calculation sheet", () => {
    // 0.0002 per ft ÷ 0.3048 = 0.00065617 per m (1 ft = 0.3048 m exactly, NIST SP 811 B.8).
    expect(showWobble(si, 0.0002 / METRES_PER_FOOT, 5)).toBe("0.00066 per m");
    expect(showWobble(us, 0.0002 / METRES_PER_FOOT, 5)).toBe("0.00020 per ft");
  });

  it("prints a band as the setting is written and an angle in radians and degrees", () => {
    // ACI 318-11 §18.20.1 (from memory): ±7 %.
    expect(showBandPct(7)).toBe("±7 %");
    expect(showBandPct(7.46)).toBe("±7.5 %");
    // π/4 rad = 45° = 0.785398 rad.
    expect(showAngle(Math.PI / 4)).toBe("0.7854 rad (45.00°)");
    expect(showAngle(0)).toBe("0.0000 rad (0.00°)");
    expect(() => showAngle(Number.NaN)).toThrow(/angle/);
  });

  it("prints fits, shares and differences of percentages", () => {
    expect(showNumber(0.99871, 4)).toBe("0.9987");
    expect(showNumber(1.0415, 3)).toBe("1.042");
    expect(showPctPoints(2.449)).toBe("2.4 pts");
    expect(showShare(0.346)).toBe("35 %");
    expect(showShare(null)).toBe("—");
    expect(() => showShare(Number.NaN)).toThrow(/share/);
  });
});

describe("showPlanArea", () => {
  // 1 ft² = 0.09290304 m² exactly (NIST SP 811, App. B.8: 0.3048² m²).
  it("gives a pour's plan area to the whole unit, grouped", () => {
    expect(showPlanArea({ unitSystem: "si" }, 1480)).toBe("1,480 m²");
    expect(showPlanArea({ unitSystem: "us" }, 1480)).toBe("15,931 ft²"); // 1480 m² ÷ 0.0929… = 15,930.6 ft²
    expect(showPlanArea({ unitSystem: "us" }, M2_PER_FT2 * 1000)).toBe("1,000 ft²");
    expect(() => showPlanArea({ unitSystem: "si" }, Number.NaN)).toThrow();
  });
});
