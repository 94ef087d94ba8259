import fc from "fast-check";
import { unit } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  barToMPa,
  degToRad,
  ft2ToM2,
  ftToMm,
  in2ToMm2,
  inToMm,
  kipToN,
  ksiToMPa,
  lbfToN,
  m2ToFt2,
  mmToIn,
  mpaToPsi,
  parseForce,
  parseLength,
  parsePressure,
  psiToMPa,
  radToDeg,
  wobblePerFtToPerM,
  wobblePerMToPerFt,
} from "../../lib/units/index";

// Conversions against the units of mathjs (a general-purpose library). Where mathjs rounds a
// definition the tolerance says so: it takes 1 kip = 4448.2216 N (8 digits) and derives psi as
// 6894.75729276459 Pa, while the defined values are 4448.2216152605 N and 6894.757293168… Pa.

const relative = (a: number, b: number): number => Math.abs(a / b - 1);

describe("conversion factors against mathjs", () => {
  it.each([
    ["inch → mm", inToMm(1), unit(1, "inch").toNumber("mm"), 1e-15],
    ["ft → mm", ftToMm(1), unit(1, "ft").toNumber("mm"), 1e-15],
    ["in² → mm²", in2ToMm2(1), unit(1, "inch^2").toNumber("mm^2"), 1e-15],
    ["ft² → m²", ft2ToM2(1), unit(1, "ft^2").toNumber("m^2"), 1e-15],
    ["m² → ft²", m2ToFt2(1), unit(1, "m^2").toNumber("ft^2"), 1e-15],
    ["lbf → N", lbfToN(1), unit(1, "lbf").toNumber("N"), 1e-15],
    ["kip → N (mathjs rounds kip)", kipToN(1), unit(1, "kip").toNumber("N"), 1e-8],
    ["psi → MPa (mathjs rounds psi)", psiToMPa(1), unit(1, "psi").toNumber("MPa"), 1e-10],
    ["ksi → MPa (mathjs rounds kip)", ksiToMPa(1), unit(1, "kip/inch^2").toNumber("MPa"), 1e-8],
    ["bar → MPa", barToMPa(1), unit(1, "bar").toNumber("MPa"), 1e-15],
    ["wobble per ft → per m", wobblePerFtToPerM(1), unit(1, "ft^-1").toNumber("m^-1"), 1e-15],
    ["degree → radian", degToRad(1), unit(1, "deg").toNumber("rad"), 1e-15],
  ])("%s", (_, ours, theirs, tolerance) => {
    expect(relative(ours, theirs)).toBeLessThanOrEqual(tolerance);
  });
});

describe("parsed readings against mathjs", () => {
  it("reads crew notations to the same millimetres as mathjs", () => {
    const us = { field: "reading", system: "US" as const };
    expect(relative(parseLength("8 3/8", us), unit(8.375, "inch").toNumber("mm"))).toBeLessThan(1e-15);
    expect(relative(parseLength('8-3/8"', us), unit(8.375, "inch").toNumber("mm"))).toBeLessThan(1e-15);
    expect(relative(parseLength("2 ft", us), unit(2, "ft").toNumber("mm"))).toBeLessThan(1e-15);
    expect(relative(parsePressure("4227 psi", us), unit(4227, "psi").toNumber("MPa"))).toBeLessThan(1e-10);
    expect(relative(parsePressure("291 bar", us), unit(291, "bar").toNumber("MPa"))).toBeLessThan(1e-15);
    expect(relative(parseForce("41300 lbf", us), unit(41_300, "lbf").toNumber("N"))).toBeLessThan(1e-15);
    expect(relative(parseForce("33.05 kip", us), unit(33.05, "kip").toNumber("N"))).toBeLessThan(1e-8);
  });

  it("round-trips every conversion", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e7, noNaN: true }), (x) => {
        expect(relative(mmToIn(inToMm(x)), x)).toBeLessThan(1e-15);
        expect(relative(mpaToPsi(psiToMPa(x)), x)).toBeLessThan(1e-15);
        expect(relative(wobblePerMToPerFt(wobblePerFtToPerM(x)), x)).toBeLessThan(1e-15);
        expect(relative(radToDeg(degToRad(x)), x)).toBeLessThan(1e-15);
      }),
    );
  });
});
