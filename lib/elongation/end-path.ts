import { createSetPiece, type EndSeating, fillSeating, solveSetPiece } from "./anchor-set";
import { meanFactorFromDecay, segmentBeta } from "./friction";
import type { TendonSegment } from "./types";

/**
 * One stressed end's friction path, from its anchor to the far end or to the meeting point.
 *
 * The engine evaluates whole pours, so a walk reads its inputs from and writes its results to
 * one reused record instead of taking arguments and returning a fresh object: in V8 every double
 * passed to a function that is not inlined, and every double stored in a new object, is a heap
 * allocation, and those were most of the engine's cost. The computation is synchronous, so a
 * caller sets the inputs, walks, and copies what it needs before the next walk.
 */
export interface EndWalk {
  // Inputs, the same for both ends of a tendon.
  segments: readonly TendonSegment[];
  wobblePerM: number;
  mu: number;
  jackingForceN: number;
  /** Δset·A·E in N·mm; 0 skips the set-zone search. */
  seatingAreaNmm: number;
  /** Σβ over the whole tendon (filled while the segments are checked). */
  totalBeta: number;
  // Where the paths of a two-end tendon meet (see findMeetingPoint).
  meetingSegment: number;
  /** Fraction of the meeting segment from its A side. */
  meetingFraction: number;
  // Results of the last walk.
  lengthMm: number;
  /** ∫P dx along the path at jacking force, N·mm (divide by A·E for elongation). */
  forceIntegralNmm: number;
  endForceN: number;
  /** Whether the area reached Δset·A·E on the path (false: the set reaches past its end). */
  setCrossed: boolean;
  setLengthMm: number;
  /** Jacking-line force at the end of the set zone, when crossed. */
  setForceN: number;
}

// Fields start as non-integers so V8 gives them a double representation from the first write.
export function createEndWalk(): EndWalk {
  return {
    segments: [],
    wobblePerM: 0.5,
    mu: 0.5,
    jackingForceN: 0.5,
    seatingAreaNmm: 0.5,
    totalBeta: 0.5,
    meetingSegment: 0,
    meetingFraction: 0.5,
    lengthMm: 0.5,
    forceIntegralNmm: 0.5,
    endForceN: 0.5,
    setCrossed: false,
    setLengthMm: 0.5,
    setForceN: 0.5,
  };
}

const setPiece = createSetPiece();
const NEGLIGIBLE_BETA = 1e-12;

/**
 * Where the friction paths from both ends meet when both are pulled to the same force: the
 * point where the exponent from A equals half the total, so e^-βA = e^-βB there. Written to
 * `walk.meetingSegment` and `walk.meetingFraction`.
 */
export function findMeetingPoint(walk: EndWalk, totalLengthMm: number): void {
  const { segments, wobblePerM, mu, totalBeta } = walk;
  const count = segments.length;
  // With no friction anywhere every point is a balance point; the middle keeps the split even.
  // "No friction" includes friction too small to change the force at double precision, whose
  // half would otherwise be lost to underflow.
  const byLength = !(totalBeta > NEGLIGIBLE_BETA);
  const target = byLength ? totalLengthMm / 2 : totalBeta / 2;
  let reached = 0;
  for (let i = 0; i < count; i++) {
    const segment = segments[i]!;
    const step = byLength ? segment.lengthMm : segmentBeta(segment.lengthMm, segment.angleRad, wobblePerM, mu);
    if (reached + step >= target) {
      walk.meetingSegment = i;
      walk.meetingFraction = step > 0 ? Math.min(1, Math.max(0, (target - reached) / step)) : 0;
      return;
    }
    reached += step;
  }
  walk.meetingSegment = count - 1;
  walk.meetingFraction = 1;
}

/**
 * Walks the segments once from one end, summing the exact segment integrals and watching the
 * anchor-set area g(X) = 2·(∫P dx − X·P(X)) at each piece end. The loop only notes the piece where
 * the area passes Δset·A·E; the solve inside that piece runs after the loop, which keeps the
 * per-segment loop free of calls. `toMeeting`: stop at the meeting point instead of the far end.
 */
export function walkEndPath(walk: EndWalk, fromB: boolean, toMeeting: boolean): void {
  const { segments, wobblePerM, mu, jackingForceN, seatingAreaNmm } = walk;
  const lastSegment = toMeeting ? walk.meetingSegment : fromB ? 0 : segments.length - 1;
  const lastFraction = !toMeeting ? 1 : fromB ? 1 - walk.meetingFraction : walk.meetingFraction;
  const direction = fromB ? -1 : 1;
  let index = fromB ? segments.length - 1 : 0;
  let startMm = 0;
  let integral = 0;
  let force = jackingForceN;
  let seekingSet = seatingAreaNmm > 0;
  let setFound = false;

  for (;;) {
    const segment = segments[index]!;
    const fraction = index === lastSegment ? lastFraction : 1;
    const length = segment.lengthMm * fraction;
    if (length > 0) {
      const beta = segmentBeta(segment.lengthMm, segment.angleRad, wobblePerM, mu) * fraction;
      const decay = Math.exp(-beta);
      const pieceIntegral = force * length * meanFactorFromDecay(beta, decay);
      const endForce = force * decay;
      // The area only grows where there is friction; on a frictionless piece a "crossing" could
      // only be rounding noise meeting a vanishingly small set.
      if (seekingSet && beta > 0 && 2 * (integral + pieceIntegral - (startMm + length) * endForce) >= seatingAreaNmm) {
        setPiece.startMm = startMm;
        setPiece.lengthMm = length;
        setPiece.startForceN = force;
        setPiece.integralBeforeNmm = integral;
        setPiece.decayPerMm = beta / length;
        seekingSet = false;
        setFound = true;
      }
      startMm += length;
      integral += pieceIntegral;
      force = endForce;
    }
    if (index === lastSegment) break;
    index += direction;
  }

  walk.lengthMm = startMm;
  walk.forceIntegralNmm = integral;
  walk.endForceN = force;
  // A zero set leaves the force untouched: a zone of zero length, ending at the jacking force.
  walk.setCrossed = setFound || seatingAreaNmm <= 0;
  walk.setLengthMm = 0;
  walk.setForceN = jackingForceN;
  if (setFound) {
    setPiece.targetNmm = seatingAreaNmm;
    solveSetPiece(setPiece);
    walk.setLengthMm = setPiece.startMm + setPiece.distanceMm;
    walk.setForceN = setPiece.forceN;
  }
}

/** Seating at the end just walked, by the mirror rule (see anchor-set.ts), written into `out`. */
export function seatingOfWalk(walk: EndWalk, out: EndSeating): EndSeating {
  if (walk.setCrossed) {
    return fillSeating(out, walk.jackingForceN, walk.endForceN, walk.setForceN, walk.setLengthMm, false);
  }
  // Short tendon (or short half): the whole path is in the zone; the mirror level comes from the
  // area condition over the full path.
  const mirror = (walk.forceIntegralNmm - walk.seatingAreaNmm / 2) / walk.lengthMm;
  return fillSeating(out, walk.jackingForceN, walk.endForceN, mirror, walk.lengthMm, true);
}
