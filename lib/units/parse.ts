import { InputError } from "./errors";
import { MM_PER_FOOT, MM_PER_INCH } from "./factors";
import { normalizeTyped, readTypedNumber } from "./read-number";
import {
  DEFAULT_UNITS,
  FORCE_UNITS,
  type ForceUnit,
  findUnitByAlias,
  getUnit,
  LENGTH_UNITS,
  type LengthUnit,
  PRESSURE_UNITS,
  type PressureUnit,
  type UnitSpec,
  type UnitSystem,
} from "./unit-tables";

export interface ParseOptions<U extends string> {
  /** Path of the form field, repeated in any error. */
  field: string;
  /** The project's system; decides what a bare number means. */
  system: UnitSystem;
  /** Overrides the system's default unit for bare numbers (e.g. bar gauges on an SI job). */
  defaultUnit?: U;
}

export interface LengthParseOptions extends ParseOptions<LengthUnit> {
  /** Readings are distances moved and are never negative unless the caller says so. */
  allowNegative?: boolean;
}

function resolveUnit<U extends string>(
  table: readonly UnitSpec<U>[],
  unitText: string,
  fallback: U,
  field: string,
  text: string,
): UnitSpec<U> {
  if (unitText === "") return getUnit(table, fallback);
  const spec = findUnitByAlias(table, unitText);
  if (!spec) {
    const accepted = table.map((candidate) => candidate.unit).join(", ");
    throw new InputError(field, "unknown-unit", `"${text}": unit "${unitText}" is not one of ${accepted}`);
  }
  return spec;
}

// Whole feet, the foot mark, an optional dash, then the inches: "5'-6 1/2\"", "5' 6\"", "5 ft 6 in".
const FEET_THEN_INCHES = /^([+-]?)\s*(\d+)\s*(?:'|ft\.?|feet|foot)\s*(?:-\s*)?(\S.*)$/i;

/**
 * Feet and inches as written on drawings and read off a tape ("5'-6 1/2\""): millimetres, or null
 * when the text is not feet followed by inches (then the ordinary reading applies, so "5'" alone
 * is five feet). The inches part takes any of the inch forms and must be below 12.
 */
function readFeetInches(text: string, field: string): number | null {
  if (typeof text !== "string") return null;
  const match = FEET_THEN_INCHES.exec(normalizeTyped(text));
  if (!match) return null;
  const [, sign, feet, rest] = match;
  const inches = readTypedNumber(rest, field);
  const unit = inches.unitText === "" ? "in" : findUnitByAlias(LENGTH_UNITS, inches.unitText)?.unit;
  if (unit !== "in") {
    throw new InputError(
      field,
      "unknown-unit",
      `"${text}": after the feet, type inches ("5'-6 1/2\"") or give the whole length in one unit`,
    );
  }
  if (inches.value < 0 || inches.value >= 12) {
    throw new InputError(field, "bad-fraction", `"${text}": the inches after the feet must be from 0 to below 12`);
  }
  const mm = Number(feet) * MM_PER_FOOT + inches.value * MM_PER_INCH;
  return sign === "-" ? -mm + 0 : mm;
}

/**
 * Reads a length as crews type it — "8 3/8", "8-3/8\"", "8.375 in", "212 mm", "212", "3/4",
 * "5'-6 1/2\"" —
 * and returns millimetres. A bare number is in the project's reading unit (inches for US,
 * millimetres for SI). Fractions are accepted for inches only.
 */
export function parseLength(text: string, options: LengthParseOptions): number {
  const { field } = options;
  const feetInches = readFeetInches(text, field);
  if (feetInches !== null) {
    if (feetInches < 0 && !options.allowNegative) {
      throw new InputError(field, "negative", `"${text}" is negative; a length here cannot be`);
    }
    return feetInches;
  }
  const typed = readTypedNumber(text, field);
  const fallback = options.defaultUnit ?? DEFAULT_UNITS[options.system].length;
  const spec = resolveUnit(LENGTH_UNITS, typed.unitText, fallback, field, text);
  if (typed.hasFraction && spec.unit !== "in") {
    throw new InputError(
      field,
      "fraction-not-inches",
      `"${text}": fractions are read as inches only; add "in" or type a decimal ${spec.unit} value`,
    );
  }
  if (typed.value < 0 && !options.allowNegative) {
    throw new InputError(field, "negative", `"${text}" is negative; a length here cannot be`);
  }
  return typed.value * spec.toBase;
}

function parseMagnitude<U extends string>(
  text: string,
  options: ParseOptions<U>,
  table: readonly UnitSpec<U>[],
  fallback: U,
  quantity: string,
): number {
  const { field } = options;
  const typed = readTypedNumber(text, field);
  if (typed.hasFraction) {
    throw new InputError(field, "not-a-number", `"${text}": type a ${quantity} as a decimal number`);
  }
  const spec = resolveUnit(table, typed.unitText, options.defaultUnit ?? fallback, field, text);
  if (typed.value < 0) throw new InputError(field, "negative", `"${text}": a ${quantity} cannot be negative`);
  return typed.value * spec.toBase;
}

/** Reads a gauge pressure ("4227", "4227 psi", "291 bar", "29.1 MPa") and returns MPa. */
export function parsePressure(text: string, options: ParseOptions<PressureUnit>): number {
  return parseMagnitude(text, options, PRESSURE_UNITS, DEFAULT_UNITS[options.system].pressure, "pressure");
}

/** Reads a force ("33.05 kip", "33050 lbf", "147 kN") and returns newtons. */
export function parseForce(text: string, options: ParseOptions<ForceUnit>): number {
  return parseMagnitude(text, options, FORCE_UNITS, DEFAULT_UNITS[options.system].force, "force");
}
