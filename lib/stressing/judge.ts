import {
  compareElongation,
  forceFromPressure,
  isInputError,
  predictElongation,
  pressureForForce,
  resolutionEffect,
  totalFromInitial,
  totalFromSteps,
  type Comparison,
  type TendonInput,
  type Verdict,
} from "@/lib/elongation";
import { dayInZone } from "@/lib/format/dates";
import type { ComparisonBasis, GoverningValue, ReadingMethod, StressingOrder, TendonEnd } from "@/lib/schemas/domain";
import { pickCalibration } from "@/lib/schemas/pick-calibration";
import type { GaugeOffTarget, GaugeStepSI, WireBreak } from "@/lib/schemas/record";
import { resolutionStepMm } from "@/lib/units";
import {
  specifiedJackingForce,
  stressedEnds,
  strandValues,
  type JackingForceSource,
  type LotBasis,
  type ProjectBasis,
  type StrandValues,
  type TendonBasis,
} from "./basis";
import { readingResolution, type DisplayUnits } from "@/lib/format/quantities";

/**
 * The one judge of a tendon's stressing, pure and shared: the server's evaluation and the tablet's
 * provisional verdict both call `judgeStressing` with the same facts and so agree to the digit.
 *
 * Each end is judged the way it was read (the field procedure, common practice):
 * - marks read after lock-off include the seating loss and no strand inside the jack, so they are
 *   compared with the prediction net of the anchor set (the measured seating when the crew typed
 *   one, else the plan's), grip excluded;
 * - ram travel (strokes) is read at the jacking force before seating and includes the strand
 *   inside the jack, so it is compared with the gross prediction plus the grip; the draw-in lost
 *   at each re-grip between strokes is deducted from the sum of the strokes.
 * Two-end tendons stressed one end after the other (the usual case) judge the first end as a
 * one-end stressing and the second end as what it adds; stressed at the same time, each end's
 * share meets where the two friction paths give equal force.
 */

export type { ComparisonBasis, GoverningValue, ReadingMethod, StressingOrder };

/** Defaults of the settings this module added; a project row may not carry them yet. */
export const JUDGING_DEFAULTS = {
  timeZone: "UTC",
  /** Specified jacking force as a fraction of fpu·A (ACI 318-19 Table 20.3.2.5.1 limit, from memory). */
  jackingForceFactor: 0.8,
  /** Under-force beyond this share of the specified force is flagged (common practice). */
  underForcePct: 2,
  /** Measured seating larger than the plan's by more than this is flagged (1/8 in, common practice). */
  seatingExcessMm: 3.175,
  governing: "tautline" as GoverningValue,
} as const;

export interface JudgeProject extends ProjectBasis, DisplayUnits {
  timeZone?: string;
  /** Which prediction governs the verdict; Tautline's when absent. */
  governing?: GoverningValue;
  jackingForceFactor?: number;
  underForcePct?: number;
  seatingExcessMm?: number;
  requiredConcreteMPa?: number | null;
}

export interface JudgeCalibration {
  id: string;
  calibratedOn: string;
  validUntil: string;
  slope: number;
  intercept: number;
  minPressureMPa: number;
  maxPressureMPa: number;
  /** Set when the calibration was retired or corrected: it is not used again. */
  retiredAt?: string | Date | null;
  /** The calibration that corrects this one. */
  replacedBy?: string | null;
}

export interface JudgeSet {
  id: string;
  name: string;
  jackGripMm: number | null;
  maxForceN: number | null;
  /** Draw-in the jack loses at each re-grip: used when a ram-travel record types none. */
  drawInMm?: number | null;
  calibrations: JudgeCalibration[];
}

