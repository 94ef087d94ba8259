import {
  DEFAULT_STRAND_MODULUS_MPA,
  JACKING_LIMIT_FPU_FRACTION,
  checkStressLimits,
  compareElongation,
  findStrandSize,
  forceFromPressure,
  pressureForForce,
  predictElongation,
  totalFromInitial,
  type Check,
  type Comparison,
  type ElongationPrediction,
  type TendonInput,
  type TendonSegment,
} from "@/lib/elongation";
import type { ComparisonBasis, GoverningValue, StressingEnds, TendonEnd } from "@/lib/schemas/domain";

/**
 * The computation basis of one tendon: which values feed the engine and how the measured sum is
 * compared. Pure and shared, so the tablet's provisional verdict, the server's evaluation and the
 * tendon screen all agree to the last digit.
 */

export interface ProjectBasis {
  tolerancePct: number;
  shortTendonFloorMm: number | null;
  comparisonBasis: ComparisonBasis;
  countJackGrip: boolean;
  frictionMu: number;
  wobblePerM: number;
  anchorSetMm: number;
  /** Read by the judge (lib/stressing/judge.ts); absent where a caller predates them. */
  timeZone?: string;
  jackingForceFactor?: number;
  underForcePct?: number;
  seatingExcessMm?: number;
  /** Which prediction governs the verdict: Tautline's or the approved shop drawing's. */
  governing?: GoverningValue;
  /** The band on a group's average deviation, ± %; none when null. */
  groupTolerancePct?: number | null;
  /** Steel a member may lose to unreplaced wire breaks, % of its prestressing steel (default 2). */
  wireLossLimitPct?: number;
}

/** The basis columns of a `projects` row. */
export interface ProjectBasisColumns {
  tolerance_pct: number;
  short_tendon_floor_mm: number | null;
  comparison_basis: ComparisonBasis;
  count_jack_grip: boolean;
  friction_mu: number;
  wobble_per_m: number;
  anchor_set_mm: number;
  time_zone?: string;
  jacking_force_factor?: number;
  under_force_pct?: number;
  seating_excess_mm?: number;
  governing_value?: GoverningValue;
  group_tolerance_pct?: number | null;
  wire_loss_limit_pct?: number;
}

/** The columns of a `projects` row every prediction reads (the optional ones come where a caller needs them). */
export const PREDICTION_BASIS_COLUMNS = [
  "tolerance_pct",
  "short_tendon_floor_mm",
  "comparison_basis",
  "count_jack_grip",
  "friction_mu",
  "wobble_per_m",
  "anchor_set_mm",
] as const satisfies readonly (keyof ProjectBasisColumns)[];

/** The basis of a project as stored. */
export const projectBasisFromRow = (p: ProjectBasisColumns): ProjectBasis => ({
  tolerancePct: p.tolerance_pct,
  shortTendonFloorMm: p.short_tendon_floor_mm,
  comparisonBasis: p.comparison_basis,
  countJackGrip: p.count_jack_grip,
  frictionMu: p.friction_mu,
  wobblePerM: p.wobble_per_m,
  anchorSetMm: p.anchor_set_mm,
  ...(p.time_zone !== undefined && { timeZone: p.time_zone }),
  ...(p.jacking_force_factor !== undefined && { jackingForceFactor: p.jacking_force_factor }),
  ...(p.under_force_pct !== undefined && { underForcePct: p.under_force_pct }),
  ...(p.seating_excess_mm !== undefined && { seatingExcessMm: p.seating_excess_mm }),
  ...(p.governing_value !== undefined && { governing: p.governing_value }),
  ...(p.group_tolerance_pct !== undefined && { groupTolerancePct: p.group_tolerance_pct }),
  ...(p.wire_loss_limit_pct !== undefined && { wireLossLimitPct: p.wire_loss_limit_pct }),
});

export interface TendonBasis {
  strandSize: string;
  strandCount: number;
  segments: TendonSegment[];
  ends: StressingEnds;
  jackGripMm: number | null;
  /**
   * The schedule's specified jacking force for this tendon, N; null or absent: the project's factor
   * of fpu·A (see `specifiedJackingForce`).
   */
  jackingForceN?: number | null;
}

