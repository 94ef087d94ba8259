import { describe, expect, it } from "vitest";
import { expectInputError } from "../../tests/reference/support";
import type { InputError } from "./errors";
import { parseForce, parseLength, parsePressure } from "./parse";

// Expected values follow from the exact definitions 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N,
// 1 psi = 6894.757293168 Pa, 1 bar = 0.1 MPa; the typed numbers are arbitrary test inputs.

describe("parseLength", () => {
  const us = { field: "readingA", system: "US" as const };
  const si = { field: "readingA", system: "SI" as const };

  it.each([
    ["8 3/8", 8.375],
    ["8-3/8", 8.375],
    ['8-3/8"', 8.375],
    ["8 - 3/8 in", 8.375],
    ["8.375", 8.375],
    ["8.375 in", 8.375],
    ["8.375in", 8.375],
    ["8.375 inches", 8.375],
    ["3/4", 0.75],
    ["  2 7/8  ", 2.875],
    ["8⅜", 8.375],
    ["8⅜″", 8.375],
    [".5", 0.5],
    ["12.", 12],
    ["0", 0],
  ])("reads %j as %d inches on a US project", (typed, inches) => {
    expect(parseLength(typed, us)).toBeCloseTo(inches * 25.4, 12);
  });

  it.each([
    ["212 mm", 212],
    ["212", 212],
    ["212mm", 212],
    ["21.2 cm", 212],
    ["0.212 m", 212],
  ])("reads %j as %d mm on an SI project", (typed, mm) => {
    expect(parseLength(typed, si)).toBeCloseTo(mm, 12);
  });

  // Site notation, worked by hand from 1 in = 25.4 mm and 1 ft = 12 in exactly (NIST SP 811,
  // Appendix B): 5 ft 6 1/2 in = 66.5 in = 1689.1 mm; 6 1/2 in = 165.1 mm; 5 ft 6 in = 1676.4 mm.
  it.each([
    [`5'-6 1/2"`, 1689.1],
    [`5' 6 1/2"`, 1689.1],
    [`5'-6-1/2"`, 1689.1],
    [`5′-6½″`, 1689.1],
    [`5 ft 6 1/2 in`, 1689.1],
    [`5'6"`, 1676.4],
    [`5 ft 6`, 1676.4],
    [`5'-0"`, 1524],
    [`0'-3/8"`, 9.525],
    [`12'`, 3657.6],
    [`6 1/2"`, 165.1],
    [`6-1/2`, 165.1],
    [`6.5 in`, 165.1],
    [`165 mm`, 165],
  ])("reads the site notation %j as %d mm on a US project", (typed, mm) => {
    expect(parseLength(typed, us)).toBeCloseTo(mm, 9);
  });

  it("reads feet and inches on an SI project too, since the marks say which is which", () => {
    expect(parseLength(`5'-6 1/2"`, si)).toBeCloseTo(1689.1, 9);
  });

  it("refuses feet followed by something that is not inches below 12, naming the field", () => {
    expectInputError(() => parseLength(`5'-12"`, us), "readingA", "bad-fraction");
    expectInputError(() => parseLength(`5'-6 mm`, us), "readingA", "unknown-unit");
    expectInputError(() => parseLength(`5'-abc`, us), "readingA", "not-a-number");
    expectInputError(() => parseLength(`5'-6" 3`, us), "readingA", "not-a-number");
    expectInputError(() => parseLength(`-5'-6"`, us), "readingA", "negative");
    expect(parseLength(`-5'-6"`, { ...us, allowNegative: true })).toBeCloseTo(-1676.4, 9);
  });

  it("honours an explicit unit over the project's default", () => {
    expect(parseLength("212 mm", us)).toBe(212);
    expect(parseLength("8 3/8 in", si)).toBeCloseTo(8.375 * 25.4, 12);
    expect(parseLength("2 ft", si)).toBeCloseTo(609.6, 12);
  });

  it("uses defaultUnit for bare numbers when given", () => {
    expect(parseLength("90", { field: "lengthFt", system: "US", defaultUnit: "ft" })).toBeCloseTo(90 * 304.8, 9);
  });

  it("accepts negative values only when allowed", () => {
    expectInputError(() => parseLength("-1/8", us), "readingA", "negative");
    expect(parseLength("-1/8", { ...us, allowNegative: true })).toBeCloseTo(-3.175, 12);
    expect(parseLength("-1 1/8", { ...us, allowNegative: true })).toBeCloseTo(-1.125 * 25.4, 12);
  });

  it("returns plus zero for a typed minus zero", () => {
    expect(Object.is(parseLength("-0", { ...si, allowNegative: true }), 0)).toBe(true);
  });

  it.each([
    ["", "required"],
    ["   ", "required"],
    ["abc", "not-a-number"],
    ["8 3/0", "bad-fraction"],
    ["3/0", "bad-fraction"],
    ["8 9/8", "bad-fraction"],
    ["8 3/8 5", "not-a-number"],
    ["8,375", "not-a-number"],
    ["1,234", "not-a-number"],
    ["8.3.7", "not-a-number"],
    ["8 furlongs", "unknown-unit"],
    ["8 psi", "unknown-unit"],
    ["in 8", "not-a-number"],
    ["1" + "0".repeat(400), "not-finite"],
  ])("rejects %j with code %s naming the field", (typed, code) => {
    expectInputError(() => parseLength(typed, us), "readingA", code as InputError["code"]);
  });

  it("rejects fractions in metric units", () => {
    expectInputError(() => parseLength("3/4", si), "readingA", "fraction-not-inches");
    expectInputError(() => parseLength("8 3/8 mm", us), "readingA", "fraction-not-inches");
  });

  it("rejects values that are not text", () => {
    expectInputError(() => parseLength(undefined as unknown as string, us), "readingA", "required");
    expectInputError(() => parseLength(8 as unknown as string, us), "readingA", "not-a-number");
  });
});

