/**
 * Shows SI values in a project's display units. The formatting itself lives in
 * `lib/format/quantities.ts`; this module keeps the names the screens already import.
 */
export {
  readingResolution,
  showComputedLength,
  showForce,
  showLength,
  showPct,
  showPressure,
  unitsOf,
  type DisplayUnits,
  type StoredResolution,
} from "@/lib/format/quantities";
import { mmToIn } from "@/lib/units";
import type { DisplayUnits } from "@/lib/format/quantities";

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
  return `${step(mmToIn(mm), 100).toFixed(2)} in`;
}