/** Mill-certificate values of the strand lot, when the tendon has one. */
export interface LotBasis {
  areaMm2: number;
  modulusMPa: number;
  breakingLoadN: number;
}

export interface CalibrationLine {
  slope: number;
  intercept: number;
  minPressureMPa: number;
  maxPressureMPa: number;
}

export interface StrandValues {
  areaMm2: number;
  modulusMPa: number;
  breakingLoadPerStrandN: number;
  source: StrandValuesSource;
}

/** Where the strand's values come from: the lot's mill certificate or the nominal table. */
export type StrandValuesSource = "strand lot" | "nominal";

/** Area, modulus and breaking load: the lot's mill certificate, else ASTM A416 nominal values. */
export function strandValues(tendon: TendonBasis, lot: LotBasis | null): StrandValues {
  if (lot)
    return {
      areaMm2: lot.areaMm2,
      modulusMPa: lot.modulusMPa,
      breakingLoadPerStrandN: lot.breakingLoadN,
      source: "strand lot",
    };
  const nominal = findStrandSize(tendon.strandSize);
  if (!nominal) throw new Error(`Unknown strand size "${tendon.strandSize}"`);
  return {
    areaMm2: nominal.areaMm2,
    modulusMPa: DEFAULT_STRAND_MODULUS_MPA.aashto,
    breakingLoadPerStrandN: nominal.minBreakingStrengthN,
    source: "nominal",
  };
}

/**
 * The jacking force the tendon is stressed to: 0.80 of the specified breaking load of the
 * nominal strand (ACI 318-19 Table 20.3.2.5.1), the usual target of building tendons.
 */
export function targetJackingForceN(tendon: TendonBasis): number {
  const nominal = findStrandSize(tendon.strandSize);
  if (!nominal) throw new Error(`Unknown strand size "${tendon.strandSize}"`);
  return JACKING_LIMIT_FPU_FRACTION * nominal.minBreakingStrengthN * tendon.strandCount;
}

/** Where a tendon's specified jacking force comes from: its schedule row, or the project's factor. */
export type JackingForceSource = "schedule" | "project";

export interface SpecifiedJackingForce {
  forceN: number;
  source: JackingForceSource;
  /** The project's factor of fpu·A when it gave the force; null when the schedule did. */
  factor: number | null;
}

/**
 * The specified jacking force of a tendon: the schedule row's own force when it gives one, else the
 * project's factor (default 0.80) of fpu·A of the nominal strand. One function for the judge, the
 * target gauge pressure and the screens, on the tablet and the server.
 */
export function specifiedJackingForce(
  project: Pick<ProjectBasis, "jackingForceFactor">,
  tendon: TendonBasis,
): SpecifiedJackingForce {
  const own = tendon.jackingForceN ?? null;
  if (own !== null && own > 0) return { forceN: own, source: "schedule", factor: null };
  const factor = project.jackingForceFactor ?? JACKING_LIMIT_FPU_FRACTION;
  return {
    forceN: (targetJackingForceN(tendon) * factor) / JACKING_LIMIT_FPU_FRACTION,
    source: "project",
    factor,
  };
}

export interface TendonPrediction {
  /** Exactly what the engine was given, for drawing the force profile with the same figures. */
  engineInput: TendonInput;
  jackingForceN: number;
  /** Where the jacking force came from; "given" when the caller passed one. */
  jackingForceSource: JackingForceSource | "given";
  /** The project's factor of fpu·A when it gave the force. */
  jackingForceFactor: number | null;
  strand: StrandValues;
  prediction: ElongationPrediction;
  /** The value the measured sum is compared with, on the project's basis. */
  predictedMm: number;
  gripMm: number;
  checks: Check[];
}

