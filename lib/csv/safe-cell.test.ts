import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { safeCell, safeRows } from "./safe-cell";

describe("safeCell", () => {
  it.each([
    ["-1+2", "'-1+2"],
    ["-1+cmd|' /C calc'!A0", "'-1+cmd|' /C calc'!A0"],
    ['=HYPERLINK("http://x")', '\'=HYPERLINK("http://x")'],
    ["+A1", "'+A1"],
    ["@SUM(A1:A2)", "'@SUM(A1:A2)"],
    ["\t=1", "'\t=1"],
    ["\r=1", "'\r=1"],
    ["-", "'-"],
  ])("neutralises %j", (input, expected) => {
    expect(safeCell(input)).toBe(expected);
  });

  it.each(["-3", "+1.2 %", "-0.5", "42", "Pour 3 east", "L2-East", "", "12.5@0 3@-2"])(
    "leaves %j as it is",
    (input) => {
      expect(safeCell(input)).toBe(input);
    },
  );

  it("survives a round trip through the CSV writer: the cell reads back as text, not a formula", () => {
    const csv = Papa.unparse({ fields: ["Pour"], data: safeRows([["-1+1"]]) });
    const parsed = Papa.parse<string[]>(csv).data;
    expect(parsed[1]![0]).toBe("'-1+1");
  });
});
