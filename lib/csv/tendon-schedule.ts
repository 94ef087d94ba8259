import Papa from "papaparse";
import { safeCell, safeRows } from "./safe-cell";
import { findStrandSize } from "@/lib/elongation";
import {
  FORCE_UNITS,
  getUnit,
  InputError,
  isInputError,
  MM_PER_FOOT,
  MM_PER_INCH,
  parseForce,
  parseLength,
  type ForceUnit,
  type UnitSystem,
} from "@/lib/units";
import { FORMULA_START, STRAND_SIZES, tendonSchema, type TendonInput } from "@/lib/schemas/tendon";

/**
 * Tautline's tendon schedule file: one row per tendon of one pour, a header row naming each
 * column with its unit in brackets. Column order is free; the names and units are not.
 *
 *   tag, type, strand size [in], strands, ends, segments [ft@deg], jack grip [in],
 *   shop elongation [in], strand lot, member, stressing order, jacking force [kip]
 *
 * `segments` lists each segment from end A to end B as length@angle-change, separated by
 * spaces: "15@1.62 15@1.62". Lengths may be given in ft or m (segments), in or mm (grip,
 * elongation); angles in deg or rad; forces in kip, kN, lbf or N, as the header says. Everything
 * is stored in SI.
 */

export type LengthHeaderUnit = "ft" | "m" | "in" | "mm";
type AngleUnit = "deg" | "rad";

interface ColumnSpec {
  key: string;
  required: boolean;
  /** The units the header may declare; none means the column takes no unit. */
  units?: readonly string[];
  hint: string;
}

export const COLUMNS: readonly ColumnSpec[] = [
  { key: "tag", required: true, hint: "tag as drawn, unique in the pour" },
  { key: "type", required: true, hint: "monostrand (unbonded) or multistrand (bonded)" },
  { key: "strand size", required: true, units: ["in"], hint: "nominal diameter: 0.375, 0.438, 0.5 or 0.6" },
  { key: "strands", required: true, hint: "number of strands (1 for monostrand)" },
  { key: "ends", required: true, hint: "stressing end: A, B or both" },
  {
    key: "segments",
    required: true,
    units: ["ft@deg", "ft@rad", "m@deg", "m@rad"],
    hint: "length@angle change per segment from end A, separated by spaces",
  },
  {
    key: "jack grip",
    required: false,
    units: ["in", "mm"],
    hint: "strand inside the jack; empty to use the equipment set's",
  },
  { key: "shop elongation", required: false, units: ["in", "mm"], hint: "the detailer's elongation, when given" },
  { key: "strand lot", required: false, hint: "lot or heat number registered on the project" },
  {
    key: "member",
    required: false,
    hint: "beam, slab strip or band the tendon belongs to; its group average and wire-break ledger are judged per member",
  },
  {
    key: "stressing order",
    required: false,
    hint: "two-end tendons: sequential (one end after the other) or simultaneous (both at once); empty when not decided",
  },
  {
    key: "jacking force",
    required: false,
    units: ["kip", "kN", "lbf", "N"],
    hint: "the tendon's specified jacking force, at most 0.80·fpu·A; empty to use the project's factor of fpu·A",
  },
];

export const MAX_ROWS = 20_000;

export interface ScheduleError {
  /** Line in the file: 1 is the header. 0 for the file as a whole. */
  row: number;
  column: string;
  message: string;
}

export interface ParsedTendon extends Omit<TendonInput, "strandLotId"> {
  strandLot: string | null;
}

export type ScheduleParse = { ok: true; tendons: ParsedTendon[] } | { ok: false; errors: ScheduleError[] };

const MAX_ERRORS = 200;

function readHeader(raw: string): { key: string; unit: string | null } {
  const match = /^\s*([^[\]]+?)\s*(?:\[\s*([^\]]*?)\s*\])?\s*$/.exec(raw);
  return { key: (match?.[1] ?? raw).trim().toLowerCase(), unit: match?.[2]?.toLowerCase() ?? null };
}

function parseNumber(text: string): number | null {
  if (!/^[0-9]+(\.[0-9]+)?$|^\.[0-9]+$/.test(text)) return null;
  return Number(text);
}

const KIND_WORDS: Record<string, TendonInput["kind"]> = {
  monostrand: "unbonded_monostrand",
  "unbonded monostrand": "unbonded_monostrand",
  unbonded_monostrand: "unbonded_monostrand",
  multistrand: "bonded_multistrand",
  "bonded multistrand": "bonded_multistrand",
  bonded_multistrand: "bonded_multistrand",
};

/**
 * Reads and checks a whole schedule file. Every problem is listed by line and column; the
 * result holds tendons only when the whole file is good. `existingTags` are the tags already
 * in the pour and `lotNumbers` the project's strand lots.
 */
