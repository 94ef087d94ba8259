import type { EndSeating } from "./anchor-set";

/**
 * The tendon's own closed sets of words, written once here: the computation imports nothing of the
 * app, and `lib/schemas/domain.ts` takes these lists for the domain (schemas, database types).
 */

/** One end of a tendon. */
export const TENDON_ENDS = ["A", "B"] as const;
export type TendonEnd = (typeof TENDON_ENDS)[number];

/** The end(s) a tendon is stressed from: one end, or both. */
export const STRESSED_ENDS = [...TENDON_ENDS, "both"] as const;
export type StressedEnds = (typeof STRESSED_ENDS)[number];

/** What comparing a measured elongation with its band finds (the domain adds "incomplete"). */
export const COMPARISON_VERDICTS = ["in band", "long", "short"] as const;
export type Verdict = (typeof COMPARISON_VERDICTS)[number];

export interface TendonSegment {
  lengthMm: number;
  /** Absolute angle change over the segment (plan plus elevation), radians. */
  angleRad: number;
}

/** SI base units throughout: N, mm, mm², MPa, wobble K per metre. */
export interface TendonInput {
  /** From end A to end B. */
  segments: readonly TendonSegment[];
  /** One strand. */
  strandAreaMm2: number;
  strandCount: number;
  modulusMPa: number;
  /** Whole tendon. */
  jackingForceN: number;
  wobblePerM: number;
  mu: number;
  /** At each stressed end. */
  anchorSetMm?: number;
  /** Strand inside the jack, added at each stressed end when given. */
  jackGripMm?: number;
  ends: StressedEnds;
}

/** Seating at one stressed end, tagged with the end. */
export interface StressedEndSeating extends EndSeating {
  end: TendonEnd;
}

/**
 * Seating at the governing stressed end (the one with the higher force left at its anchor, which
 * is what the 0.70·fpu check looks at; the stressed end itself when one end is stressed), with the
 * other end beside it when both are stressed.
 */
export interface SeatingResult extends StressedEndSeating {
  /** The end that does not govern, when both ends are stressed. */
  otherEnd: StressedEndSeating | null;
  /** Mean force after seating: (∫P dx − Δset·A·E per stressed end)/L. */
  averageForceAfterN: number;
}

export interface ElongationPrediction {
  /** Whole tendon at jacking force (sum of ends when "both"), including strand in the jack. */
  grossMm: number;
  /** Gross minus the anchor set at each stressed end. */
  netMm: number;
  perEndMm: { A?: number; B?: number };
  /** Lowest force along the tendon at jacking (the meeting point when "both"). */
  farEndForceN: number;
  /** Mean force along the tendon at jacking. */
  averageForceN: number;
  seating: SeatingResult | null;
  lengthMm: number;
  /** Distance from end A where the two friction paths meet; null for one-end stressing. */
  meetingPointMm: number | null;
  /** Total steel area times modulus, N. */
  axialStiffnessN: number;
}
