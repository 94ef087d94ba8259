import { z } from "zod";
import {
  degToRad,
  isInputError,
  M2_PER_FT2,
  MM2_PER_IN2,
  MM_PER_FOOT,
  MM_PER_INCH,
  MPA_PER_KSI,
  MPA_PER_PSI,
  N_PER_KIP,
  N_PER_LBF,
  wobblePerFtToPerM,
  parseForce,
  parseLength,
  parsePressure,
  type UnitSystem,
} from "@/lib/units";

/**
 * Form fields that hold what a person typed (in the project's units, or with a unit of their
 * own such as "6 mm" on a US job) and turn it into SI for the shared schemas.
 */
type Kind = "length" | "pressure" | "force" | "number";

function parse(kind: Kind, text: string, system: UnitSystem, unit: string | undefined): number {
  if (kind === "number") {
    const n = Number(text.replace(/,/g, ""));
    if (!Number.isFinite(n) || text.trim() === "") throw new Error("Type a number.");
    return n;
  }
  const options = { field: kind, system };
  if (kind === "length") return parseLength(text, { ...options, defaultUnit: unit as never });
  if (kind === "pressure") return parsePressure(text, { ...options, defaultUnit: unit as never });
  return parseForce(text, { ...options, defaultUnit: unit as never });
}

function field(kind: Kind, system: UnitSystem, unit: string | undefined, required: boolean) {
  return z.string().transform((text, ctx): number | null => {
    if (!text.trim()) {
      if (required) ctx.addIssue({ code: "custom", message: "Fill this in." });
      return null;
    }
    try {
      return parse(kind, text, system, unit);
    } catch (error) {
      ctx.addIssue({
        code: "custom",
        message: isInputError(error) ? error.message.replace(/^[^:]*: /, "") : "Type a number.",
      });
      return null;
    }
  });
}

export const units = {
  length: (system: UnitSystem, unit: string, required = true) => field("length", system, unit, required),
  pressure: (system: UnitSystem, unit: string, required = true) => field("pressure", system, unit, required),
  force: (system: UnitSystem, unit: string, required = true) => field("force", system, unit, required),
  number: (required = true) => field("number", "SI", undefined, required),
};

/** A stored SI value written back into a form field, in the given unit, without rounding to the reading division. */
export function shown(value: number | null | undefined, per: number, decimals = 4): string {
  if (value === null || value === undefined) return "";
  return String(Number((value / per).toFixed(decimals)));
}

/**
 * How many stored SI units one unit of a box is (mm, mm², MPa, N, wobble per m): a box's number
 * times PER[unit] is the stored value, and `shown(stored, PER[unit])` writes it back. Forms convert
 * through this table only, never with a factor of their own.
 */
export const PER = {
  in: MM_PER_INCH,
  mm: 1,
  ft: MM_PER_FOOT,
  m: 1000,
  psi: MPA_PER_PSI,
  MPa: 1,
  kip: N_PER_KIP,
  kN: 1000,
  lbf: N_PER_LBF,
  N: 1,
  in2: MM2_PER_IN2,
  mm2: 1,
  /** A pour's plan area is stored in m², not mm². */
  ft2: M2_PER_FT2,
  m2: 1,
  ksi: MPA_PER_KSI,
  /** A wobble coefficient per foot is this many per metre (1 ÷ 0.3048). */
  perFt: wobblePerFtToPerM(1),
  perM: 1,
  /** An angle typed in degrees is stored in radians. */
  deg: degToRad(1),
  rad: 1,
} as const;
