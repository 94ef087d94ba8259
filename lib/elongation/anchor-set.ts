/**
 * Anchor set (wedge seating). When the jack lets go the strand draws in by Δset before the
 * wedges bite; friction then acts the other way, so the force near the anchor drops and the
 * drop fades out at the influence length Lset.
 *
 * Method (the usual mirror-image rule): inside the set zone the after-seating force line is the
 * jacking force line reflected about a horizontal level, P_after(x) = 2·P_mirror − P(x), i.e. the
 * reverse friction per unit length is taken equal to the forward friction at the same point. The
 * zone ends where the area between the two lines equals Δset·A·E (the draw-in expressed as
 * strain integrated along the strand). With a constant slope p this gives the familiar
 * Lset = √(Δset·A·E/p) and a loss of 2·p·Lset at the anchor.
 *
 * Where p varies along the tendon we walk the friction path piece by piece, keeping the running
 * area g(X) = 2·(∫₀ˣ P dx − X·P(X)), which only grows with X. The piece where g passes Δset·A·E
 * holds Lset; inside it we solve exactly (a quadratic on a straight-line piece, safeguarded
 * Newton on an exponential one). If g never reaches Δset·A·E the set reaches past the far end
 * (short tendon): the whole path is in the zone and the mirror level follows from the same area
 * condition over the full length, P_mirror = (∫₀ᴸ P dx − Δset·A·E/2)/L. For a constant slope this
 * is ΔP0 = Δset·A·E/L + p·L at the anchor, and it joins the long-tendon case at Lset = L.
 */
import { InputError, requireFinite, requireNonNegative, requirePositive } from "./errors";
import { meanFactorFromDecay } from "./friction";

/**
 * Seating at one stressed end. Inside the zone the after-seating force is 2·M − P(x), with the
 * mirror level M = (jacking force + anchorForceAfterN)/2, the force at Lset when not short
 * (see mirrorLevelN).
 */
export interface EndSeating {
  /** Length from the anchor over which seating lowers the force; the whole path when `shortTendon`. */
  influenceMm: number;
  lossAtAnchorN: number;
  anchorForceAfterN: number;
  /** Force after seating at the far end of this end's path (dead end, or meeting point). */
  farForceAfterN: number;
  /** The set reaches past the far end of the path (for both ends: past the meeting point). */
  shortTendon: boolean;
}

/** Lset = √(Δset·A·E/p) for a constant friction loss p (N per mm). */
export function influenceLengthMm(anchorSetMm: number, axialStiffnessN: number, frictionSlopeNPerMm: number): number {
  requireNonNegative(anchorSetMm, "anchorSetMm");
  requirePositive(axialStiffnessN, "axialStiffnessN");
  requirePositive(frictionSlopeNPerMm, "frictionSlopeNPerMm");
  return Math.sqrt((anchorSetMm * axialStiffnessN) / frictionSlopeNPerMm);
}

/** The level the after-seating line mirrors the jacking line about inside the set zone. */
export function mirrorLevelN(jackingForceN: number, seating: Pick<EndSeating, "anchorForceAfterN">): number {
  return (jackingForceN + seating.anchorForceAfterN) / 2;
}

export function createSeating(): EndSeating {
  return {
    influenceMm: 0.5,
    lossAtAnchorN: 0.5,
    anchorForceAfterN: 0.5,
    farForceAfterN: 0.5,
    shortTendon: false,
  };
}

/**
 * Seating figures from the mirror level, shared by every path shape; written into `out` so the
 * engine can reuse one record per end while a pour is evaluated.
 */
