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
