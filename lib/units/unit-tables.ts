import { MM_PER_FOOT, MM_PER_INCH, MPA_PER_BAR, MPA_PER_KSI, MPA_PER_PSI, N_PER_KIP, N_PER_LBF } from "./factors";

/** A project's measuring system: US customary (in, psi, kip) or SI (mm, MPa, kN). */
export type UnitSystem = "US" | "SI";

export type LengthUnit = "mm" | "cm" | "m" | "in" | "ft";
export type PressureUnit = "psi" | "ksi" | "bar" | "MPa" | "kPa";
export type ForceUnit = "N" | "kN" | "lbf" | "kip";

export interface UnitSpec<U extends string> {
  unit: U;
  /** How many base units (mm, MPa or N) one of this unit is. */
  toBase: number;
  /** Lower-case spellings a crew may type after the number. */
  aliases: readonly string[];
}

export const LENGTH_UNITS: readonly UnitSpec<LengthUnit>[] = [
  { unit: "mm", toBase: 1, aliases: ["mm"] },
  { unit: "cm", toBase: 10, aliases: ["cm"] },
  { unit: "m", toBase: 1000, aliases: ["m"] },
  { unit: "in", toBase: MM_PER_INCH, aliases: ["in", "in.", "inch", "inches", '"'] },
  { unit: "ft", toBase: MM_PER_FOOT, aliases: ["ft", "ft.", "foot", "feet", "'"] },
];

export const PRESSURE_UNITS: readonly UnitSpec<PressureUnit>[] = [
  { unit: "psi", toBase: MPA_PER_PSI, aliases: ["psi"] },
  { unit: "ksi", toBase: MPA_PER_KSI, aliases: ["ksi"] },
  { unit: "bar", toBase: MPA_PER_BAR, aliases: ["bar"] },
  { unit: "MPa", toBase: 1, aliases: ["mpa"] },
  { unit: "kPa", toBase: 0.001, aliases: ["kpa"] },
];

export const FORCE_UNITS: readonly UnitSpec<ForceUnit>[] = [
  { unit: "N", toBase: 1, aliases: ["n"] },
  { unit: "kN", toBase: 1000, aliases: ["kn"] },
  { unit: "lbf", toBase: N_PER_LBF, aliases: ["lbf", "lb", "lbs"] },
  { unit: "kip", toBase: N_PER_KIP, aliases: ["kip", "kips"] },
];

/** What a bare number means when the crew types no unit. */
export const DEFAULT_UNITS: Record<UnitSystem, { length: LengthUnit; pressure: PressureUnit; force: ForceUnit }> = {
  US: { length: "in", pressure: "psi", force: "kip" },
  SI: { length: "mm", pressure: "MPa", force: "kN" },
};

export function findUnitByAlias<U extends string>(
  table: readonly UnitSpec<U>[],
  typed: string,
): UnitSpec<U> | undefined {
  const lower = typed.toLowerCase();
  return table.find((spec) => spec.aliases.includes(lower));
}

export function getUnit<U extends string>(table: readonly UnitSpec<U>[], unit: U): UnitSpec<U> {
  const spec = table.find((candidate) => candidate.unit === unit);
  if (!spec) throw new Error(`unit table has no entry for ${unit}`);
  return spec;
}