export function fillSeating(
  out: EndSeating,
  jackingForceN: number,
  farForceBeforeN: number,
  mirrorForceN: number,
  influenceMm: number,
  shortTendon: boolean,
): EndSeating {
  // Seating only ever lowers the force; the clamps keep rounding in the short-tendon mirror
  // level (a division by L) from putting a force an ulp above the jacking line.
  const anchorForceAfterN = Math.min(jackingForceN, 2 * mirrorForceN - jackingForceN);
  if (!(anchorForceAfterN > 0)) {
    throw new InputError(
      "anchorSetMm",
      "out-of-range",
      "this anchor set would release the whole jacking force at the anchor; check the set, the length and the force",
    );
  }
  out.influenceMm = influenceMm;
  out.lossAtAnchorN = jackingForceN - anchorForceAfterN;
  out.anchorForceAfterN = anchorForceAfterN;
  out.farForceAfterN = shortTendon ? Math.min(farForceBeforeN, 2 * mirrorForceN - farForceBeforeN) : farForceBeforeN;
  out.shortTendon = shortTendon;
  return out;
}

/**
 * Distance s into a straight-line piece where the running area reaches the target:
 * s² + 2·X·s = (target − g)/p, written in the form that stays accurate when X ≫ s.
 */
function linearPieceCrossing(startMm: number, areaShortfall: number, slopeNPerMm: number): number {
  const q = areaShortfall / slopeNPerMm;
  return q / (startMm + Math.sqrt(startMm * startMm + q));
}

export interface ForcePoint {
  xMm: number;
  forceN: number;
}

/**
 * Seating on a force line given as points from the stressed anchor (x from 0 at the anchor),
 * straight between points — e.g. a constant-slope line from a published example, or a
 * supplier's friction diagram. Forces must not rise away from the anchor.
 */
export function seatPolyline(input: {
  points: readonly ForcePoint[];
  anchorSetMm: number;
  axialStiffnessN: number;
}): EndSeating {
  const { points } = input;
  if (!Array.isArray(points) || points.length < 2) {
    throw new InputError("points", "too-few", "need at least two points of the force line");
  }
  const target =
    requireNonNegative(input.anchorSetMm, "anchorSetMm") * requirePositive(input.axialStiffnessN, "axialStiffnessN");
  const first = points[0]!;
  const originMm = requireFinite(first.xMm, "points[0].xMm");
  const jackingForceN = requirePositive(first.forceN, "points[0].forceN");

  let area = 0; // running g(X)
  let integral = 0;
  let startMm = 0;
  let startForce = jackingForceN;
  for (let j = 1; j < points.length; j++) {
    const point = points[j]!;
    const endMm = requireFinite(point.xMm, `points[${j}].xMm`) - originMm;
    const endForce = requirePositive(point.forceN, `points[${j}].forceN`);
    const length = endMm - startMm;
    if (!(length > 0)) throw new InputError(`points[${j}].xMm`, "out-of-range", "points must go away from the anchor");
    if (endForce > startForce) {
      throw new InputError(`points[${j}].forceN`, "out-of-range", "force must not rise away from the stressed anchor");
    }
    const nextIntegral = integral + ((startForce + endForce) / 2) * length;
    const nextArea = 2 * (nextIntegral - endMm * endForce);
    // A flat piece adds no area, so only rounding could make it look like the crossing.
    if (nextArea >= target && (target <= area || endForce < startForce)) {
      const slope = (startForce - endForce) / length;
      const s = target <= area ? 0 : linearPieceCrossing(startMm, target - area, slope);
      return fillSeating(
        createSeating(),
        jackingForceN,
        points[points.length - 1]!.forceN,
        startForce - slope * s,
        startMm + s,
        false,
      );
    }
    area = nextArea;
    integral = nextIntegral;
    startMm = endMm;
    startForce = endForce;
  }
  return fillSeating(createSeating(), jackingForceN, startForce, (integral - target / 2) / startMm, startMm, true);
}

// One nanometre: far below any reading, and reached in one or two Newton steps in practice.
const SOLVE_TOLERANCE_MM = 1e-6;
const NEWTON_MAX_STEPS = 60;

/**
 * The piece of a friction path that holds the end of the set zone: the walk fills the inputs and
 * reads back the outputs. A record rather than arguments because doubles passed to a function
 * that V8 does not inline are boxed one by one, and this runs once per stressed end.
 */