export function parseTendonSchedule(
  text: string,
  context: { existingTags?: ReadonlySet<string>; lotNumbers?: ReadonlySet<string> } = {},
): ScheduleParse {
  const errors: ScheduleError[] = [];
  const add = (row: number, column: string, message: string) => {
    if (errors.length < MAX_ERRORS) errors.push({ row, column, message });
  };
  const source = text.replace(/^\uFEFF/, "");
  const parsed = Papa.parse<string[]>(source, { skipEmptyLines: "greedy" });
  for (const e of parsed.errors.slice(0, 20))
    add((e.row ?? -1) + 1, "", `The file is not well-formed CSV: ${e.message}.`);
  const [header, ...rows] = parsed.data;
  if (!header || header.every((h) => !h.trim()))
    return { ok: false, errors: [{ row: 1, column: "", message: "The file has no header row." }] };
  if (rows.length === 0) add(0, "", "The file has a header but no tendons.");
  if (rows.length > MAX_ROWS)
    return {
      ok: false,
      errors: [
        { row: 0, column: "", message: `The file has ${rows.length} rows; import at most ${MAX_ROWS} at a time.` },
      ],
    };

  // Header: known names, allowed units, no repeats, every required column.
  const index = new Map<string, { at: number; unit: string | null }>();
  header.forEach((raw, at) => {
    const { key, unit } = readHeader(raw);
    const spec = COLUMNS.find((c) => c.key === key);
    if (!spec) return add(1, raw, `Unknown column "${raw}". The columns are: ${COLUMNS.map((c) => c.key).join(", ")}.`);
    if (index.has(key)) return add(1, raw, `The column "${key}" appears twice.`);
    if (spec.units && (!unit || !spec.units.some((u) => u.toLowerCase() === unit))) {
      return add(1, raw, `Give "${key}" a unit in brackets, one of ${spec.units.map((u) => `[${u}]`).join(", ")}.`);
    }
    if (!spec.units && unit) return add(1, raw, `The column "${key}" takes no unit.`);
    index.set(key, { at, unit });
  });
  for (const spec of COLUMNS)
    if (
      spec.required &&
      !index.has(spec.key) &&
      !errors.some((e) => e.row === 1 && readHeader(e.column).key === spec.key)
    )
      add(1, spec.key, `The column "${spec.key}" is missing.`);
  if (errors.some((e) => e.row <= 1)) return { ok: false, errors };

  const cell = (row: string[], key: string): string => {
    const col = index.get(key);
    return col ? (row[col.at] ?? "").trim() : "";
  };
  const unitOf = (key: string) => index.get(key)?.unit ?? "";
  const [segLength, segAngle] = unitOf("segments").split("@") as [LengthHeaderUnit, AngleUnit];
  const angleFactor = segAngle === "deg" ? Math.PI / 180 : 1;
  const forceUnit = (FORCE_UNITS.find((u) => u.unit.toLowerCase() === unitOf("jacking force"))?.unit ??
    "kN") satisfies ForceUnit;
  /**
   * A length cell, read like every length box of the app (`parseLength` of lib/units): decimals, inch
   * fractions ("5 1/4"), feet and inches ("40' 6\"", "40 ft 6 in") or a number with its own unit
   * ("12.5 m"); a bare number is in the header's unit. Undefined after naming the fault.
   */
  const UNIT_WORDS = { ft: "feet", m: "metres", in: "inches", mm: "millimetres" } as const;
  const readLength = (text: string, unit: LengthHeaderUnit, column: string, line: number, what = "") => {
    try {
      return parseLength(text, {
        field: column,
        system: unit === "ft" || unit === "in" ? "US" : "SI",
        defaultUnit: unit,
      });
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      add(
        line,
        column,
        `${what}${e.reason}. Write a number of ${UNIT_WORDS[unit]} or a length with its unit: 8 3/8 in, 40' 6", 40 ft 6 in, 12.5 m.`,
      );
      return undefined;
    }
  };
  const optionalLength = (row: string[], key: string, line: number): number | null | undefined => {
    const text = cell(row, key);
    if (!text) return null;
    return readLength(text, unitOf(key) as LengthHeaderUnit, key, line);
  };

  const seen = new Map<string, number>();
  const tendons: ParsedTendon[] = [];
  rows.forEach((row, i) => {
    const line = i + 2;
    if (row.length > header.length && row.slice(header.length).some((c) => c.trim()))
      add(line, "", `Line ${line} has more cells than the header.`);
    for (const [key] of index) {
      const raw = cell(row, key);
      if (FORMULA_START.test(raw) && !(key === "segments" && /^-?[0-9.]/.test(raw))) {
        add(line, key, `"${raw.slice(0, 30)}" starts like a spreadsheet formula (=, +, -, @); it is refused.`);
      }
    }

    const tag = cell(row, "tag");
    if (tag) {
      const first = seen.get(tag.toLowerCase());
      if (first) add(line, "tag", `The tag "${tag}" is already on line ${first}.`);
      else seen.set(tag.toLowerCase(), line);
      if (context.existingTags?.has(tag.toLowerCase())) add(line, "tag", `The tag "${tag}" is already in this pour.`);
    }

    const kindText = cell(row, "type").toLowerCase();
    const kind = KIND_WORDS[kindText];
    if (!kind) add(line, "type", `"${cell(row, "type")}" is not a type; use monostrand or multistrand.`);

    const sizeText = cell(row, "strand size").replace(/\s*(in|")$/i, "");
    const designation = STRAND_SIZES.find((d) => Number(d.replace(" in", "")) === Number(sizeText) && sizeText !== "");
    if (!designation || !findStrandSize(designation))
      add(line, "strand size", `"${cell(row, "strand size")}" is not a strand size; use 0.375, 0.438, 0.5 or 0.6.`);

    const strands = parseNumber(cell(row, "strands"));
    if (strands === null || !Number.isInteger(strands))
      add(line, "strands", `"${cell(row, "strands")}" is not a whole number of strands.`);

    const endsText = cell(row, "ends");
    const ends =
      endsText.toLowerCase() === "both"
        ? "both"
        : endsText.toUpperCase() === "A"
          ? "A"
          : endsText.toUpperCase() === "B"
            ? "B"
            : null;
    if (!ends) add(line, "ends", `"${endsText}" is not a stressing end; use A, B or both.`);

    const segments: { lengthMm: number; angleRad: number }[] = [];
    const segText = cell(row, "segments");
    if (!segText) add(line, "segments", "Give the profile as length@angle per segment, like 15@1.6 15@1.6.");
    // "L1@A1 L2@A2": a length may hold spaces (40 ft 6 in), an angle does not, so the text between two
    // "@" is the angle before the first space and the next segment's length after it.
    const pieces = segText ? segText.split("@") : [];
    let lengthText = pieces[0]?.trim() ?? "";
    for (let k = 1; k < pieces.length; k++) {
      const rest = pieces[k]!.trim();
      const split = k === pieces.length - 1 ? [rest, ""] : (/^(\S+)\s+(\S.*)$/.exec(rest)?.slice(1) ?? null);
      const angle = split ? parseNumber(split[0]!) : null;
      if (!split || angle === null || !lengthText) {
        add(line, "segments", `"${lengthText}@${rest}" is not length@angle (in ${segLength}@${segAngle}).`);
        break;
      }
      const lengthMm = readLength(lengthText, segLength, "segments", line, `Segment ${k}: `);
      if (lengthMm === undefined) break;
      segments.push({ lengthMm, angleRad: angle * angleFactor });
      lengthText = split[1]!.trim();
    }
    if (segText && pieces.length < 2)
      add(line, "segments", `"${segText}" is not length@angle (in ${segLength}@${segAngle}).`);

    const jackGripMm = optionalLength(row, "jack grip", line);
    const shopElongationMm = optionalLength(row, "shop elongation", line);
    const lot = cell(row, "strand lot") || null;
    if (lot && context.lotNumbers && !context.lotNumbers.has(lot))
      add(line, "strand lot", `The strand lot "${lot}" is not registered on this project.`);

    const orderText = cell(row, "stressing order").toLowerCase();
    const stressingOrder =
      orderText === "" ? null : orderText === "sequential" || orderText === "simultaneous" ? orderText : undefined;
    if (stressingOrder === undefined)
      add(
        line,
        "stressing order",
        `"${cell(row, "stressing order")}" is not a stressing order; use sequential, simultaneous or leave it empty.`,
      );

    const forceText = cell(row, "jacking force");
    let jackingForceN: number | null = null;
    if (forceText) {
      try {
        jackingForceN = parseForce(forceText, { field: "jacking force", system: "SI", defaultUnit: forceUnit });
      } catch (error) {
        if (!isInputError(error)) throw error;
        add(line, "jacking force", `"${forceText}" is not a force in ${forceUnit}.`);
      }
    }

    if (errors.some((e) => e.row === line)) return;
    const checked = tendonSchema.safeParse({
      tag,
      kind,
      strandSize: designation,
      strandCount: strands,
      segments,
      ends,
      jackGripMm: jackGripMm ?? null,
      shopElongationMm: shopElongationMm ?? null,
      strandLotId: null,
      member: cell(row, "member") || null,
      stressingOrder,
      jackingForceN,
    });
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const field = String(issue.path[0] ?? "");
        const column =
          {
            tag: "tag",
            kind: "type",
            strandSize: "strand size",
            strandCount: "strands",
            segments: "segments",
            ends: "ends",
            jackGripMm: "jack grip",
            shopElongationMm: "shop elongation",
            member: "member",
            stressingOrder: "stressing order",
            jackingForceN: "jacking force",
          }[field] ?? field;
        add(line, column, issue.message);
      }
      return;
    }
    const { strandLotId: _unused, ...rest } = checked.data;
    void _unused;
    tendons.push({ ...rest, strandLot: lot });
  });
  return errors.length ? { ok: false, errors } : { ok: true, tendons };
}

