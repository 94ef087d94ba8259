import { InputError } from "./errors";
import { MM_PER_INCH } from "./factors";
import { FORCE_UNITS, type ForceUnit, getUnit, PRESSURE_UNITS, type PressureUnit } from "./unit-tables";

/** The smallest division a crew reads on the tape or ram scale. */
export type ReadingResolution = "1/16 in" | "1/8 in" | "1 mm";

export const READING_RESOLUTIONS: readonly ReadingResolution[] = ["1/16 in", "1/8 in", "1 mm"];

/** Parts of an inch per division, for the inch resolutions. */
const INCH_DIVISIONS: Partial<Record<ReadingResolution, number>> = { "1/16 in": 16, "1/8 in": 8 };

export function resolutionStepMm(resolution: ReadingResolution): number {
  const divisions = INCH_DIVISIONS[resolution];
  return divisions === undefined ? 1 : MM_PER_INCH / divisions;
}

// A value that is exactly half a division on paper (8 7/16 in at 1/8 in) can land a hair below
// the half after the inch→mm→inch round trip; the nudge lets it round the way the typed value
// would (half away from zero) instead of flipping on the last bit.
const HALF_NUDGE = 1e-9;

function roundedSteps(value: number, step: number): number {
  const steps = Math.abs(value) / step;
  return Math.sign(value) * Math.round(steps * (1 + HALF_NUDGE));
}

function requireFinite(value: number, field: string): void {
  if (!Number.isFinite(value)) throw new InputError(field, "not-finite", `cannot format ${String(value)}`);
}

/** Rounds a length in mm to the nearest reading division; returns mm. */
export function roundToResolution(mm: number, resolution: ReadingResolution, field = "value"): number {
  requireFinite(mm, field);
  const step = resolutionStepMm(resolution);
  return roundedSteps(mm, step) * step + 0;
}

function greatestCommonDivisor(a: number, b: number): number {
  return b === 0 ? a : greatestCommonDivisor(b, a % b);
}

/** "8 3/8 in", "8 in", "3/8 in", "-1 1/16 in" or "212 mm", rounded to the reading division. */
export function formatLength(mm: number, resolution: ReadingResolution, field = "value"): string {
  requireFinite(mm, field);
  const divisions = INCH_DIVISIONS[resolution];
  if (divisions === undefined) return `${roundedSteps(mm, 1) + 0} mm`;
  return divisionsText(roundedSteps(mm / MM_PER_INCH, 1 / divisions), divisions);
}

/**
 * A band edge as the tape reads it: the nearest division inside the band (the lower edge rounded
 * up, the upper edge down), so a reading taken on the division is inside the band exactly when it
 * lies between the two edges shown. An edge that falls on a division (within a nanometre of
 * conversion noise) stays on it.
 */
export function formatLengthInward(
  mm: number,
  resolution: ReadingResolution,
  edge: "lower" | "upper",
  field = "value",
): string {
  requireFinite(mm, field);
  const divisions = INCH_DIVISIONS[resolution];
  const steps = mm / resolutionStepMm(resolution);
  const noise = 1e-6 / resolutionStepMm(resolution);
  const count = (edge === "lower" ? Math.ceil(steps - noise) : Math.floor(steps + noise)) + 0;
  return divisions === undefined ? `${count} mm` : divisionsText(count, divisions);
}

function divisionsText(count: number, divisions: number): string {
  const sign = count < 0 ? "-" : "";
  const whole = Math.floor(Math.abs(count) / divisions);
  const remainder = Math.abs(count) % divisions;
  if (remainder === 0) return `${sign}${whole} in`;
  const divisor = greatestCommonDivisor(remainder, divisions);
  const fraction = `${remainder / divisor}/${divisions / divisor}`;
  return whole === 0 ? `${sign}${fraction} in` : `${sign}${whole} ${fraction} in`;
}

/** Decimals that match how each unit is usually read on a gauge or shown on a sheet. */
const PRESSURE_DECIMALS: Record<PressureUnit, number> = { psi: 0, ksi: 2, bar: 1, MPa: 2, kPa: 0 };
const FORCE_DECIMALS: Record<ForceUnit, number> = { N: 0, kN: 1, lbf: 0, kip: 2 };

function fixed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

export function formatPressure(
  mpa: number,
  options: { unit: PressureUnit; decimals?: number; field?: string },
): string {
  requireFinite(mpa, options.field ?? "value");
  const spec = getUnit(PRESSURE_UNITS, options.unit);
  return `${fixed(mpa / spec.toBase, options.decimals ?? PRESSURE_DECIMALS[options.unit])} ${spec.unit}`;
}

export function formatForce(n: number, options: { unit: ForceUnit; decimals?: number; field?: string }): string {
  requireFinite(n, options.field ?? "value");
  const spec = getUnit(FORCE_UNITS, options.unit);
  return `${fixed(n / spec.toBase, options.decimals ?? FORCE_DECIMALS[options.unit])} ${spec.unit}`;
}
