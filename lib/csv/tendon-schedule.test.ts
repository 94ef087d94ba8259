import { describe, expect, it } from "vitest";
import { parseTendonSchedule, templateCsv, toTendonCsv } from "./tendon-schedule";

const HEADER =
  "tag,type,strand size [in],strands,ends,segments [ft@deg],jack grip [in],shop elongation [in],strand lot";
const file = (...rows: string[]) => [HEADER, ...rows].join("\n");

describe("tendon schedule CSV: good files", () => {
  it("reads a row into SI: ft → mm, deg → rad, fractional inches → mm", () => {
    const result = parseTendonSchedule(file("2-1-U01,monostrand,0.5,1,A,15@1.62 15@1.62,18,8 3/8,AY-0871"), {
      lotNumbers: new Set(["AY-0871"]),
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const [t] = result.tendons;
    expect(t).toMatchObject({
      tag: "2-1-U01",
      kind: "unbonded_monostrand",
      strandSize: "0.5 in",
      strandCount: 1,
      ends: "A",
      strandLot: "AY-0871",
    });
    // 15 ft = 4572 mm and 18 in = 457.2 mm (1 in = 25.4 mm exactly, by definition); 8 3/8 in = 212.725 mm.
    expect(t!.segments[0]!.lengthMm).toBeCloseTo(4572, 9);
    expect(t!.segments[0]!.angleRad).toBeCloseTo((1.62 * Math.PI) / 180, 12);
    expect(t!.jackGripMm).toBeCloseTo(457.2, 9);
    expect(t!.shopElongationMm).toBeCloseTo(212.725, 9);
  });

  it("takes columns in any order, SI units, and optional columns left out", () => {
    const result = parseTendonSchedule(
      ["ends,segments [m@rad],tag,strands,strand size [in],type", "both,12@0.1 12@0.1,B-7,12,0.6,multistrand"].join(
        "\r\n",
      ),
    );
    expect(result).toMatchObject({
      ok: true,
      tendons: [
        {
          tag: "B-7",
          strandCount: 12,
          ends: "both",
          jackGripMm: null,
          segments: [
            { lengthMm: 12000, angleRad: 0.1 },
            { lengthMm: 12000, angleRad: 0.1 },
          ],
        },
      ],
    });
  });

  it("exports the same layout, which imports again to the same values, and the template imports too", () => {
    const first = parseTendonSchedule(file("T1,monostrand,0.5,1,both,30@3.1 30@3.1 30@3.1,18,,"));
    expect(first.ok).toBe(true);
    if (!first.ok) return;
    const again = parseTendonSchedule(
      toTendonCsv(
        first.tendons.map((t) => ({ ...t })),
        "US",
      ),
    );
    expect(again.ok && again.tendons[0]!.segments[2]!.lengthMm).toBeCloseTo(first.tendons[0]!.segments[2]!.lengthMm, 3);
    expect(parseTendonSchedule(templateCsv("US")).ok).toBe(true);
    expect(parseTendonSchedule(templateCsv("SI")).ok).toBe(true);
  });

  it("reads the member each tendon belongs to, keeps it through an export, and leaves it empty when not given", () => {
    const withMember = `${HEADER},member\nB3-1,monostrand,0.5,1,A,15@1.6,18,,,Beam B-3\nB3-2,monostrand,0.5,1,A,15@1.6,18,,,`;
    const result = parseTendonSchedule(withMember);
    expect(result.ok && result.tendons.map((t) => t.member)).toEqual(["Beam B-3", null]);
    if (!result.ok) return;
    const again = parseTendonSchedule(toTendonCsv(result.tendons, "SI"));
    expect(again.ok && again.tendons.map((t) => t.member)).toEqual(["Beam B-3", null]);
    const bad = parseTendonSchedule(`${HEADER},member\nB3-1,monostrand,0.5,1,A,15@1.6,18,,,=SUM(A1)`);
    expect(bad.ok === false && bad.errors.map((e) => e.column)).toEqual(["member"]);
  });

  it("reads 10,000 rows", () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => `T-${i},monostrand,0.5,1,A,15@1.6 15@1.6,18,,`);
    const result = parseTendonSchedule(file(...rows));
    expect(result.ok && result.tendons.length).toBe(10_000);
  });
});