/** Keeps a spreadsheet from running a cell as a formula (OWASP CSV injection advice). */
export function neutralise(value: string): string {
  return safeCell(value);
}

const round = (n: number, places: number) => String(Number(n.toFixed(places)));

export function scheduleHeader(system: UnitSystem): string[] {
  const long = system === "US" ? "ft" : "m";
  const short = system === "US" ? "in" : "mm";
  return [
    "tag",
    "type",
    "strand size [in]",
    "strands",
    "ends",
    `segments [${long}@deg]`,
    `jack grip [${short}]`,
    `shop elongation [${short}]`,
    "strand lot",
    "member",
    "stressing order",
    `jacking force [${system === "US" ? "kip" : "kN"}]`,
  ];
}

export interface ExportTendon {
  tag: string;
  kind: TendonInput["kind"];
  strandSize: string;
  strandCount: number;
  ends: TendonInput["ends"];
  segments: { lengthMm: number; angleRad: number }[];
  jackGripMm: number | null;
  shopElongationMm: number | null;
  strandLot: string | null;
  member?: string | null;
  stressingOrder?: "sequential" | "simultaneous" | null;
  jackingForceN?: number | null;
}

/** The same layout as the import, so an exported file imports again unchanged. */
export function toTendonCsv(tendons: readonly ExportTendon[], system: UnitSystem): string {
  const short = (mm: number | null) => (mm === null ? "" : system === "US" ? round(mm / MM_PER_INCH, 4) : round(mm, 2));
  const rows = tendons.map((t) => [
    neutralise(t.tag),
    t.kind === "unbonded_monostrand" ? "monostrand" : "multistrand",
    t.strandSize.replace(" in", ""),
    String(t.strandCount),
    t.ends,
    t.segments
      .map(
        (s) =>
          `${round(system === "US" ? s.lengthMm / MM_PER_FOOT : s.lengthMm / 1000, 4)}@${round((s.angleRad * 180) / Math.PI, 4)}`,
      )
      .join(" "),
    short(t.jackGripMm),
    short(t.shopElongationMm),
    neutralise(t.strandLot ?? ""),
    neutralise(t.member ?? ""),
    t.stressingOrder ?? "",
    // Ten significant figures: a force typed as 33.04 kip comes back as 33.04, and any stored force
    // imports again within the limit check's noise.
    t.jackingForceN === null || t.jackingForceN === undefined
      ? ""
      : String(Number((t.jackingForceN / getUnit(FORCE_UNITS, system === "US" ? "kip" : "kN").toBase).toPrecision(10))),
  ]);
  return Papa.unparse({ fields: scheduleHeader(system), data: safeRows(rows) }, { newline: "\r\n" }) + "\r\n";
}

