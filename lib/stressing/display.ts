import { DEFAULT_UNITS, formatForce, formatLength, formatPressure, type ReadingResolution } from "@/lib/units";

/**
 * Shows SI values in a project's display units. The database stores the reading resolution
 * as "1/8in" | "1/16in" | "1mm" and the unit system as "us" | "si".
 */

export type StoredResolution = "1/8in" | "1/16in" | "1mm";

const RESOLUTIONS: Record<StoredResolution, ReadingResolution> = {
  "1/8in": "1/8 in",
  "1/16in": "1/16 in",
  "1mm": "1 mm",
};

export function readingResolution(stored: StoredResolution): ReadingResolution {
  return RESOLUTIONS[stored];
}

export interface DisplayUnits {
  unitSystem: "us" | "si";
  readingResolution: StoredResolution;
}

export function unitsOf(project: DisplayUnits) {
  return DEFAULT_UNITS[project.unitSystem === "us" ? "US" : "SI"];
}

export function showLength(project: DisplayUnits, mm: number): string {
  return formatLength(mm, readingResolution(project.readingResolution));
}

/** Lengths that are computed, not read (predictions, bands): one finer step than a reading. */
export function showComputedLength(project: DisplayUnits, mm: number): string {
  if (project.unitSystem === "si") return Math.abs(mm) >= 10_000 ? `${(mm / 1000).toFixed(2)} m` : `${mm.toFixed(1)} mm`;
  const inches = mm / 25.4;
  return Math.abs(inches) >= 120 ? `${(inches / 12).toFixed(2)} ft` : `${inches.toFixed(2)} in`;
}

export function showForce(project: DisplayUnits, n: number): string {
  return formatForce(n, { unit: unitsOf(project).force });
}

export function showPressure(project: DisplayUnits, mpa: number): string {
  return formatPressure(mpa, { unit: unitsOf(project).pressure });
}

export function showPct(pct: number): string {
  return `${pct >= 0 ? "+" : "−"}${Math.abs(pct).toFixed(1)} %`;
}

/**
 * A band edge, shown at the precision of computed lengths but never rounded outward: the lower
 * edge is rounded up and the upper edge down, so a reading shown outside the printed band is
 * outside the band itself.
 */
export function showBandEdge(project: DisplayUnits, mm: number, edge: "lower" | "upper"): string {
  const round = edge === "lower" ? Math.ceil : Math.floor;
  // Ten-billionths absorb conversion noise, so an edge exactly on a step is not moved a step in.
  const step = (value: number, per: number) => round(value * per - (edge === "lower" ? 1e-9 : -1e-9)) / per;
  if (project.unitSystem === "si") return `${step(mm, 10).toFixed(1)} mm`;
  return `${step(mm / 25.4, 100).toFixed(2)} in`;
}