describe("tendon schedule CSV: lengths as people write them", () => {
  // Read like every length box of the app (lib/units parseLength). Check values from 1 in = 25.4 mm and
  // 1 ft = 304.8 mm exactly (international yard and pound agreement, 1959): 40' 6" = 12,344.4 mm,
  // 15 ft = 4,572 mm, 10' 0 1/2" = 3,060.7 mm, 5 1/4 in = 133.35 mm, 8 3/8 in = 212.725 mm.
  const one = (segments: string, grip = "", shop = "", header = HEADER) =>
    parseTendonSchedule([header, `T1,monostrand,0.5,1,A,${segments},${grip},${shop},`].join("\n"));
  const cases: {
    title: string;
    segments: string;
    grip?: string;
    shop?: string;
    mm: number[];
    gripMm?: number;
    shopMm?: number;
  }[] = [
    { title: "feet and inches with marks", segments: `"40' 6""@1.6"`, mm: [12_344.4] },
    { title: "feet and inches in words", segments: "40 ft 6 in@1.6", mm: [12_344.4] },
    { title: "a length in metres in a feet column", segments: "12.5 m@1.6", mm: [12_500] },
    {
      title: "segments of different forms in one cell",
      segments: `"15@1.6 40 ft 6 in@0.5 12.5 m@0 10' 0 1/2""@2"`,
      mm: [4572, 12_344.4, 12_500, 3060.7],
    },
    {
      title: "an inch fraction in an inch column",
      segments: "15@1.6",
      grip: "5 1/4",
      mm: [4572],
      gripMm: 133.35,
    },
    { title: "millimetres in an inch column", segments: "15@1.6", shop: "212 mm", mm: [4572], shopMm: 212 },
    {
      title: "inches with the inch mark",
      segments: "15@1.6",
      shop: `"8 3/8"""`,
      mm: [4572],
      shopMm: 212.725,
    },
  ];
  for (const c of cases)
    it(`reads ${c.title}`, () => {
      const result = one(c.segments, c.grip, c.shop);
      expect(result.ok ? "" : result.errors.map((e) => e.message).join("; ")).toBe("");
      if (!result.ok) return;
      const [t] = result.tendons;
      expect(t!.segments.map((s) => s.lengthMm)).toHaveLength(c.mm.length);
      t!.segments.forEach((s, i) => expect(s.lengthMm).toBeCloseTo(c.mm[i]!, 9));
      if (c.gripMm !== undefined) expect(t!.jackGripMm).toBeCloseTo(c.gripMm, 9);
      if (c.shopMm !== undefined) expect(t!.shopElongationMm).toBeCloseTo(c.shopMm, 9);
    });

  it("reads feet and inches in a metre column too: a bare number there is metres", () => {
    const result = one("40 ft 6 in@1.6 12@0", "", "", HEADER.replace("[ft@deg]", "[m@deg]"));
    expect(result.ok && result.tendons[0]!.segments.map((s) => Math.round(s.lengthMm * 1000) / 1000)).toEqual([
      12_344.4, 12_000,
    ]);
  });

  const bad: { title: string; segments: string; grip?: string; column: string; says: RegExp }[] = [
    {
      title: "a word for a length",
      segments: "15@1.6",
      grip: "eighteen",
      column: "jack grip",
      says: /"eighteen" is not a number/,
    },
    { title: "an unknown unit", segments: "15 yd@1.6", column: "segments", says: /^Segment 1: .*unit "yd"/ },
    {
      title: "inches of 12 or more after the feet",
      segments: `"15@1 40' 13""@1.6"`,
      column: "segments",
      says: /^Segment 2: .*below 12/,
    },
    {
      title: "a fraction of a metre",
      segments: "5 1/4 m@1.6",
      column: "segments",
      says: /fractions are read as inches only/,
    },
    {
      title: "a negative length",
      segments: "-15@1.6",
      column: "segments",
      says: /^Segment 1: "-15" is negative/,
    },
    {
      title: "a segment without its angle",
      segments: "40 ft 6 in@",
      column: "segments",
      says: /"40 ft 6 in@" is not length@angle/,
    },
    {
      title: "a length without an angle after the last segment",
      segments: "15@1.6 20",
      column: "segments",
      says: /is not length@angle/,
    },
  ];
  for (const c of bad)
    it(`refuses ${c.title}, naming the line and the column`, () => {
      const result = one(c.segments, c.grip);
      expect(result.ok).toBe(false);
      if (result.ok) return;
      expect(result.errors).toHaveLength(1);
      expect(result.errors[0]).toMatchObject({ row: 2, column: c.column });
      expect(result.errors[0]!.message).toMatch(c.says);
    });
});

