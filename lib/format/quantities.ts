import type { StoredResolution } from "@/lib/schemas/domain";
import {
  DEFAULT_UNITS,
  FORCE_UNITS,
  formatForce,
  formatLength,
  formatPressure,
  getUnit,
  InputError,
  LENGTH_UNITS,
  MM_PER_FOOT,
  MM_PER_INCH,
  MM2_PER_IN2,
  MPA_PER_KSI,
  MPA_PER_PSI,
  PRESSURE_UNITS,
  m2ToFt2,
  radToDeg,
  wobblePerMToPerFt,
  type ReadingResolution,
  type UnitSpec,
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

/** A slab's or a pour's plan area, to the whole unit: "15,930 ft²", "1,480 m²". */
export function showPlanArea(project: Pick<DisplayUnits, "unitSystem">, m2: number): string {
  finite(m2, "plan area");
  return project.unitSystem === "us" ? `${groupedNumber(m2ToFt2(m2), 0)} ft²` : `${groupedNumber(m2, 0)} m²`;
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

/**
 * The wobble coefficient in the convention of the project's units: "0.0010 per ft", "0.0033 per m";
 * a calculation sheet asks for more decimals.
 */
export function showWobble(project: Pick<DisplayUnits, "unitSystem">, perM: number, decimals = 4): string {
  finite(perM, "wobble");
  return project.unitSystem === "us"
    ? `${wobblePerMToPerFt(perM).toFixed(decimals)} per ft`
    : `${perM.toFixed(decimals)} per m`;
}

/** A band either side of zero, as the project setting is written: "±7 %", "±7.5 %". */
export function showBandPct(pct: number): string {
  return `±${Number(Math.abs(finite(pct, "band")).toFixed(1))} %`;
}

/** An angle change of a tendon's profile, in radians as the friction formula takes it and in degrees: "0.7854 rad (45.00°)". */
export function showAngle(rad: number): string {
  finite(rad, "angle");
  return `${groupedNumber(rad, 4)} rad (${groupedNumber(radToDeg(rad), 2)}°)`;
}

/** A calibration line's slope, force per unit of gauge pressure: "0.01550 kip/psi", "10.0000 kN/MPa". */
export function showForcePerPressure(project: Pick<DisplayUnits, "unitSystem">, nPerMPa: number): string {
  const perShownPressure = finite(nPerMPa, "slope") * fromDisplayUnit(project, "pressure", 1);
  const value = inDisplayUnit(project, "force", perShownPressure);
  return `${groupedNumber(value, project.unitSystem === "us" ? 5 : 4)} ${displayUnit(project, "force")}/${displayUnit(project, "pressure")}`;
}

/** A quantity a chart draws or a line states in the project's unit rather than as text. */
export type DisplayQuantity = "length" | "force" | "pressure";

const TABLES = { length: LENGTH_UNITS, force: FORCE_UNITS, pressure: PRESSURE_UNITS } as const;

function unitSpec(project: Pick<DisplayUnits, "unitSystem">, quantity: DisplayQuantity) {
  const table: readonly UnitSpec<string>[] = TABLES[quantity];
  return getUnit(table, unitsOf(project)[quantity]);
}

/** The unit a quantity is shown in on this project: "in" or "mm", "kip" or "kN", "psi" or "MPa". */
export function displayUnit(project: Pick<DisplayUnits, "unitSystem">, quantity: DisplayQuantity): string {
  return unitSpec(project, quantity).unit;
}

/** A stored SI value (mm, N, MPa) as a number in the project's unit, for a chart's axis. */
export function inDisplayUnit(
  project: Pick<DisplayUnits, "unitSystem">,
  quantity: DisplayQuantity,
  si: number,
): number {
  return finite(si, quantity) / unitSpec(project, quantity).toBase;
}

/** A number in the project's unit (a chart's tick) back to SI (mm, N, MPa). */
export function fromDisplayUnit(
  project: Pick<DisplayUnits, "unitSystem">,
  quantity: DisplayQuantity,
  shown: number,
): number {
  return finite(shown, quantity) * unitSpec(project, quantity).toBase;
}

/** A plain number of a chart's axis or a fit (r², a ratio) at the given decimals: "0.9987", "1.042". */
export function showNumber(value: number, decimals: number): string {
  return groupedNumber(finite(value, "number"), decimals);
}

/** A difference of two percentages, in points: "2.4 pts". */
export function showPctPoints(points: number): string {
  return `${groupedNumber(finite(points, "percentage points"), 1)} pts`;
}

/** A share (0 to 1) as a whole percentage: "35 %"; nothing to share shows as a dash. */
export function showShare(share: number | null): string {
  return share === null ? "—" : `${groupedNumber(finite(share, "share") * 100, 0)} %`;
}

/** A signed percentage with a true minus: "+4.5 %", "−12.0 %". */
export function showPct(pct: number): string {
  finite(pct, "percent");
  const rounded = Number(Math.abs(pct).toFixed(1));
  const sign = rounded === 0 ? "" : pct >= 0 ? "+" : "−";
  return `${sign}${rounded.toFixed(1)} %`;
}

/** A gauge pressure as the crew typed it, its unit added when they typed a bare number. */
export function typedPressure(entered: { pressure: string; unit: string }): string {
  return `${entered.pressure}${/[a-z]/i.test(entered.pressure) ? "" : ` ${entered.unit}`}`;
}

/**
 * A gauge pressure as typed, with the project's own reading beside it in brackets only when the two
 * read differently (a bare MPa on a psi job); `mpa` null when the server has not read it yet.
 */
export function pressureAsTyped(
  project: Pick<DisplayUnits, "unitSystem">,
  entered: { pressure: string; unit: string },
  mpa: number | null,
): string {
  const typed = typedPressure(entered);
  const shown = mpa !== null ? showPressure(project, mpa) : null;
  return shown && shown.replaceAll(",", "") !== typed.replaceAll(",", "") ? `${typed} (${shown})` : typed;
}
