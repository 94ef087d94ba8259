import { createSeating, type EndSeating } from "./anchor-set";
import { createEndWalk, findMeetingPoint, seatingOfWalk, walkEndPath } from "./end-path";
import { InputError, optionalNonNegative, requireNonNegative, requirePositive, requirePositiveInteger } from "./errors";
import { checkEnds, checkSegments } from "./tendon-input";
import type {
  ElongationPrediction,
  SeatingResult,
  StressedEnds,
  StressedEndSeating,
  TendonEnd,
  TendonInput,
} from "./types";

// Reused between calls (see end-path.ts): the walk record and each end's seating figures, which
// are copied into the result only once both ends are known.
const walk = createEndWalk();
const seatingA = createSeating();
const seatingB = createSeating();
const NO_SEGMENTS: readonly never[] = [];

function copyEnd(end: TendonEnd, seating: EndSeating): StressedEndSeating {
  return {
    end,
    influenceMm: seating.influenceMm,
    lossAtAnchorN: seating.lossAtAnchorN,
    anchorForceAfterN: seating.anchorForceAfterN,
    farForceAfterN: seating.farForceAfterN,
    shortTendon: seating.shortTendon,
  };
}

function seatingResult(
  end: TendonEnd,
  seating: EndSeating,
  otherEnd: StressedEndSeating | null,
  averageForceAfterN: number,
): SeatingResult {
  return {
    end,
    influenceMm: seating.influenceMm,
    lossAtAnchorN: seating.lossAtAnchorN,
    anchorForceAfterN: seating.anchorForceAfterN,
    farForceAfterN: seating.farForceAfterN,
    shortTendon: seating.shortTendon,
    otherEnd,
    averageForceAfterN,
  };
}

function combineSeating(ends: StressedEnds, averageForceAfterN: number): SeatingResult {
  if (ends === "A") return seatingResult("A", seatingA, null, averageForceAfterN);
  if (ends === "B") return seatingResult("B", seatingB, null, averageForceAfterN);
  // The 0.70·fpu check looks at the highest force left at an anchor, so that end governs.
  return seatingB.anchorForceAfterN > seatingA.anchorForceAfterN
    ? seatingResult("B", seatingB, copyEnd("A", seatingA), averageForceAfterN)
    : seatingResult("A", seatingA, copyEnd("B", seatingB), averageForceAfterN);
}

/**
 * Predicted elongation of one tendon: exact segment integrals of the friction curve from each
 * stressed end, strand inside the jack, and anchor set with its influence length. When both ends
 * are stressed, each end pulls to the jacking force along its own friction path and the paths
 * meet where their forces are equal. With both ends, each end's set zone is kept to its own side
 * of the meeting point (exact for a symmetric tendon, where the meeting point does not move).
 */
export function predictElongation(input: TendonInput): ElongationPrediction {
  if (input === null || typeof input !== "object")
    throw new InputError("input", "required", "tendon input is required");
  const { segments } = input;
  const wobblePerM = requireNonNegative(input.wobblePerM, "wobblePerM");
  const mu = requireNonNegative(input.mu, "mu");
  const ends = checkEnds(input.ends);
  const bothEnds = ends === "both";
  const lengthMm = checkSegments(segments, wobblePerM, mu, bothEnds ? walk : null);
  const axialStiffnessN =
    requirePositive(input.strandAreaMm2, "strandAreaMm2") *
    requirePositiveInteger(input.strandCount, "strandCount") *
    requirePositive(input.modulusMPa, "modulusMPa");
  const jackingForceN = requirePositive(input.jackingForceN, "jackingForceN");
  const anchorSetMm = optionalNonNegative(input.anchorSetMm, "anchorSetMm");
  const jackGripMm = optionalNonNegative(input.jackGripMm, "jackGripMm");

  walk.segments = segments;
  walk.wobblePerM = wobblePerM;
  walk.mu = mu;
  walk.jackingForceN = jackingForceN;
  walk.seatingAreaNmm = anchorSetMm === undefined ? 0 : anchorSetMm * axialStiffnessN;
  const gripMm = jackGripMm === undefined ? 0 : (jackingForceN * jackGripMm) / axialStiffnessN;
  if (bothEnds) findMeetingPoint(walk, lengthMm);

  let integral = 0;
  let farEndForceN = Infinity;
  let endA = 0;
  let endB = 0;
  let meetingPointMm: number | null = null;
  if (ends !== "B") {
    walkEndPath(walk, false, bothEnds);
    endA = walk.forceIntegralNmm / axialStiffnessN + gripMm;
    integral += walk.forceIntegralNmm;
    farEndForceN = walk.endForceN;
    if (bothEnds) meetingPointMm = walk.lengthMm;
    if (anchorSetMm !== undefined) seatingOfWalk(walk, seatingA);
  }
  if (ends !== "A") {
    walkEndPath(walk, true, bothEnds);
    endB = walk.forceIntegralNmm / axialStiffnessN + gripMm;
    integral += walk.forceIntegralNmm;
    farEndForceN = Math.min(farEndForceN, walk.endForceN);
    if (anchorSetMm !== undefined) seatingOfWalk(walk, seatingB);
  }
  const seatingAreaNmm = walk.seatingAreaNmm;
  walk.segments = NO_SEGMENTS; // do not keep the caller's tendon alive between calls

  const stressedEnds = bothEnds ? 2 : 1;
  const grossMm = endA + endB;
  return {
    grossMm,
    netMm: grossMm - stressedEnds * (anchorSetMm ?? 0),
    perEndMm: ends === "A" ? { A: endA } : ends === "B" ? { B: endB } : { A: endA, B: endB },
    farEndForceN,
    averageForceN: integral / lengthMm,
    // The area cut off by seating is Δset·A·E at each end by construction.
    seating:
      anchorSetMm === undefined ? null : combineSeating(ends, (integral - stressedEnds * seatingAreaNmm) / lengthMm),
    lengthMm,
    meetingPointMm,
    axialStiffnessN,
  };
}