describe("tendon schedule CSV: bad files, every error by line and column", () => {
  it("names a missing column and a wrong unit in the header", () => {
    const result = parseTendonSchedule("tag,type,strand size [in],strands,segments [yd@deg]\nT1,monostrand,0.5,1,10@1");
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toEqual(
      expect.arrayContaining([
        { row: 1, column: "segments [yd@deg]", message: expect.stringContaining("[ft@deg]") },
        { row: 1, column: "ends", message: 'The column "ends" is missing.' },
      ]),
    );
    expect(result.errors).toHaveLength(2);
  });

  it("refuses a length column without its unit and an unknown column", () => {
    const result = parseTendonSchedule(
      "tag,type,strand size,strands,ends,segments [ft@deg],colour\nT1,monostrand,0.5,1,A,10@1,red",
    );
    expect(result.ok || result.errors.map((e) => e.column)).toEqual(["strand size", "colour"]);
  });

  it("lists every bad cell of every row, and refuses duplicated tags (in the file and in the pour)", () => {
    const result = parseTendonSchedule(
      file(
        "T1,monostrand,0.5,1,A,15@1.6,18,,",
        "T2,monostrand,0.7,two,C,15@1.6,eighteen,,NOPE",
        "t1,monostrand,0.5,1,A,15@,18,,",
        "OLD-9,monostrand,0.5,1,A,15@1.6,,,",
      ),
      { existingTags: new Set(["old-9"]), lotNumbers: new Set(["AY-0871"]) },
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const where = result.errors.map((e) => `${e.row}:${e.column}`);
    expect(where).toEqual([
      "3:strand size",
      "3:strands",
      "3:ends",
      "3:jack grip",
      "3:strand lot",
      "4:tag",
      "4:segments",
      "5:tag",
    ]);
    expect(result.errors.find((e) => e.row === 4 && e.column === "tag")!.message).toBe(
      'The tag "t1" is already on line 2.',
    );
    expect(result.errors.find((e) => e.row === 5)!.message).toContain("already in this pour");
  });

  it("checks the schema's rules too: a monostrand has one strand, an angle in rad above π is refused", () => {
    const result = parseTendonSchedule(
      [
        "tag,type,strand size [in],strands,ends,segments [m@rad]",
        "X,monostrand,0.5,3,A,10@0.1",
        "Y,multistrand,0.5,3,A,10@4",
      ].join("\n"),
    );
    expect(result.ok || result.errors.map((e) => `${e.row}:${e.column}`)).toEqual(["2:strands", "3:segments"]);
  });

  it("says so for an empty file, a header with no rows, and a file that is not CSV", () => {
    expect(parseTendonSchedule("")).toMatchObject({
      ok: false,
      errors: [{ row: 1, message: "The file has no header row." }],
    });
    expect(parseTendonSchedule(HEADER)).toMatchObject({
      ok: false,
      errors: [{ row: 0, message: "The file has a header but no tendons." }],
    });
    expect(parseTendonSchedule('tag,type\n"unclosed,quote').ok).toBe(false);
  });
});

describe("tendon schedule CSV: hostile files", () => {
  it("refuses cells that a spreadsheet would run as formulas", () => {
    const result = parseTendonSchedule(
      file(
        '=CMD("calc"),monostrand,0.5,1,A,15@1.6,,,',
        "T2,monostrand,0.5,1,A,15@1.6,,,@SUM(A1)",
        "T3,+monostrand,0.5,1,A,15@1.6,,,",
        "T4,monostrand,0.5,1,A,15@1.6,-2,,",
      ),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const formula = result.errors.filter((e) => e.message.includes("formula"));
    expect(formula.map((e) => `${e.row}:${e.column}`)).toEqual(["2:tag", "3:strand lot", "4:type", "5:jack grip"]);
  });

  it("neutralises formula-looking text on export", () => {
    const csv = toTendonCsv(
      [
        {
          tag: "=HYPERLINK(1)",
          kind: "unbonded_monostrand",
          strandSize: "0.5 in",
          strandCount: 1,
          ends: "A",
          segments: [{ lengthMm: 1000, angleRad: 0 }],
          jackGripMm: null,
          shopElongationMm: null,
          strandLot: "@x",
          member: "-1+2",
        },
      ],
      "SI",
    );
    const line = csv.split("\r\n")[1]!;
    expect(line.startsWith("'=HYPERLINK(1)")).toBe(true);
    expect(line.endsWith(",'@x,'-1+2,,")).toBe(true); // the stressing order and the jacking force, empty, last
  });

  it("refuses more rows than allowed without reading them all, and caps the error list", () => {
    const many = file(...Array.from({ length: 20_001 }, (_, i) => `T${i},monostrand,0.5,1,A,15@1.6,,,`));
    expect(parseTendonSchedule(many)).toMatchObject({
      ok: false,
      errors: [{ row: 0, message: expect.stringContaining("at most 20000") }],
    });
    const bad = file(...Array.from({ length: 5000 }, () => "T,x,x,x,x,x,x,x,x"));
    const result = parseTendonSchedule(bad);
    expect(result.ok || result.errors.length).toBe(200);
  });

  it("reads a byte-order mark, control characters in a tag are refused", () => {
    expect(parseTendonSchedule("\uFEFF" + file("T1,monostrand,0.5,1,A,15@1.6,,,")).ok).toBe(true);
    const result = parseTendonSchedule(file("T\u00071,monostrand,0.5,1,A,15@1.6,,,"));
    expect(result.ok || result.errors[0]).toMatchObject({
      row: 2,
      column: "tag",
      message: expect.stringContaining("control"),
    });
  });
});

describe("tendon schedule CSV: the stressing order of two-end tendons", () => {
  const header = `${HEADER},member,stressing order`;
  it("reads sequential or simultaneous (any case), empty as not given, and exports it again", () => {
    const result = parseTendonSchedule(
      [
        header,
        "B-1,multistrand,0.6,12,both,40@5.7 40@5.7,24,,,,Simultaneous",
        "B-2,multistrand,0.6,12,both,40@5.7 40@5.7,24,,,,sequential",
        "B-3,multistrand,0.6,12,both,40@5.7 40@5.7,24,,,,",
      ].join("\n"),
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.tendons.map((t) => t.stressingOrder)).toEqual(["simultaneous", "sequential", null]);
    const again = parseTendonSchedule(toTendonCsv(result.tendons, "US"));
    expect(again.ok && again.tendons.map((t) => t.stressingOrder)).toEqual(["simultaneous", "sequential", null]);
  });

  it("refuses a word it does not know and an order on a one-end tendon, naming the column", () => {
    const result = parseTendonSchedule(
      [
        header,
        "B-1,multistrand,0.6,12,both,40@5.7 40@5.7,24,,,,together",
        "U-1,monostrand,0.5,1,A,30@3.1,18,,,,sequential",
      ].join("\n"),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toEqual([
      {
        row: 2,
        column: "stressing order",
        message: '"together" is not a stressing order; use sequential, simultaneous or leave it empty.',
      },
      {
        row: 3,
        column: "stressing order",
        message: "Only a tendon stressed at both ends has a stressing order; leave it empty.",
      },
    ]);
  });
});

describe("tendon schedule CSV: the tendon's own jacking force", () => {
  const header = `${HEADER},member,stressing order`;
  // ASTM A416 Table 1 (from memory): grade 270 0.5 in strand breaks at no less than 41,300 lbf, so
  // 0.80·fpu·A = 33,040 lbf = 33.04 kip per strand (ACI 318-19 Table 20.3.2.5.1, from memory);
  // 1 lbf = 4.4482216152605 N exactly (NIST SP 811), so 33.04 kip = 146,969.24 N.
  // eslint-disable-next-line tautline/no-unit-factor-literal -- NIST SP 811, the pound-force
  const LIMIT_N = 33_040 * 4.4482216152605;

  it("reads kip on a US file and kN on an SI file into newtons, empty as not given, and exports it again", () => {
    const us = parseTendonSchedule(
      [
        `${header},jacking force [kip]`,
        "U-1,monostrand,0.5,1,A,30@3.1,18,,,,,31.5",
        "U-2,monostrand,0.5,1,A,30@3.1,18,,,,,",
        "U-3,monostrand,0.5,1,A,30@3.1,18,,,,,33.04",
      ].join("\n"),
    );
    expect(us.ok).toBe(true);
    if (!us.ok) return;
    // eslint-disable-next-line tautline/no-unit-factor-literal -- NIST SP 811, the kip
    expect(us.tendons[0]!.jackingForceN).toBeCloseTo(31.5 * 4448.2216152605, 6);
    expect(us.tendons[1]!.jackingForceN).toBeNull();
    // Exactly at the limit is allowed: the rule refuses a force above it.
    expect(us.tendons[2]!.jackingForceN).toBeCloseTo(LIMIT_N, 6);
    const csv = toTendonCsv(us.tendons, "US");
    expect(csv.split("\r\n")[0]).toMatch(/,jacking force \[kip\]$/);
    expect(csv.split("\r\n")[1]).toMatch(/,31\.5$/);
    const again = parseTendonSchedule(csv);
    expect(again.ok && again.tendons.map((t) => t.jackingForceN)).toEqual(us.tendons.map((t) => t.jackingForceN));

    const si = parseTendonSchedule(
      [`${header},jacking force [kN]`, "U-1,monostrand,0.5,1,A,30@3.1,18,,,,,140"].join("\n"),
    );
    expect(si.ok && si.tendons[0]!.jackingForceN).toBe(140_000);
    const siCsv = toTendonCsv(si.ok ? si.tendons : [], "SI");
    expect(siCsv.split("\r\n")[0]).toMatch(/,jacking force \[kN\]$/);
    expect(siCsv.split("\r\n")[1]).toMatch(/,140$/);
  });

  it("refuses a force above 0.80·fpu·A, a word that is no force and a column without its unit, naming the column", () => {
    const result = parseTendonSchedule(
      [
        `${header},jacking force [kip]`,
        "U-1,monostrand,0.5,1,A,30@3.1,18,,,,,33.05",
        "U-2,monostrand,0.5,1,A,30@3.1,18,,,,,full",
      ].join("\n"),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors).toEqual([
      {
        row: 2,
        column: "jacking force",
        message:
          "The jacking force is above 0.80·fpu·A = 33.04 kip (146.96 kN) for 1 × 0.5 in strand (ACI 318-19 Table 20.3.2.5.1); give at most that, or leave it empty for the project's factor.",
      },
      { row: 3, column: "jacking force", message: '"full" is not a force in kip.' },
    ]);
    const noUnit = parseTendonSchedule(
      [`${header},jacking force`, "U-1,monostrand,0.5,1,A,30@3.1,18,,,,,30"].join("\n"),
    );
    expect(noUnit.ok).toBe(false);
    expect(!noUnit.ok && noUnit.errors[0]!.message).toBe(
      'Give "jacking force" a unit in brackets, one of [kip], [kN], [lbf], [N].',
    );
  });
});
