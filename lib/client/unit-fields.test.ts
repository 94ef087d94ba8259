import { describe, expect, it } from "vitest";
import { PER, shown } from "./unit-fields";

describe("PER and shown(): a form box's unit to the stored SI value and back", () => {
  it("writes a strand's area in in² and reads it back in mm²", () => {
    // ASTM A416 Table 1: 0.5 in strand, 0.153 in²; NIST SP 811 B.8: 1 in² = 6.4516 cm², so 98.70948 mm².
    expect(0.153 * PER.in2).toBeCloseTo(98.70948, 8);
    expect(shown(98.70948, PER.in2, 5)).toBe("0.153");
    expect(shown(98.70948, PER.mm2, 2)).toBe("98.71");
  });

  it("writes a modulus in ksi and a breaking load in kip", () => {
    // NIST SP 811 B.8: 1 ksi = 6.894757 MPa, so 28,500 ksi = 196,500.6 MPa.
    expect(shown(196_500.6, PER.ksi, 0)).toBe("28500");
    // NIST SP 811 B.8: 1 kip = 4.448222 kN; ASTM A416 Table 2: 41.3 kip for 0.5 in Grade 270 = 183.7 kN.
    expect(shown(183_711.5, PER.kip, 1)).toBe("41.3");
    expect(shown(183_711.5, PER.kN, 1)).toBe("183.7");
  });

  it("turns a wobble coefficient per foot into per metre and back", () => {
    // 1 ft = 0.3048 m exactly (NIST SP 811 B.8): K = 0.0002 per ft is 0.0002 ÷ 0.3048 = 0.00065617 per m.
    expect(0.0002 * PER.perFt).toBeCloseTo(0.00065617, 8);
    expect(shown(0.00065617, PER.perFt, 6)).toBe("0.0002");
    expect(shown(0.00065617, PER.perM, 6)).toBe("0.000656");
  });

  it("types an angle in degrees and stores it in radians", () => {
    // 180° = π rad, so 45° = π/4 = 0.785398 rad.
    expect(45 * PER.deg).toBeCloseTo(Math.PI / 4, 14);
    expect(shown(Math.PI / 4, PER.deg)).toBe("45");
    expect(shown(0.1, PER.deg, 2)).toBe("5.73");
  });

  it("leaves an empty box empty", () => {
    expect(shown(null, PER.in)).toBe("");
    expect(shown(undefined, PER.ksi)).toBe("");
  });
});