export function predictTendon(input: {
  project: ProjectBasis;
  tendon: TendonBasis;
  lot: LotBasis | null;
  /** The equipment set's grip length, used when the tendon gives none. */
  equipmentGripMm?: number | null;
  jackingForceN?: number;
}): TendonPrediction {
  const { project, tendon } = input;
  const strand = strandValues(tendon, input.lot);
  const specified = input.jackingForceN === undefined ? specifiedJackingForce(project, tendon) : null;
  const jackingForceN = input.jackingForceN ?? specified!.forceN;
  const gripMm = project.countJackGrip ? (tendon.jackGripMm ?? input.equipmentGripMm ?? 0) : 0;
  const engineInput: TendonInput = {
    segments: tendon.segments,
    strandAreaMm2: strand.areaMm2,
    strandCount: tendon.strandCount,
    modulusMPa: strand.modulusMPa,
    jackingForceN,
    wobblePerM: project.wobblePerM,
    mu: project.frictionMu,
    anchorSetMm: project.anchorSetMm > 0 ? project.anchorSetMm : undefined,
    jackGripMm: gripMm > 0 ? gripMm : undefined,
    ends: tendon.ends,
  };
  const prediction = predictElongation(engineInput);
  const checks = checkStressLimits({
    breakingLoadPerStrandN: strand.breakingLoadPerStrandN,
    strandCount: tendon.strandCount,
    jackingForceN,
    anchorForceAfterN: prediction.seating?.anchorForceAfterN,
  });
  return {
    engineInput,
    jackingForceN,
    jackingForceSource: specified?.source ?? "given",
    jackingForceFactor: specified?.factor ?? null,
    strand,
    prediction,
    predictedMm: project.comparisonBasis === "net" ? prediction.netMm : prediction.grossMm,
    gripMm,
    checks,
  };
}

/** The gauge pressure to pull to for the tendon's jacking force on one calibration. */
export function targetPressureMPa(calibration: CalibrationLine, jackingForceN: number): number {
  return pressureForForce(calibration, jackingForceN);
}

export interface EndReading {
  end: TendonEnd;
  measuredMm: number;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  calibration: CalibrationLine | null;
}

/**
 * An end's elongation brought to the full jacking force: readings taken from an initial
 * pressure are extrapolated linearly (measured·Pj/(Pj − Pi)), forces from the calibration.
 */
export function endTotalMm(reading: EndReading): number {
  if (!reading.initialPressureMPa || !reading.calibration) return reading.measuredMm;
  const initialForceN = forceFromPressure(reading.calibration, reading.initialPressureMPa);
  const finalForceN = forceFromPressure(reading.calibration, reading.finalPressureMPa);
  if (initialForceN <= 0) return reading.measuredMm;
  return totalFromInitial({ measuredMm: reading.measuredMm, initialForceN, jackingForceN: finalForceN });
}

export interface TendonJudgement {
  /** Ends the schedule stresses that have no reading yet. */
  missingEnds: TendonEnd[];
  measuredMm: number;
  comparison: Comparison;
  /** True until every end the schedule stresses has a reading. */
  provisional: boolean;
}

export function stressedEnds(ends: TendonBasis["ends"]): TendonEnd[] {
  return ends === "both" ? ["A", "B"] : [ends];
}

/**
 * Compares the measured sum of the ends read so far with the prediction. A lone end of a
 * two-end tendon is judged against that end's own share, provisionally.
 */
export function judgeTendon(input: {
  project: ProjectBasis;
  tendon: TendonBasis;
  predicted: TendonPrediction;
  readings: EndReading[];
}): TendonJudgement {
  const { tendon, predicted } = input;
  const wanted = stressedEnds(tendon.ends);
  const read = wanted.filter((e) => input.readings.some((r) => r.end === e));
  const missingEnds = wanted.filter((e) => !read.includes(e));
  const measuredMm = input.readings.filter((r) => wanted.includes(r.end)).reduce((sum, r) => sum + endTotalMm(r), 0);

  let predictedMm = predicted.predictedMm;
  if (missingEnds.length && read.length) {
    // Share of the whole for the ends that were read, on the same basis.
    const share = read.reduce((s, e) => s + (predicted.prediction.perEndMm[e] ?? 0), 0) / predicted.prediction.grossMm;
    predictedMm = predicted.predictedMm * share;
  }
  const comparison = compareElongation({
    measuredMm,
    predictedMm,
    tolerancePct: input.project.tolerancePct,
    floorMm: input.project.shortTendonFloorMm ?? undefined,
    jackingForceN: predicted.jackingForceN,
  });
  return { missingEnds, measuredMm, comparison, provisional: missingEnds.length > 0 };
}
