import { mirrorLevelN } from "./anchor-set";
import { InputError } from "./errors";
import { segmentBeta } from "./friction";
import { predictElongation } from "./predict";
import type { TendonEnd, TendonInput } from "./types";

export interface ForceProfilePoint {
  /** Distance from end A. */
  xMm: number;
  jackingN: number;
  /** Equal to `jackingN` outside the set zones, or everywhere when no anchor set is given. */
  afterSeatingN: number;
}

export interface ForceProfile {
  points: ForceProfilePoint[];
  lengthMm: number;
  meetingPointMm: number | null;
}

/**
 * Force along the tendon at jacking and after seating, for drawing. Points fall on every segment
 * end, on the meeting point and on each set-zone end (where the lines kink), plus evenly spaced
 * samples inside each segment so the exponential curves draw smoothly. Uses the same seating
 * figures as predictElongation (mirror rule about each end's mirror level).
 */
export function forceProfile(input: TendonInput, options: { samplesPerSegment?: number } = {}): ForceProfile {
  const samples = options.samplesPerSegment ?? 8;
  if (!Number.isInteger(samples) || samples < 1 || samples > 1000) {
    throw new InputError("samplesPerSegment", "out-of-range", "must be a whole number from 1 to 1000");
  }
  const prediction = predictElongation(input); // validates the input
  const { segments, wobblePerM, mu, jackingForceN, ends } = input;
  const { lengthMm, meetingPointMm } = prediction;
  const { seating } = prediction;
  const seatingAt = (end: TendonEnd) =>
    seating === null ? undefined : seating.end === end ? seating : (seating.otherEnd ?? undefined);
  const seatingA = seatingAt("A");
  const seatingB = seatingAt("B");

  // Running length and exponent from end A at each segment start.
  const startsMm: number[] = [0];
  const startsBeta: number[] = [0];
  segments.forEach((segment, i) => {
    startsMm.push(startsMm[i]! + segment.lengthMm);
    startsBeta.push(startsBeta[i]! + segmentBeta(segment.lengthMm, segment.angleRad, wobblePerM, mu));
  });
  const totalBeta = startsBeta[segments.length]!;

  const betaFromA = (xMm: number): number => {
    let i = 0;
    while (i < segments.length - 1 && xMm > startsMm[i + 1]!) i++;
    const fraction = Math.min(1, Math.max(0, (xMm - startsMm[i]!) / segments[i]!.lengthMm));
    return startsBeta[i]! + fraction * (startsBeta[i + 1]! - startsBeta[i]!);
  };

  const jackingAt = (xMm: number): number => {
    const fromA = betaFromA(xMm);
    const fromB = totalBeta - fromA;
    if (ends === "A") return jackingForceN * Math.exp(-fromA);
    if (ends === "B") return jackingForceN * Math.exp(-fromB);
    return jackingForceN * Math.exp(-Math.min(fromA, fromB));
  };

  const seatedAt = (xMm: number, jacking: number): number => {
    const onA = ends === "A" || (ends === "both" && xMm <= (meetingPointMm ?? 0));
    const endSeating = onA ? seatingA : seatingB;
    if (!endSeating) return jacking;
    const distance = onA ? xMm : lengthMm - xMm;
    if (distance > endSeating.influenceMm) return jacking;
    return Math.min(jacking, 2 * mirrorLevelN(jackingForceN, endSeating) - jacking);
  };

  const xs: number[] = [];
  segments.forEach((_, i) => {
    for (let k = 0; k < samples; k++) xs.push(startsMm[i]! + ((startsMm[i + 1]! - startsMm[i]!) * k) / samples);
  });
  xs.push(lengthMm);
  if (meetingPointMm !== null) xs.push(meetingPointMm);
  if (seatingA) xs.push(Math.min(lengthMm, seatingA.influenceMm));
  if (seatingB) xs.push(Math.max(0, lengthMm - seatingB.influenceMm));

  const sorted = [...new Set(xs)].sort((a, b) => a - b);
  const points = sorted.map((xMm) => {
    const jackingN = jackingAt(xMm);
    return { xMm, jackingN, afterSeatingN: seatedAt(xMm, jackingN) };
  });
  return { points, lengthMm, meetingPointMm };
}
