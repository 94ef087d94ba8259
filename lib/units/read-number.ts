import { InputError } from "./errors";

/** A number as typed, before any unit is applied. */
export interface TypedNumber {
  value: number;
  /** Whatever followed the number, trimmed (may be empty). */
  unitText: string;
  /** True when the crew typed a fraction ("3/8", "8 3/8"); only inches accept those. */
  hasFraction: boolean;
}

// Tablet keyboards and pasted text bring typographic characters; map them to the plain ones
// the grammar below knows, so "8⅜″" reads like 8 3/8".
const TYPOGRAPHIC: Record<string, string> = {
  "½": " 1/2",
  "¼": " 1/4",
  "¾": " 3/4",
  "⅛": " 1/8",
  "⅜": " 3/8",
  "⅝": " 5/8",
  "⅞": " 7/8",
  "⁄": "/",
  "″": '"',
  "”": '"',
  "“": '"',
  "′": "'",
  "’": "'",
  "−": "-",
  "–": "-",
  "\u00a0": " ",
};

// sign, then one of: mixed number ("8 3/8", "8-3/8"), plain fraction ("3/4"), decimal
// ("8.375", ".5", "8."), then the rest (the unit, checked by the caller).
const NUMBER_PATTERN =
  /^([+-]?)\s*(?:(\d+)(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)|(\d+)\s*\/\s*(\d+)|(\d+(?:\.\d*)?|\.\d+))\s*(.*)$/;

export function normalizeTyped(text: string): string {
  let out = "";
  for (const char of text) out += TYPOGRAPHIC[char] ?? char;
  return out.trim().replace(/\s+/g, " ");
}

export function readTypedNumber(text: unknown, field: string): TypedNumber {
  if (text === undefined || text === null) throw new InputError(field, "required", "a value is required");
  if (typeof text !== "string") throw new InputError(field, "not-a-number", "expected typed text");
  const clean = normalizeTyped(text);
  if (clean === "") throw new InputError(field, "required", "a value is required");
  if (clean.includes(",")) {
    throw new InputError(
      field,
      "not-a-number",
      `"${text}" has a comma; type the number without thousands separators and with a point for decimals`,
    );
  }

  const match = NUMBER_PATTERN.exec(clean);
  if (!match) throw new InputError(field, "not-a-number", `"${text}" is not a number`);
  const [, sign, whole, mixedNum, mixedDen, fracNum, fracDen, decimal, rest = ""] = match;

  let magnitude: number;
  let hasFraction = false;
  if (whole !== undefined && mixedNum !== undefined && mixedDen !== undefined) {
    const numerator = Number(mixedNum);
    const denominator = Number(mixedDen);
    if (denominator === 0) throw new InputError(field, "bad-fraction", `"${text}" has a zero denominator`);
    if (numerator >= denominator) {
      throw new InputError(field, "bad-fraction", `"${text}": the fraction after the whole number must be below 1`);
    }
    magnitude = Number(whole) + numerator / denominator;
    hasFraction = true;
  } else if (fracNum !== undefined && fracDen !== undefined) {
    const denominator = Number(fracDen);
    if (denominator === 0) throw new InputError(field, "bad-fraction", `"${text}" has a zero denominator`);
    magnitude = Number(fracNum) / denominator;
    hasFraction = true;
  } else {
    magnitude = Number(decimal);
  }

  if (!Number.isFinite(magnitude)) throw new InputError(field, "not-finite", `"${text}" is too large`);
  if (/\d/.test(rest)) throw new InputError(field, "not-a-number", `"${text}" is not a single number`);
  // "+ 0" keeps -0 out of results; a zero reading is zero, not minus zero.
  const value = sign === "-" ? -magnitude + 0 : magnitude;
  return { value, unitText: rest.trim(), hasFraction };
}