describe("parsePressure", () => {
  it("reads psi, ksi, bar, MPa and kPa into MPa", () => {
    const options = { field: "gaugeA", system: "US" as const };
    expect(parsePressure("4227", options)).toBeCloseTo(4227 * 0.006894757293168, 12);
    expect(parsePressure("4227 psi", options)).toBeCloseTo(4227 * 0.006894757293168, 12);
    expect(parsePressure("4.227 ksi", options)).toBeCloseTo(4.227 * 6.894757293168, 12);
    expect(parsePressure("291 bar", options)).toBeCloseTo(29.1, 12);
    expect(parsePressure("29.1 MPa", options)).toBe(29.1);
    expect(parsePressure("29100 kPa", options)).toBeCloseTo(29.1, 12);
  });

  it("reads a bare number in the SI default (MPa) or the project's gauge unit", () => {
    expect(parsePressure("29.1", { field: "gaugeA", system: "SI" })).toBe(29.1);
    expect(parsePressure("291", { field: "gaugeA", system: "SI", defaultUnit: "bar" })).toBeCloseTo(29.1, 12);
  });

  it.each([
    ["", "required"],
    ["lots", "not-a-number"],
    ["-5", "negative"],
    ["3/4", "not-a-number"],
    ["4227 kip", "unknown-unit"],
  ])("rejects %j with %s", (typed, code) => {
    expectInputError(
      () => parsePressure(typed, { field: "gaugeA", system: "US" }),
      "gaugeA",
      code as InputError["code"],
    );
  });
});

describe("parseForce", () => {
  it("reads lbf, kip, kN and N into newtons", () => {
    const options = { field: "jackingForce", system: "US" as const };
    expect(parseForce("33.05", options)).toBeCloseTo(33.05 * 4448.2216152605, 9);
    expect(parseForce("33.05 kips", options)).toBeCloseTo(33.05 * 4448.2216152605, 9);
    expect(parseForce("33050 lbf", options)).toBeCloseTo(33050 * 4.4482216152605, 9);
    expect(parseForce("33050 lb", options)).toBeCloseTo(33050 * 4.4482216152605, 9);
    expect(parseForce("147 kN", options)).toBe(147000);
    expect(parseForce("147000 N", options)).toBe(147000);
    expect(parseForce("147", { field: "jackingForce", system: "SI" })).toBe(147000);
  });

  it.each([
    ["", "required"],
    ["-1 kN", "negative"],
    ["1 1/2 kip", "not-a-number"],
    ["5 psi", "unknown-unit"],
  ])("rejects %j with %s", (typed, code) => {
    expectInputError(
      () => parseForce(typed, { field: "jackingForce", system: "US" }),
      "jackingForce",
      code as InputError["code"],
    );
  });
});
