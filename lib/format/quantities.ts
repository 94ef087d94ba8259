import type { StoredResolution } from "@/lib/schemas/domain";
import {
  DEFAULT_UNITS,
  formatForce,
  formatLength,
  formatPressure,
  InputError,
  MM_PER_FOOT,
  MM_PER_INCH,
  MM2_PER_IN2,
  MPA_PER_KSI,
  MPA_PER_PSI,
  wobblePerMToPerFt,
  type ReadingResolution,
} from "@/lib/units";

/**
 * The one place that turns a stored SI value into the text a screen, an e-mail or a report shows,
 * in the project's units and at the precision the trade writes it: readings to the reading
 * division (fractions of an inch where the crew reads fractions), computed lengths one step finer,
 * forces and gauge pressures as gauges and sheets print them, strand areas, moduli and concrete
 * strengths as mill certificates and drawings print them. Pure: no React, no database.
 */

export type { StoredResolution };

export interface DisplayUnits {
  unitSystem: "us" | "si";
  readingResolution: StoredResolution;
}

const RESOLUTIONS: Record<StoredResolution, ReadingResolution> = {
  "1/8in": "1/8 in",
  "1/16in": "1/16 in",
  "1mm": "1 mm",
};

export function readingResolution(stored: StoredResolution): ReadingResolution {
  return RESOLUTIONS[stored];
}

export function unitsOf(project: Pick<DisplayUnits, "unitSystem">) {
  return DEFAULT_UNITS[project.unitSystem === "us" ? "US" : "SI"];
}

function finite(value: number, field: string): number {
  if (!Number.isFinite(value)) throw new InputError(field, "not-finite", `cannot format ${String(value)}`);
  return value;
}

/** Fixed decimals with thousands separators ("28,500", "98.7"); never "-0". */
export function groupedNumber(value: number, decimals: number): string {
  const rounded = Number(value.toFixed(decimals));
  return (rounded === 0 ? 0 : rounded).toLocaleString("en-US", {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  });
}

/** A length as read on the tape or ram scale: "8 3/8 in", "212 mm". */
export function showLength(project: DisplayUnits, mm: number): string {
  return formatLength(mm, readingResolution(project.readingResolution));
}

/** A computed length (prediction, band, anchor set): one finer step than a reading. */
export function showComputedLength(project: Pick<DisplayUnits, "unitSystem">, mm: number): string {
  finite(mm, "length");
  if (project.unitSystem === "si")
    return Math.abs(mm) >= 10_000 ? `${groupedNumber(mm / 1000, 2)} m` : `${groupedNumber(mm, 1)} mm`;
  const inches = mm / MM_PER_INCH;
  return Math.abs(inches) >= 120 ? `${groupedNumber(mm / MM_PER_FOOT, 2)} ft` : `${groupedNumber(inches, 2)} in`;
}

/** A tendon's or a segment's length: "90.0 ft", "27.43 m". */
export function showLongLength(project: Pick<DisplayUnits, "unitSystem">, mm: number): string {
  finite(mm, "length");
  return project.unitSystem === "us" ? `${groupedNumber(mm / MM_PER_FOOT, 1)} ft` : `${groupedNumber(mm / 1000, 2)} m`;
}

/** A force: "33.05 kip", "147.0 kN". */
export function showForce(project: Pick<DisplayUnits, "unitSystem">, n: number): string {
  return formatForce(n, { unit: unitsOf(project).force });
}

/** A gauge pressure: "4227 psi", "29.14 MPa". */
export function showPressure(project: Pick<DisplayUnits, "unitSystem">, mpa: number): string {
  return formatPressure(mpa, { unit: unitsOf(project).pressure });
}

/** A strand's cross-section as mill certificates give it: "0.153 in²", "98.7 mm²". */
export function showArea(project: Pick<DisplayUnits, "unitSystem">, mm2: number): string {
  finite(mm2, "area");
  return project.unitSystem === "us" ? `${groupedNumber(mm2 / MM2_PER_IN2, 3)} in²` : `${groupedNumber(mm2, 1)} mm²`;
}

/** A modulus of elasticity: "28,500 ksi", "196.5 GPa". */
export function showModulus(project: Pick<DisplayUnits, "unitSystem">, mpa: number): string {
  finite(mpa, "modulus");
  return project.unitSystem === "us"
    ? `${groupedNumber(mpa / MPA_PER_KSI, 0)} ksi`
    : `${groupedNumber(mpa / 1000, 1)} GPa`;
}

/** A concrete compressive strength: "4,000 psi", "30.0 MPa". */
export function showStrength(project: Pick<DisplayUnits, "unitSystem">, mpa: number): string {
  finite(mpa, "strength");
  return project.unitSystem === "us" ? `${groupedNumber(mpa / MPA_PER_PSI, 0)} psi` : `${groupedNumber(mpa, 1)} MPa`;
}

/** A steel stress (fpu, jacking stress): "270.0 ksi", "1,860 MPa". */
export function showSteelStress(project: Pick<DisplayUnits, "unitSystem">, mpa: number): string {
  finite(mpa, "stress");
  return project.unitSystem === "us" ? `${groupedNumber(mpa / MPA_PER_KSI, 1)} ksi` : `${groupedNumber(mpa, 0)} MPa`;
}

/** The wobble coefficient in the convention of the project's units: "0.0010 per ft", "0.0033 per m". */
export function showWobble(project: Pick<DisplayUnits, "unitSystem">, perM: number): string {
  finite(perM, "wobble");
  return project.unitSystem === "us" ? `${wobblePerMToPerFt(perM).toFixed(4)} per ft` : `${perM.toFixed(4)} per m`;
}

/** A signed percentage with a true minus: "+4.5 %", "−12.0 %". */
export function showPct(pct: number): string {
  finite(pct, "percent");
  const rounded = Number(Math.abs(pct).toFixed(1));
  const sign = rounded === 0 ? "" : pct >= 0 ? "+" : "−";
  return `${sign}${rounded.toFixed(1)} %`;
}