export interface JudgeRecord {
  id: string;
  chainId: string;
  revision: number;
  end: TendonEnd;
  deviceTime: string | Date;
  receivedAt?: string | Date | null;
  equipmentSetId: string;
  calibrationId: string | null;
  expiredCalibrationReason: string | null;
  /** The crew's reason to stress while the pour's concrete strength was not confirmed. */
  concreteGoAhead?: string | null;
  readingMethod: ReadingMethod;
  initialPressureMPa: number | null;
  finalPressureMPa: number;
  /** Marks after − before, or the strokes summed, as typed. */
  measuredMm: number;
  /** How many strokes were summed (1 for marks). */
  strokeCount: number;
  /** Draw-in lost at each re-grip, as typed; null when not given. */
  drawInMm: number | null;
  /** Seating (wedge draw-in at lock-off) measured by the crew. */
  seatingMm: number | null;
  /** Null when the record predates the question: two-end tendons are then taken as sequential. */
  stressingOrder: StressingOrder | null;
  wireBreaks: number;
  restressOfDispositionId?: string | null;
  /** The first, coarser reading when the elongation was read again finer; `measuredMm` is the re-read. */
  firstReadingMm?: number | null;
  /** Why the finer second reading the tablet asked for could not be taken. */
  rereadDeclinedReason?: string | null;
  /** Which strand and where, per broken wire; absent on records made before it was asked. */
  wireBreakDetails?: WireBreak[] | null;
  /**
   * Pressures read on the way up with the reading at each (from any fixed origin): their
   * least-squares line brings the elongation from the initial pressure to zero force.
   */
  gaugeSteps?: GaugeStepSI[] | null;
  /** The crew's confirmation of a final pressure off its target by more than the band. */
  gaugeOffTarget?: GaugeOffTarget | null;
}

/** The gauge steps' line as the judge used it. */
export interface StepFit {
  steps: { pressureMPa: number; readingMm: number; forceN: number }[];
  r2: number;
  stiffnessNPerMm: number;
  zeroReadingMm: number;
  /** What the line puts between zero force and the initial pressure: added to the reading. */
  belowReferenceMm: number;
}

export interface JudgeInput {
  project: JudgeProject;
  tendon: TendonBasis & { shopElongationMm?: number | null; tag?: string };
  lot: LotBasis | null;
  /** `concreteFlagOpen`: the pour already has an open concrete flag (the concrete rule raises one per pour). */
  pour?: { concreteStrengthMPa: number | null; concreteFlagOpen?: boolean };
  sets: JudgeSet[];
  /** Every revision of every record of the tendon. */
  records: JudgeRecord[];
  dispositions?: { id: string; flagId: string; decision: string; createdAt: string | Date }[];
  /**
   * The other tendons of this tendon's group (its pour) with the deviation of their latest complete,
   * non-provisional evaluation (null when they have none yet), for the group-average band.
   */
  group?: {
    label: string;
    tendons: { tendonId: string; tag: string; deviationPct: number | null; lastStressedAt: string | Date | null }[];
  };
  /**
   * The wire-break ledger of this tendon's member (its pour when the schedule names none): the
   * member's prestressing steel, this tendon's included, and the wires broken and not replaced on
   * its other tendons. Absent where it was not read (the tablet); the ledger rule then says nothing.
   */
  member?: {
    label: string;
    steelMm2: number;
    otherBreaks: { tag: string; wires: number; wireAreaMm2: number }[];
  };
}

export type EndRole = "one end" | "first end" | "second end" | "simultaneous";

/** Where an end's draw-in per re-grip came from (stored in the evaluation's readings). */
export type DrawInSource = "record" | "equipment set" | "none";

/** Where the anchor set taken off on the net basis came from: measured on the record, or the plan's. */
export type SetSource = "measured" | "plan" | "none";

/** The prediction the verdict was judged against, as the evaluation stores it (`GoverningValue` in words). */
export type GoverningWords = "tautline" | "shop drawing";

