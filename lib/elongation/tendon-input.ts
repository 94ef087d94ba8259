import { InputError, requireNonNegative, requirePositive } from "./errors";
import { segmentBeta } from "./friction";
import { STRESSED_ENDS, type StressedEnds, type TendonSegment } from "./types";

export function checkEnds(ends: unknown): StressedEnds {
  if (STRESSED_ENDS.includes(ends as StressedEnds)) return ends as StressedEnds;
  throw new InputError("ends", "not-allowed", `must be one of ${STRESSED_ENDS.join(", ")}, got ${String(ends)}`);
}

/**
 * Validates every segment and returns the tendon length in mm. With `totals`, also writes the
 * total exponent Σβ there (two-end stressing needs it to find the meeting point).
 */
export function checkSegments(
  segments: unknown,
  wobblePerM: number,
  mu: number,
  totals: { totalBeta: number } | null,
): number {
  if (!Array.isArray(segments) || segments.length === 0) {
    throw new InputError("segments", "required", "a tendon needs at least one segment");
  }
  let lengthMm = 0;
  let totalBeta = 0;
  for (let i = 0; i < segments.length; i++) {
    const segment = segments[i] as TendonSegment | undefined | null;
    // Field names are built only on failure; building them for every segment was most of the cost.
    if (!isGoodSegment(segment)) reportBadSegment(segment, i);
    lengthMm += segment.lengthMm;
    if (totals) totalBeta += segmentBeta(segment.lengthMm, segment.angleRad, wobblePerM, mu);
  }
  if (totals) totals.totalBeta = totalBeta;
  return lengthMm;
}

function isGoodSegment(segment: TendonSegment | undefined | null): segment is TendonSegment {
  if (segment === null || typeof segment !== "object") return false;
  const { lengthMm, angleRad } = segment;
  // Comparisons are false for NaN and for non-numbers, so this also rejects those.
  return (
    typeof lengthMm === "number" &&
    lengthMm > 0 &&
    lengthMm < Infinity &&
    typeof angleRad === "number" &&
    angleRad >= 0 &&
    angleRad < Infinity
  );
}

function reportBadSegment(segment: TendonSegment | undefined | null, i: number): never {
  if (segment === null || typeof segment !== "object") {
    throw new InputError(`segments[${i}]`, "required", "segment is missing");
  }
  requirePositive(segment.lengthMm, `segments[${i}].lengthMm`);
  // Angle changes add up regardless of direction; a negative one is a sign slip in the input.
  requireNonNegative(segment.angleRad, `segments[${i}].angleRad`);
  throw new InputError(`segments[${i}]`, "not-a-number", "segment values are not usable numbers");
}