/** A template with two example rows in the project's units, ready to fill in. */
export function templateCsv(system: UnitSystem): string {
  const us = system === "US";
  const example: ExportTendon[] = [
    {
      tag: "EXAMPLE-U01",
      kind: "unbonded_monostrand",
      strandSize: "0.5 in",
      strandCount: 1,
      ends: "A",
      segments: [1, 2, 3, 4].map(() => ({ lengthMm: us ? 15 * MM_PER_FOOT : 4500, angleRad: (1.62 * Math.PI) / 180 })),
      jackGripMm: us ? 18 * MM_PER_INCH : 450,
      shopElongationMm: null,
      strandLot: null,
    },
    {
      tag: "EXAMPLE-B01",
      kind: "bonded_multistrand",
      strandSize: "0.6 in",
      strandCount: 12,
      ends: "both",
      segments: [1, 2].map(() => ({ lengthMm: us ? 40 * MM_PER_FOOT : 12_000, angleRad: (5.7 * Math.PI) / 180 })),
      jackGripMm: us ? 24 * MM_PER_INCH : 600,
      shopElongationMm: us ? 6.5 * MM_PER_INCH : 165,
      strandLot: null,
    },
  ];
  return toTendonCsv(example, system);
}

/** For people reading the template: each column and what goes in it. */
export function columnGuide(system: UnitSystem): { header: string; required: boolean; hint: string }[] {
  const header = scheduleHeader(system);
  return COLUMNS.map((c, i) => ({ header: header[i]!, required: c.required, hint: c.hint }));
}
