/**
 * How the verdict's band, its prediction and the governing prediction are put in words. Plain
 * quantities are formatted by `lib/format/quantities.ts`, imported from there directly.
 */
// record-form.tsx (another branch's this round) still imports showPressure from here; move it to
// lib/format/quantities and delete this line.
export { showPressure } from "@/lib/format/quantities";
import { JACKING_LIMIT_FPU_FRACTION } from "@/lib/elongation";
import { formatLength, formatLengthInward, mmToIn, resolutionStepMm } from "@/lib/units";
import { readingResolution, showComputedLength, showPct, type DisplayUnits } from "@/lib/format/quantities";
import type { ComparisonBasis } from "@/lib/schemas/domain";
import type { JackingForceSource } from "./basis";
import type { GoverningWords } from "./judge";

/** Which edge of a band. */
export type BandEdge = "lower" | "upper";

/**
 * A band edge, shown at the precision of computed lengths but never rounded outward: the lower
 * edge is rounded up and the upper edge down, so a reading shown outside the printed band is
 * outside the band itself.
 */
export function showBandEdge(project: DisplayUnits, mm: number, edge: BandEdge): string {
  const round = edge === "lower" ? Math.ceil : Math.floor;
  // Ten-billionths absorb conversion noise, so an edge exactly on a step is not moved a step in.
  const step = (value: number, per: number) => round(value * per - (edge === "lower" ? 1e-9 : -1e-9)) / per;
  if (project.unitSystem === "si") return `${step(mm, 10).toFixed(1)} mm`;
  return `${step(mmToIn(mm), 100).toFixed(2)} in`;
}

/**
 * Which prediction governed the verdict, with the approved shop drawing's value and Tautline's side
 * by side on the same basis and their difference: the words the tablet, the flag page and the
 * e-mail all show.
 */
export function governsLine(
  project: DisplayUnits,
  j: {
    governs: GoverningWords;
    governsNote: string | null;
    shopDrawing: {
      mm: number;
      basis: ComparisonBasis;
      tautlineMm: number;
      differenceMm: number;
      differencePct: number;
    } | null;
  },
): string {
  const who = j.governs === "shop drawing" ? "The approved shop drawing governs" : "Tautline's prediction governs";
  const side = j.shopDrawing
    ? ` Shop drawing ${showComputedLength(project, j.shopDrawing.mm)}, Tautline ${showComputedLength(project, j.shopDrawing.tautlineMm)} ` +
      `(whole tendon, ${j.shopDrawing.basis === "net" ? "net of anchor set" : "gross at jacking"}): ` +
      `difference ${j.shopDrawing.differenceMm >= 0 ? "+" : "−"}${showComputedLength(project, Math.abs(j.shopDrawing.differenceMm))}, ${showPct(j.shopDrawing.differencePct)}.`
    : " The schedule gives no shop-drawing elongation.";
  return `${who}.${side}${j.governsNote ? ` ${j.governsNote}` : ""}`;
}

/**
 * The band on the tablet, the way the crew reads the tape. On an inch project each edge is the
 * nearest division inside the band (`formatLengthInward`), so a reading on the division is in band
 * exactly when it lies between the two fractions; the decimal band is added only when the
 * elongation judged is not a reading on the division (an initial-pressure correction, a draw-in),
 * where the fractions alone could not decide. Millimetre projects keep `showBandEdge`.
 */
export function showBandAsRead(
  project: DisplayUnits,
  band: { lowerMm: number; upperMm: number; measuredMm: number | null },
): { read: string; decimals: string | null } {
  const decimals = `${showBandEdge(project, band.lowerMm, "lower")} to ${showBandEdge(project, band.upperMm, "upper")}`;
  if (project.unitSystem === "si") return { read: decimals, decimals: null };
  const resolution = readingResolution(project.readingResolution);
  const read = `${formatLengthInward(band.lowerMm, resolution, "lower")} to ${formatLengthInward(band.upperMm, resolution, "upper")}`;
  const step = resolutionStepMm(resolution);
  const onDivision =
    band.measuredMm !== null && Math.abs(band.measuredMm / step - Math.round(band.measuredMm / step)) < 1e-6;
  return { read, decimals: onDivision ? null : decimals };
}

/** A prediction on the tablet: to the reading division on an inch project, as computed otherwise. */
export function showPredictedAsRead(project: DisplayUnits, mm: number): string {
  return project.unitSystem === "si"
    ? showComputedLength(project, mm)
    : formatLength(mm, readingResolution(project.readingResolution));
}

/** The division the second reading is taken to: half the project's (1/8 in → 1/16 in, 1 mm → 0.5 mm). */
export function finerDivision(project: Pick<DisplayUnits, "readingResolution">): string {
  return { "1/8in": "1/16 in", "1/16in": "1/32 in", "1mm": "0.5 mm" }[project.readingResolution];
}

/**
 * A record's second, finer reading in words, for the office screens and the report: the first
 * reading beside the re-read that was judged, or the crew's reason it could not be taken; null when
 * the tablet did not ask.
 */
export function rereadLine(
  project: DisplayUnits,
  r: { measuredMm: number; firstReadingMm?: number | null; rereadDeclinedReason?: string | null },
): string | null {
  // The first reading at the project's division; the re-read at 1/16 in where the scale has it.
  const fine = (mm: number) =>
    project.readingResolution === "1/8in" ? formatLength(mm, "1/16 in") : showComputedLength(project, mm);
  if (r.firstReadingMm)
    return `Read again to ${finerDivision(project)}: first ${formatLength(r.firstReadingMm, readingResolution(project.readingResolution))}, again ${fine(r.measuredMm)} (judged)`;
  if (r.rereadDeclinedReason) return `Not read again finer: ${r.rereadDeclinedReason}`;
  return null;
}

/**
 * Where the specified jacking force came from, in words: "from the schedule" when the tendon's row
 * gives it, else the project's factor of fpu·A ("0.80·fpu·A"). Null or absent on evaluations stored
 * before the schedule could give one: the project's factor.
 */
export function specifiedForceSourceWords(
  source: JackingForceSource | null | undefined,
  factor?: number | null,
): string {
  if (source === "schedule") return "from the schedule";
  return `${(factor ?? JACKING_LIMIT_FPU_FRACTION).toFixed(2)}·fpu·A`;
}