export interface SetPiece {
  startMm: number;
  lengthMm: number;
  startForceN: number;
  /** ∫P dx from the anchor to the piece start. */
  integralBeforeNmm: number;
  /** k: the piece's exponent per mm, so that P = startForceN·e^-k·s inside it. */
  decayPerMm: number;
  /** Δset·A·E. */
  targetNmm: number;
  /** Output: distance from the piece start to the end of the set zone. */
  distanceMm: number;
  /** Output: jacking-line force there. */
  forceN: number;
}

export function createSetPiece(): SetPiece {
  return {
    startMm: 0.5,
    lengthMm: 0.5,
    startForceN: 0.5,
    integralBeforeNmm: 0.5,
    decayPerMm: 0.5,
    targetNmm: 0.5,
    distanceMm: 0.5,
    forceN: 0.5,
  };
}

/**
 * Finds how far into an exponential piece (force P·e^-k·s) the running area reaches the target,
 * and the force there.
 *
 * With D = (target − g)/(2P) the condition is f(s) = s·φ(ks) + X·(1 − e^-ks) − s·e^-ks = D, and
 * f(s) = k·(s²/2 + X·s) − k²·(s³/3 + X·s²/2) + O(k³): the first term alone is the straight-line
 * answer; the second refines the start so that one Newton step usually suffices. The area rises
 * with s, so Newton is kept inside a shrinking bracket (halving if a step would leave it). After
 * a step Δ the error left is about |f''/2f'|·Δ² ≤ (1 + k(X+s))/(2(X+s))·Δ², which decides when to
 * stop; the force at the final point follows from the last evaluation by e^-kΔ to second order
 * (kΔ is below 1e-5 there, so the neglected term is under 1e-16 relative).
 */
export function solveSetPiece(piece: SetPiece): void {
  const { startMm: x0, lengthMm, startForceN, integralBeforeNmm, decayPerMm: k, targetNmm } = piece;
  const areaBefore = 2 * (integralBeforeNmm - x0 * startForceN);
  if (targetNmm <= areaBefore || !(k > 0)) {
    piece.distanceMm = 0;
    piece.forceN = startForceN;
    return;
  }
  // Off the critical path: P/k turns ∫₀ˢ P dx = P·(1 − e^-ks)/k into a product.
  const forceOverK = startForceN / k;
  // Straight-line start, s² + 2·X·s = q. √(X² + q) − X loses digits when X ≫ s, which only
  // costs the start some accuracy; Newton restores it and saves a division on the way.
  const q = (targetNmm - areaBefore) / (k * startForceN);
  const straight = Math.sqrt(x0 * x0 + q) - x0;
  const refined = straight + (k * straight * straight * (straight / 3 + x0 / 2)) / (straight + x0);
  let lo = 0;
  let hi = lengthMm;
  let s = Math.min(hi, Math.max(0, refined));
  for (let step = 0; step < NEWTON_MAX_STEPS; step++) {
    const ks = k * s;
    const decay = Math.exp(-ks);
    const forceAtS = startForceN * decay;
    // Below 1e-3 the product form cancels; the series form is exact there.
    const integralToS = ks < 1e-3 ? startForceN * s * meanFactorFromDecay(ks, decay) : forceOverK * (1 - decay);
    const reach = x0 + s;
    const excess = 2 * (integralBeforeNmm + integralToS - reach * forceAtS) - targetNmm;
    if (excess > 0) hi = s;
    else lo = s;
    const slope = 2 * reach * k * forceAtS;
    const newton = slope > 0 ? s - excess / slope : NaN;
    if (newton > lo && newton < hi) {
      const moved = newton - s;
      const kMoved = k * moved;
      if ((1 + k * reach) * moved * moved <= 2 * reach * SOLVE_TOLERANCE_MM && Math.abs(kMoved) < 1e-5) {
        piece.distanceMm = newton;
        piece.forceN = forceAtS * (1 - kMoved * (1 - kMoved / 2));
        return;
      }
      s = newton;
    } else {
      s = (lo + hi) / 2;
      if (hi - lo <= SOLVE_TOLERANCE_MM) break;
    }
  }
  piece.distanceMm = s;
  piece.forceN = startForceN * Math.exp(-k * s);
}