export interface EndJudgement {
  end: TendonEnd;
  record: JudgeRecord;
  method: ReadingMethod;
  basis: ComparisonBasis;
  role: EndRole;
  /** The stressing day in the project's time zone. */
  day: string;
  calibration: JudgeCalibration | null;
  /** The day is outside the calibration's dates, or there is none. */
  calibrationExpired: boolean;
  /** Gauge pressures outside the calibrated range (initial, final and each gauge step). */
  outsideRangeMPa: number[];
  /** The gauge steps' least-squares line, when the record has steps and they made one. */
  stepFit: StepFit | null;
  /** The gauge pressure of the specified force on the calibration used; null without one. */
  targetPressureMPa: number | null;
  /** The final pressure's distance from that target, % of it. */
  offTargetPct: number | null;
  gaugeForceN: number | null;
  /** The draw-in per re-grip used (ram travel only): the record's own, else the equipment set's. */
  drawInUsedMm: number | null;
  /** Where it came from: typed on the record, the equipment set's default, or none. */
  drawInSource: DrawInSource;
  /** Draw-in deducted from the strokes: draw-in × (strokes − 1). */
  drawInDeductedMm: number;
  /** The reading brought to the full force on its basis; null when it cannot be (see `incomplete`). */
  totalMm: number | null;
  /** This end's gross elongation at the specified force, without grip. */
  predictedGrossMm: number;
  gripMm: number;
  /** The anchor set taken off on the net basis (0 on gross). */
  setMm: number;
  setSource: SetSource;
  /** What this end's reading is compared with. */
  predictedMm: number;
  comparison: Comparison | null;
  /**
   * Tautline's elongation of this end at the specified force on the record's own basis before any
   * seating: the gross share plus the grip on gross (ram travel), the gross share on net (marks).
   * The force the elongation implies scales with it; never the shop drawing's value.
   */
  forceBasisMm: number;
  /**
   * The force the elongation implies, Pj·(m + set)/forceBasis: Pj·(m + set)/gross on net,
   * Pj·m/(gross + grip) on gross (m the reading brought to the full force, draw-in deducted).
   */
  impliedForceN: number | null;
  incomplete: string | null;
}

export interface StressingJudgement {
  ends: EndJudgement[];
  order: StressingOrder;
  missingEnds: TendonEnd[];
  provisional: boolean;
  verdict: Verdict | "incomplete";
  /** Why the verdict is incomplete, in words. */
  incomplete: string[];
  measuredMm: number | null;
  predictedMm: number | null;
  comparison: Comparison | null;
  /** "net of anchor set (marks)", "gross plus grip (ram travel)", or both named per end. */
  basisLabel: string;
  specifiedForceN: number;
  /** Where the specified force came from: the tendon's schedule row, or the project's factor of fpu·A. */
  specifiedForceSource: JackingForceSource;
  /** The project's factor of fpu·A when it gave the force; null when the schedule did. */
  specifiedForceFactor: number | null;
  strand: StrandValues;
  /** Whole tendon gross at the specified force (no grip), on the schedule's ends, and net. */
  grossMm: number;
  netMm: number;
  /** Where the two friction paths meet (two-end tendons), mm from end A. */
  meetingPointMm: number | null;
  /**
   * True when the reading division alone could flip the verdict: the sum of the ends, each read to
   * within half a division, straddles a band edge. The tablet asks for a finer second reading.
   */
  divisionCouldFlip: boolean;
  /**
   * The division could flip the verdict and an end was neither read again finer nor declined with a
   * reason: the tablet asks for the second reading before the record is final.
   */
  rereadWanted: boolean;
  /**
   * The approved shop-drawing elongation beside Tautline's prediction on the same basis (the
   * project's usual comparison basis, as the schedule states it), and their difference, when the
   * schedule gives one.
   */
  shopDrawing: ShopDrawingComparison | null;
  /** The prediction the verdict was judged against. */
  governs: GoverningWords;
  /** Why the project's choice could not be followed (shop drawing chosen, none on the schedule). */
  governsNote: string | null;
}

export interface ShopDrawingComparison {
  /** The shop drawing's whole-tendon elongation as the schedule gives it. */
  mm: number;
  /** The basis the shop drawing is taken to state: the project's usual comparison basis. */
  basis: ComparisonBasis;
  /** Tautline's whole-tendon prediction on that same basis (at the specified force, no grip). */
  tautlineMm: number;
  /** Shop drawing − Tautline, mm and % of Tautline's. */
  differenceMm: number;
  differencePct: number;
}

/**
 * The shop drawing's value beside ours. The schedule's "shop elongation" is taken as the whole
 * tendon's elongation at the specified jacking force, stated on the project's usual comparison
 * basis (net: after the plan's anchor set at each stressed end; gross: at the jacking force), and
 * never counting strand inside the jack, which belongs to the jack and not to the tendon.
 */
