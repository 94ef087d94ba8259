import { Linter } from "eslint";
import { describe, expect, it } from "vitest";
import {
  MM2_PER_IN2,
  MM_PER_FOOT,
  MM_PER_INCH,
  MPA_PER_KSI,
  MPA_PER_PSI,
  N_PER_KIP,
  N_PER_LBF,
  METRES_PER_FOOT,
  M2_PER_FT2,
} from "@/lib/units";
import rule, { UNIT_FACTORS } from "./no-unit-factor-literal.mjs";

function lint(code: string): string[] {
  const linter = new Linter({ configType: "flat" });
  const messages = linter.verify(code, [
    {
      plugins: { tautline: { rules: { "no-unit-factor-literal": rule } } },
      rules: { "tautline/no-unit-factor-literal": "error" },
    },
  ]);
  return messages.map((m) => m.message);
}

describe("no-unit-factor-literal", () => {
  it("lists exactly the factors lib/units defines (bar's 0.1 excepted)", () => {
    expect([...UNIT_FACTORS].sort()).toEqual(
      [
        MM_PER_INCH,
        MM_PER_FOOT,
        MM2_PER_IN2,
        M2_PER_FT2,
        N_PER_LBF,
        N_PER_KIP,
        MPA_PER_PSI,
        MPA_PER_KSI,
        METRES_PER_FOOT,
      ].sort(),
    );
  });

  it.each([
    "25.4",
    "304.8",
    "0.3048",
    "645.16",
    "0.09290304",
    "4.4482216152605",
    "4448.2216152605",
    "0.006894757293168",
    "6.894757293168",
    // the same digits a power of ten away: metres per inch, Pa per psi, a whole 10 ft in mm
    "0.0254",
    "6894.757",
    "3048",
    // roundings of four figures or more
    "4.44822",
    "4448.22",
    "6.8948",
    "0.006894757",
    // reciprocals: in per mm, ft per m, psi per MPa, lbf per N
    "0.03937",
    "3.2808",
    "3.280839895",
    "145.03773773",
    "0.2248",
    // square feet per square metre and its rounding, written as a pour's area was converted
    "10.7639104167",
    "10.7639",
    "0.092903",
    "9.2903",
  ])("refuses %s", (literal) => {
    expect(lint(`const x = ${literal};`)).toEqual([expect.stringContaining("unit conversion factor")]);
  });

  it.each([
    "1000",
    "0.1",
    "254",
    "4.45",
    "6.89",
    "3.28",
    "12",
    "4.5",
    "1550",
    "180.975",
    "29.1441",
    "0.001",
    "10.5",
    "0.0929",
  ])("lets %s pass", (literal) => {
    expect(lint(`const x = ${literal};`)).toEqual([]);
  });

  it("reads a negative factor and one with separators", () => {
    expect(lint("const x = -25.4;")).toHaveLength(1);
    expect(lint("const x = 4_448.2216152605;")).toHaveLength(1);
  });
});
