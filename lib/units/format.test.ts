import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { InputError } from "./errors";
import {
  formatForce,
  formatLength,
  formatLengthInward,
  formatPressure,
  READING_RESOLUTIONS,
  resolutionStepMm,
  roundToResolution,
} from "./format";
import { parseLength } from "./parse";

const inch = (value: number): number => value * 25.4;

describe("formatLengthInward", () => {
  // Hand-rounded: a band of 5.14 in to 5.91 in read on a tape; 1/8 in = 0.125 in, 1/16 in = 0.0625 in.
  it.each([
    [inch(5.14), "1/8 in", "lower", "5 1/4 in"], // 5.125 < 5.14, so the first division inside is 5.25
    [inch(5.91), "1/8 in", "upper", "5 7/8 in"], // 5.875 ≤ 5.91 < 6.0
    [inch(5.14), "1/16 in", "lower", "5 3/16 in"], // 5.125 < 5.14 ≤ 5.1875
    [inch(5.91), "1/16 in", "upper", "5 7/8 in"], // 5.875 ≤ 5.91 < 5.9375
    [inch(5.5), "1/8 in", "lower", "5 1/2 in"], // on a division: stays
    [inch(5.5), "1/8 in", "upper", "5 1/2 in"],
    [inch(0.1), "1/8 in", "lower", "1/8 in"],
    [inch(0.1), "1/8 in", "upper", "0 in"],
    [130.4, "1 mm", "lower", "131 mm"],
    [150.6, "1 mm", "upper", "150 mm"],
  ] as const)("shows %d mm at %s as the %s edge %j", (mm, resolution, edge, text) => {
    expect(formatLengthInward(mm, resolution, edge)).toBe(text);
  });

  it("decides a reading on the division exactly as the band itself does", () => {
    const resolutions = ["1/16 in", "1/8 in"] as const;
    fc.assert(
      fc.property(
        fc.constantFrom(...resolutions),
        fc.double({ min: 10, max: 400, noNaN: true }),
        fc.double({ min: 0.01, max: 0.2, noNaN: true }),
        fc.integer({ min: 0, max: 8000 }),
        (resolution, predictedMm, tolerance, steps) => {
          const lower = predictedMm * (1 - tolerance);
          const upper = predictedMm * (1 + tolerance);
          const reading = steps * resolutionStepMm(resolution);
          const read = (text: string) => parseLength(text, { field: "edge", system: "US" });
          const shownLower = read(formatLengthInward(lower, resolution, "lower"));
          const shownUpper = read(formatLengthInward(upper, resolution, "upper"));
          const inBand = reading >= lower - 1e-6 && reading <= upper + 1e-6;
          const inShown = reading >= shownLower - 1e-9 && reading <= shownUpper + 1e-9;
          expect(inShown).toBe(inBand);
        },
      ),
    );
  });

  it("refuses a value that is not finite", () => {
    expect(() => formatLengthInward(Number.NaN, "1/8 in", "lower", "lowerMm")).toThrow(InputError);
  });
});

describe("formatLength", () => {
  it.each([
    [inch(8.375), "1/8 in", "8 3/8 in"],
    [inch(8), "1/8 in", "8 in"],
    [inch(0.375), "1/8 in", "3/8 in"],
    [inch(8.5), "1/16 in", "8 1/2 in"],
    [inch(8.4375), "1/16 in", "8 7/16 in"],
    [inch(2.74), "1/8 in", "2 3/4 in"],
    [inch(2.99), "1/8 in", "3 in"],
    [inch(-1.125), "1/8 in", "-1 1/8 in"],
    [inch(-0.01), "1/8 in", "0 in"],
    [212.4, "1 mm", "212 mm"],
    [212.5, "1 mm", "213 mm"],
    [-0.2, "1 mm", "0 mm"],
  ] as const)("formats %d mm at %s as %j", (mm, resolution, text) => {
    expect(formatLength(mm, resolution)).toBe(text);
  });

  it("rounds a half division away from zero even after an inch→mm round trip", () => {
    // 8 7/16 in is exactly half-way between 8 3/8 and 8 1/2 at 1/8 in.
    expect(formatLength(inch(8 + 7 / 16), "1/8 in")).toBe("8 1/2 in");
    expect(formatLength(-inch(8 + 7 / 16), "1/8 in")).toBe("-8 1/2 in");
  });

  it("refuses to format a value that is not finite", () => {
    expect(() => formatLength(Number.NaN, "1 mm", "netMm")).toThrow(InputError);
    expect(() => roundToResolution(Number.POSITIVE_INFINITY, "1/8 in")).toThrow(InputError);
  });

  it("parse(format(x)) lands within half a division of x", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 3000, noNaN: true }),
        fc.constantFrom(...READING_RESOLUTIONS),
        (mm, resolution) => {
          const system = resolution === "1 mm" ? "SI" : "US";
          const back = parseLength(formatLength(mm, resolution), { field: "reading", system });
          expect(Math.abs(back - mm)).toBeLessThanOrEqual(resolutionStepMm(resolution) / 2 + 1e-9);
          expect(back).toBeCloseTo(roundToResolution(mm, resolution), 9);
        },
      ),
    );
  });
});

describe("roundToResolution", () => {
  it("snaps to whole divisions", () => {
    expect(roundToResolution(inch(2.8), "1/8 in")).toBeCloseTo(inch(2.75), 12);
    expect(roundToResolution(inch(2.8), "1/16 in")).toBeCloseTo(inch(2.8125), 12);
    expect(roundToResolution(211.6, "1 mm")).toBe(212);
  });
});

describe("formatPressure and formatForce", () => {
  it("print in the chosen unit with the usual decimals", () => {
    expect(formatPressure(4227 * 0.006894757293168, { unit: "psi" })).toBe("4227 psi");
    expect(formatPressure(29.14, { unit: "bar" })).toBe("291.4 bar");
    expect(formatPressure(29.14, { unit: "MPa" })).toBe("29.14 MPa");
    expect(formatPressure(29.14, { unit: "MPa", decimals: 0 })).toBe("29 MPa");
    expect(formatForce(33.05 * 4448.2216152605, { unit: "kip" })).toBe("33.05 kip");
    expect(formatForce(147_000, { unit: "kN" })).toBe("147.0 kN");
    expect(formatForce(41_300 * 4.4482216152605, { unit: "lbf" })).toBe("41300 lbf");
  });

  it("never prints a minus zero", () => {
    expect(formatForce(-0.0001, { unit: "kN" })).toBe("0.0 kN");
  });

  it("refuses a value that is not finite, naming the field", () => {
    expect(() => formatPressure(Number.NaN, { unit: "psi", field: "gaugeA" })).toThrow(/gaugeA/);
    expect(() => formatForce(Number.NaN, { unit: "kN", field: "jackingForce" })).toThrow(/jackingForce/);
  });
});