export function compareShopDrawing(input: {
  shopMm: number | null | undefined;
  basis: ComparisonBasis;
  grossMm: number;
  netMm: number;
}): ShopDrawingComparison | null {
  const shop = input.shopMm ?? null;
  if (shop === null || !(shop > 0)) return null;
  const tautlineMm = input.basis === "net" ? input.netMm : input.grossMm;
  const differenceMm = shop - tautlineMm;
  return { mm: shop, basis: input.basis, tautlineMm, differenceMm, differencePct: (differenceMm / tautlineMm) * 100 };
}

/** The second reading is taken to half the project's division (1/8 in → 1/16 in, 1 mm → 0.5 mm). */
export const REREAD_FRACTION = 0.5;

/** The basis a reading method is compared on. */
export const basisOf = (method: ReadingMethod): ComparisonBasis => (method === "marks" ? "net" : "gross");

export const BASIS_WORDS: Record<ComparisonBasis, string> = {
  net: "net of anchor set (marks read after lock-off)",
  gross: "gross plus grip (ram travel before seating)",
};

/** The stressing day of a record, in the project's time zone: calibration validity, the concrete gate. */
export function stressingDay(deviceTime: string | Date, timeZone: string | undefined): string {
  return dayInZone(deviceTime, timeZone || JUDGING_DEFAULTS.timeZone);
}

/** The head revision of each chain; per end, the chains by device time (the current one last). */
export function chainsByEnd(records: readonly JudgeRecord[]): Record<TendonEnd, JudgeRecord[]> {
  const heads = new Map<string, JudgeRecord>();
  for (const r of records) {
    const seen = heads.get(r.chainId);
    if (!seen || r.revision > seen.revision) heads.set(r.chainId, r);
  }
  const out = { A: [] as JudgeRecord[], B: [] as JudgeRecord[] };
  for (const head of heads.values()) out[head.end].push(head);
  for (const list of Object.values(out))
    list.sort((a, b) => +new Date(a.deviceTime) - +new Date(b.deviceTime) || a.id.localeCompare(b.id));
  return out;
}

/** The current record of each end: the latest revision of the stressing done last. */
export function currentRecords(records: readonly JudgeRecord[]): JudgeRecord[] {
  const by = chainsByEnd(records);
  return (["A", "B"] as const).flatMap((end) => by[end].slice(-1));
}

/**
 * The calibration the crew picked, else the latest one made on or before the stressing day. A
 * retired calibration is not used again: a corrected one gives way to its correction, a retired
 * one without a correction to the calibration in force that day (none: the record is incomplete).
 */
export function chooseCalibration(set: JudgeSet | undefined, calibrationId: string | null, day: string) {
  if (!set) return null;
  if (calibrationId) {
    let named = set.calibrations.find((c) => c.id === calibrationId) ?? null;
    const seen = new Set<string>();
    while (named?.retiredAt && named.replacedBy && !seen.has(named.id)) {
      seen.add(named.id);
      const replacement: string = named.replacedBy;
      named = set.calibrations.find((c) => c.id === replacement) ?? null;
    }
    if (!named || !named.retiredAt) return named;
  }
  return pickCalibration(set.calibrations, day);
}

/**
 * The specified jacking force: the tendon's schedule row when it gives one, else the project's
 * factor (default 0.80) of fpu·A of the nominal strand (`specifiedJackingForce` in basis.ts).
 */
export function specifiedJackingForceN(project: JudgeProject, tendon: TendonBasis): number {
  return specifiedJackingForce(
    { jackingForceFactor: project.jackingForceFactor ?? JUDGING_DEFAULTS.jackingForceFactor },
    tendon,
  ).forceN;
}

function engineInput(input: JudgeInput, strand: StrandValues, jackingForceN: number, ends: TendonInput["ends"]) {
  return {
    segments: input.tendon.segments,
    strandAreaMm2: strand.areaMm2,
    strandCount: input.tendon.strandCount,
    modulusMPa: strand.modulusMPa,
    jackingForceN,
    wobblePerM: input.project.wobblePerM,
    mu: input.project.frictionMu,
    ends,
  } satisfies TendonInput;
}

/** Judges a tendon from every record of it. Pure: no clock, no database. */
export function judgeStressing(input: JudgeInput): StressingJudgement {
  const { project, tendon } = input;
  const strand = strandValues(tendon, input.lot);
  const specified = specifiedJackingForce(
    { jackingForceFactor: project.jackingForceFactor ?? JUDGING_DEFAULTS.jackingForceFactor },
    tendon,
  );
  const specifiedForceN = specified.forceN;
  const wanted = stressedEnds(tendon.ends);
  const current = currentRecords(input.records).filter((r) => wanted.includes(r.end));
  const missingEnds = wanted.filter((e) => !current.some((r) => r.end === e));

  const whole = predictElongation(engineInput(input, strand, specifiedForceN, tendon.ends));
  const axial = whole.axialStiffnessN;
  const planSetMm = project.anchorSetMm > 0 ? project.anchorSetMm : 0;
  const stressedCount = wanted.length;
  const netMm = whole.grossMm - stressedCount * planSetMm;
  const shopDrawing = compareShopDrawing({
    shopMm: tendon.shopElongationMm,
    basis: project.comparisonBasis,
    grossMm: whole.grossMm,
    netMm,
  });
  // When the shop drawing governs, its value is brought to the gross basis (the plan's anchor set
  // added back when it states net) and every end's gross share is scaled by shop ÷ Tautline; each
  // record's own basis (grip, measured or planned set) is then applied to that, as to ours.
  const wantsShop = (project.governing ?? JUDGING_DEFAULTS.governing) === "shop_drawing";
  const shopGrossMm = shopDrawing
    ? shopDrawing.basis === "net"
      ? shopDrawing.mm + stressedCount * planSetMm
      : shopDrawing.mm
    : null;
  const governs: StressingJudgement["governs"] =
    wantsShop && shopGrossMm !== null && shopGrossMm > 0 ? "shop drawing" : "tautline";
  const governsNote =
    wantsShop && governs === "tautline"
      ? "The project lets the approved shop drawing govern, but the schedule gives no shop-drawing elongation for this tendon: Tautline's prediction was used."
      : null;
  const scale = governs === "shop drawing" ? shopGrossMm! / whole.grossMm : 1;

  // The order is asked once per tendon; the latest record that says it decides.
  const said = [...current].sort((a, b) => +new Date(a.deviceTime) - +new Date(b.deviceTime));
  const order: StressingOrder =
    tendon.ends === "both"
      ? (said
          .map((r) => r.stressingOrder)
          .filter(Boolean)
          .at(-1) ?? "sequential")
      : "sequential";
  const oneEnd = (end: TendonEnd) => predictElongation(engineInput(input, strand, specifiedForceN, end)).grossMm;
  const first = said[0]?.end;

  const ends: EndJudgement[] = current.map((record) => {
    const set = input.sets.find((s) => s.id === record.equipmentSetId);
    const day = stressingDay(record.deviceTime, project.timeZone);
    const calibration = chooseCalibration(set, record.calibrationId, day);
    const calibrationExpired = !calibration || day > calibration.validUntil || day < calibration.calibratedOn;
    const steps = record.gaugeSteps?.length ? record.gaugeSteps : null;
    const outsideRangeMPa = calibration
      ? [record.initialPressureMPa, record.finalPressureMPa, ...(steps ?? []).map((s) => s.pressureMPa)].filter(
          (p): p is number => p !== null && p > 0 && (p < calibration.minPressureMPa || p > calibration.maxPressureMPa),
        )
      : [];
    const gaugeForceN = calibration ? forceFromPressure(calibration, record.finalPressureMPa) : null;
    const targetPressureMPa = calibration ? pressureForForce(calibration, specifiedForceN) : null;
    const offTargetPct =
      targetPressureMPa !== null && targetPressureMPa > 0
        ? ((record.finalPressureMPa - targetPressureMPa) / targetPressureMPa) * 100
        : null;

    let role: EndRole = "one end";
    let predictedGrossMm: number;
    if (tendon.ends !== "both") predictedGrossMm = whole.grossMm;
    else if (order === "simultaneous") {
      role = "simultaneous";
      predictedGrossMm = whole.perEndMm[record.end] ?? 0;
    } else if (record.end === first) {
      role = "first end";
      predictedGrossMm = oneEnd(record.end);
    } else {
      // What the second end adds: the strand moves only where its friction path rises above the
      // force the first end left (the first end's set zone is taken not to reach that far).
      role = "second end";
      predictedGrossMm = whole.grossMm - oneEnd(first ?? (record.end === "A" ? "B" : "A"));
    }
    // The force the elongation implies stays on Tautline's own computation (A, E, friction).
    const tautlineGrossMm = predictedGrossMm;
    predictedGrossMm *= scale;

    const method = record.readingMethod;
    const basis = basisOf(method);
    const gripLengthMm = tendon.jackGripMm ?? set?.jackGripMm ?? 0;
    const gripMm = basis === "gross" ? (specifiedForceN * gripLengthMm) / axial : 0;
    const setSource: EndJudgement["setSource"] =
      basis === "gross" ? "none" : record.seatingMm !== null ? "measured" : "plan";
    const setMm = basis === "gross" ? 0 : (record.seatingMm ?? planSetMm);
    const predictedMm = predictedGrossMm + gripMm - setMm;

    const regrips = method === "strokes" ? Math.max(0, record.strokeCount - 1) : 0;
    // Ram travel: the draw-in typed on the record, else the equipment set's (its wedges' usual
    // loss at each re-grip), else none. Marks are read after lock-off and lose nothing to re-grips.
    const drawInSource: EndJudgement["drawInSource"] =
      method !== "strokes"
        ? "none"
        : record.drawInMm !== null
          ? "record"
          : set?.drawInMm !== undefined && set.drawInMm !== null
            ? "equipment set"
            : "none";
    const drawInUsedMm =
      drawInSource === "record" ? record.drawInMm : drawInSource === "equipment set" ? set!.drawInMm! : null;
    const drawInDeductedMm = regrips * (drawInUsedMm ?? 0);
    const readMm = record.measuredMm - drawInDeductedMm;

    let incomplete: string | null = null;
    let totalMm: number | null = readMm;
    let stepFit: StepFit | null = null;
    if (steps) {
      // The steps' line replaces the two-point extrapolation: what it puts below the initial pressure
      // is added to the reading on either basis (see totalFromSteps).
      if (!calibration) {
        incomplete = `End ${record.end} was read at gauge steps but its equipment set has no usable calibration to give their forces.`;
      } else {
        const forced = steps.map((st) => ({ ...st, forceN: forceFromPressure(calibration, st.pressureMPa) }));
        const referenceForceN =
          record.initialPressureMPa !== null && record.initialPressureMPa > 0
            ? forceFromPressure(calibration, record.initialPressureMPa)
            : 0;
        try {
          const fit = totalFromSteps({ measuredMm: readMm, referenceForceN, steps: forced });
          totalMm = fit.totalMm;
          stepFit = {
            steps: forced,
            r2: fit.r2,
            stiffnessNPerMm: fit.stiffnessNPerMm,
            zeroReadingMm: fit.zeroReadingMm,
            belowReferenceMm: fit.belowReferenceMm,
          };
        } catch (error) {
          if (!isInputError(error)) throw error;
          incomplete = `End ${record.end}: the gauge steps give no line on the calibration (${error.message.replace(/^[^:]+:\s*/, "")}).`;
        }
      }
    } else if (record.initialPressureMPa !== null && record.initialPressureMPa > 0) {
      const initialForceN = calibration ? forceFromPressure(calibration, record.initialPressureMPa) : null;
      if (!calibration || gaugeForceN === null || initialForceN === null) {
        incomplete = `End ${record.end} was read from an initial pressure but its equipment set has no usable calibration to bring the reading to the full force.`;
      } else if (!(initialForceN > 0) || initialForceN >= gaugeForceN) {
        incomplete = `End ${record.end}: the calibration gives no force between the initial and the final pressure.`;
      } else {
        totalMm = totalFromInitial({
          measuredMm: readMm,
          initialForceN,
          jackingForceN: gaugeForceN,
          seatingMm: basis === "net" ? setMm : undefined,
        });
      }
    }
    if (!incomplete && outsideRangeMPa.length) {
      incomplete = `End ${record.end}: a gauge reading is outside the calibrated range, so the force reached is not known.`;
    }
    if (incomplete) totalMm = null;

    const comparison =
      totalMm === null || !(predictedMm > 0)
        ? null
        : compareElongation({
            measuredMm: totalMm,
            predictedMm,
            tolerancePct: project.tolerancePct,
            floorMm: project.shortTendonFloorMm ?? undefined,
          });
    // Elongation is proportional to the force (P·L/(A·E) with friction losses proportional to P), the
    // strand inside the jack included, while the wedges' seating is a fixed draw-in: so the reading
    // plus the set, over the elongation at Pj, is the share of Pj reached.
    const forceBasisMm = tautlineGrossMm + gripMm;
    const impliedForceN =
      totalMm === null || !(forceBasisMm > 0) ? null : (specifiedForceN * (totalMm + setMm)) / forceBasisMm;
    return {
      end: record.end,
      record,
      method,
      basis,
      role,
      day,
      calibration,
      calibrationExpired,
      outsideRangeMPa,
      stepFit,
      targetPressureMPa,
      offTargetPct,
      gaugeForceN,
      drawInUsedMm,
      drawInSource,
      drawInDeductedMm,
      totalMm,
      predictedGrossMm,
      gripMm,
      setMm,
      setSource,
      predictedMm,
      comparison,
      forceBasisMm,
      impliedForceN,
      incomplete,
    };
  });

  const incompleteReasons = ends.map((e) => e.incomplete).filter((r): r is string => r !== null);
  let comparison: Comparison | null = null;
  let measuredMm: number | null = null;
  let predictedMm: number | null = null;
  if (ends.length && !incompleteReasons.length) {
    measuredMm = ends.reduce((s, e) => s + (e.totalMm ?? 0), 0);
    predictedMm = ends.reduce((s, e) => s + e.predictedMm, 0);
    comparison = compareElongation({
      measuredMm,
      predictedMm,
      tolerancePct: project.tolerancePct,
      floorMm: project.shortTendonFloorMm ?? undefined,
      jackingForceN: specifiedForceN,
    });
  }
  // Each end read to within half a division; an end read again carries half of the finer division.
  const divisionMm = resolutionStepMm(readingResolution(project.readingResolution));
  const divisionCouldFlip =
    comparison !== null &&
    measuredMm !== null &&
    predictedMm !== null &&
    resolutionEffect({
      measuredMm,
      predictedMm,
      tolerancePct: project.tolerancePct,
      floorMm: project.shortTendonFloorMm ?? undefined,
      resolutionMm: ends.reduce(
        (sum, e) => sum + (e.record.firstReadingMm ? divisionMm * REREAD_FRACTION : divisionMm),
        0,
      ),
    }).couldChangeVerdict;
  const bases = [...new Set(ends.map((e) => e.basis))];
  const basisLabel =
    bases.length === 1
      ? BASIS_WORDS[bases[0]!]
      : bases.length === 0
        ? BASIS_WORDS[project.comparisonBasis]
        : ends.map((e) => `end ${e.end} ${BASIS_WORDS[e.basis]}`).join("; ");
  return {
    ends,
    order,
    missingEnds,
    provisional: missingEnds.length > 0,
    verdict: comparison ? comparison.verdict : "incomplete",
    incomplete: incompleteReasons,
    measuredMm,
    predictedMm,
    comparison,
    basisLabel,
    specifiedForceN,
    specifiedForceSource: specified.source,
    specifiedForceFactor: specified.factor,
    strand,
    grossMm: whole.grossMm,
    netMm,
    meetingPointMm: whole.meetingPointMm,
    divisionCouldFlip,
    rereadWanted: divisionCouldFlip && ends.some((e) => !e.record.firstReadingMm && !e.record.rereadDeclinedReason),
    shopDrawing,
    governs,
    governsNote,
  };
}
