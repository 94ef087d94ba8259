import fc from "fast-check";
import { MPA_PER_PSI } from "@/lib/units";
import { findStrandSize, predictElongation, type TendonInput } from "@/lib/elongation";
import type { LocalRecord } from "@/lib/offline/db";
import { provisionalVerdict } from "@/lib/offline/tendon-view";
import type { FieldProject, FieldTendon } from "@/lib/schemas/sync";
import { planEvaluation, type EvaluatedRecord, type TendonState } from "@/lib/server/evaluate-tendon";
import { projectBasis } from "./judge-record";

/**
 * One tendon read as the crew would read it, judged on the tablet's path (`provisionalVerdict`,
 * from IndexedDB's records) and on the server's (`planEvaluation`, from database rows): both end in
 * `judgeAndFlag` (lib/stressing/rules). Shared by the property tests of lib/stressing that generate
 * readings from the engine's own prediction.
 */

export const strand = findStrandSize("0.5 in")!;
export const PJ = 0.8 * strand.minBreakingStrengthN;
export const SLOPE = 6000;
export const CAL = {
  id: "0190a0b0-0000-7000-8000-00000000ca11",
  calibratedOn: "2026-11-01",
  validUntil: "2027-04-30",
  slope: SLOPE,
  intercept: 0,
  minPressureMPa: 1, // below an initial 10 % of a 0.60·fpu·A schedule force
  maxPressureMPa: 60,
};
export const SET_ID = "0190a0b0-0000-7000-8000-0000000000dd";
export const GRIP = 457.2;

export type EndPlan = {
  method: "marks" | "strokes";
  initialShare: number | null;
  strokes: number;
  drawIn: number;
  /** False: the record types no draw-in and the equipment set's is used. */
  typeDrawIn: boolean;
  seating: number | null;
  /** Read also at gauge steps of 20/40/60/80/100 % of the gauge force, the marks set at 20 % of Pj. */
  steps: boolean;
};

export const endPlan = fc.record({
  method: fc.constantFrom("marks" as const, "strokes" as const),
  initialShare: fc.option(fc.double({ min: 0.1, max: 0.3, noNaN: true }), { nil: null }),
  strokes: fc.integer({ min: 1, max: 4 }),
  drawIn: fc.double({ min: 0, max: 8, noNaN: true }),
  typeDrawIn: fc.boolean(),
  seating: fc.option(fc.double({ min: 3, max: 9, noNaN: true }), { nil: null }),
  steps: fc.boolean(),
});

export const project: FieldProject = {
  id: "0190a0b0-0000-7000-8000-0000000000aa",
  code: "P",
  name: "Property",
  unitSystem: "si",
  readingResolution: "1mm",
  ...projectBasis({ comparisonBasis: "gross", countJackGrip: true }),
  blindEntry: false,
  timeZone: "America/Denver",
};

/**
 * What the crew reads at one end for a tendon pulled to k·Pj that stretches `stretch` times what
 * the engine predicts (1: exactly as predicted). The strand inside the jack stretches alike; the
 * seating and the draw-in at each re-grip are what the plan says.
 */
export function perfectReading(
  plan: EndPlan,
  grossMm: number,
  axial: number,
  setDrawIn: number | null,
  k = 1,
  stretch = 1,
  anchorSetMm = project.anchorSetMm,
  pj = PJ,
) {
  const basisNet = plan.method === "marks";
  const set = plan.seating ?? anchorSetMm;
  const grip = basisNet ? 0 : (pj * GRIP) / axial;
  const fromZero = stretch * k * (grossMm + grip); // at the gauge force k·Pj, before seating
  // The initial pressure is a share of the specified force; from zero it is a share k·… of the pull.
  // With gauge steps the marks are set at 20 % of Pj and read again at each step (from a mark 37 mm out).
  const initialShare = plan.steps ? 0.2 : plan.initialShare;
  const share = initialShare === null ? 0 : initialShare / k;
  const sincePi = fromZero * (1 - share);
  const drawIn = plan.typeDrawIn ? plan.drawIn : (setDrawIn ?? 0);
  const measured = basisNet ? sincePi - set : sincePi + (plan.strokes - 1) * drawIn;
  const steps = plan.steps
    ? [0.2, 0.4, 0.6, 0.8, 1].map((f) => ({ pressureMPa: (f * k * pj) / SLOPE, readingMm: 37 + f * fromZero }))
    : null;
  return { measured, initialMPa: initialShare === null ? null : (initialShare * pj) / SLOPE, steps };
}

/**
 * The shape of a generated case: length (mm) and angle change (rad) of its one segment, the ends
 * it is stressed from and in what order, each end's reading plan, and the set's draw-in per
 * re-grip (none: only what a record types). Spread into `fc.property` before a test's own draws.
 */
export const tendonCase = fc.record({
  lengthMm: fc.double({ min: 8_000, max: 60_000, noNaN: true }),
  angleRad: fc.double({ min: 0, max: 1.2, noNaN: true }),
  ends: fc.constantFrom("A" as const, "both" as const),
  order: fc.constantFrom("sequential" as const, "simultaneous" as const),
  planA: endPlan,
  planB: endPlan,
  setDrawIn: fc.option(fc.double({ min: 0, max: 8, noNaN: true }), { nil: null }),
});

export interface ReadingCase {
  lengthMm: number;
  angleRad: number;
  ends: "A" | "both";
  order: "sequential" | "simultaneous";
  planA: EndPlan;
  planB: EndPlan;
  setDrawIn: number | null;
  /** The gauge force of each end as a share of the specified force. */
  kOf: (end: "A" | "B") => number;
  /** How many times the predicted elongation the tendon stretches (1: a perfect reading). */
  stretch?: number;
  /** The project's settings this case changes (its form default basis, its band). */
  project?: Partial<FieldProject>;
  /** The jacking force the tendon's schedule row gives; none: the project's 0.80·fpu·A (PJ). */
  scheduleForceN?: number | null;
}

/** Reads the case's tendon at every end and judges it on the tablet's path and on the server's. */
export function judgeOnBothPaths(c: ReadingCase) {
  const p: FieldProject = { ...project, ...c.project };
  const { lengthMm, angleRad, ends, order, planA, planB, setDrawIn, kOf } = c;
  const pj = c.scheduleForceN ?? PJ;
  const segments = [{ lengthMm, angleRad }];
  const tendon: FieldTendon = {
    id: "0190a0b0-0000-7000-8000-0000000000cc",
    projectId: p.id,
    pourId: "0190a0b0-0000-7000-8000-0000000000bb",
    tag: "T1",
    kind: "unbonded_monostrand",
    strandSize: "0.5 in",
    strandCount: 1,
    segments,
    ends,
    jackGripMm: GRIP,
    strandLotId: null,
    jackingForceN: c.scheduleForceN ?? null,
  };
  const engine = (e: TendonInput["ends"]) =>
    predictElongation({
      segments,
      strandAreaMm2: strand.areaMm2,
      strandCount: 1,
      modulusMPa: 28_500_000 * MPA_PER_PSI,
      jackingForceN: pj,
      wobblePerM: p.wobblePerM,
      mu: p.frictionMu,
      ends: e,
    });
  const whole = engine(ends);
  const grossA = ends === "A" ? whole.grossMm : order === "simultaneous" ? whole.perEndMm.A! : engine("A").grossMm;
  const grossB = order === "simultaneous" ? whole.perEndMm.B! : whole.grossMm - engine("A").grossMm;
  const plans: ["A" | "B", EndPlan, number][] =
    ends === "A"
      ? [["A", planA, grossA]]
      : [
          ["A", planA, grossA],
          ["B", planB, grossB],
        ];

  const local: LocalRecord[] = plans.map(([end, plan, gross], i) => {
    const r = perfectReading(
      plan,
      gross,
      whole.axialStiffnessN,
      setDrawIn,
      kOf(end),
      c.stretch ?? 1,
      p.anchorSetMm,
      pj,
    );
    const id = `0190a0b0-0000-7000-8000-00000000000${i + 1}`;
    return {
      id,
      projectId: p.id,
      pourId: tendon.pourId,
      tendonId: tendon.id,
      tendonEnd: end,
      chainId: id,
      revision: 1,
      baseRecordId: null,
      revisionReason: null,
      equipmentSetId: SET_ID,
      calibrationId: CAL.id,
      expiredCalibrationReason: null,
      initialPressureMPa: r.initialMPa,
      finalPressureMPa: (kOf(end) * pj) / SLOPE,
      readingMethod: plan.method,
      entered: {
        units: { length: "mm", pressure: "MPa" },
        initialPressure: null,
        finalPressure: "x",
        marks: null,
        strokes: plan.method === "strokes" ? Array.from({ length: plan.strokes }, () => "x") : null,
        seating: null,
        ...(r.steps && {
          gaugeSteps: r.steps.map((st) => ({ pressure: "x", reading: "x", ...st })),
        }),
      },
      measuredMm: r.measured,
      seatingMm: plan.seating,
      drawInMm: plan.method === "strokes" && plan.typeDrawIn ? plan.drawIn : null,
      stressingOrder: ends === "both" ? order : null,
      wireBreaks: 0,
      remarks: null,
      deviceTime: `2026-12-02T1${i}:00:00.000Z`,
      deviceTimeZone: "UTC",
      authorUserId: "0190a0b0-0000-7000-8000-000000000001",
      syncState: "pending",
      authorName: "Crew",
      savedAt: "2026-12-02T10:00:00.000Z",
    };
  });
  const set = {
    id: SET_ID,
    projectId: p.id,
    name: "Jack 1",
    jackSerial: "J",
    gaugeSerial: "G",
    jackGripMm: null,
    drawInMm: setDrawIn,
  };
  const tablet = provisionalVerdict(
    {
      project: p,
      tendon,
      lot: null,
      set,
      calibrations: [{ ...CAL, projectId: p.id, equipmentSetId: SET_ID }],
    },
    local,
  )!;

  const state: TendonState = {
    basis: {
      project: {
        ...p,
        readingResolution: "1mm",
        requiredConcreteMPa: null,
        engineerOfRecordName: null,
        engineerOfRecordEmail: null,
        notifyEmails: [],
      },
      pour: { id: tendon.pourId, name: "Pour", concreteStrengthMPa: null, status: "stressing" },
      tendon: { ...tendon, kind: "unbonded_monostrand", shopElongationMm: null },
      lot: null,
    },
    records: local.map((r): EvaluatedRecord => ({
      id: r.id,
      chain_id: r.chainId,
      revision: r.revision,
      tendon_end: r.tendonEnd,
      device_time: new Date(r.deviceTime),
      received_at: new Date(r.deviceTime),
      restress_of_disposition_id: null,
      equipment_set_id: r.equipmentSetId,
      calibration_id: r.calibrationId,
      expired_calibration_reason: null,
      initial_pressure_mpa: r.initialPressureMPa,
      final_pressure_mpa: r.finalPressureMPa,
      measured_mm: r.measuredMm,
      reading_method: r.readingMethod,
      entered: r.entered,
      seating_mm: r.seatingMm,
      draw_in_mm: r.drawInMm ?? null,
      stressing_order: r.stressingOrder ?? null,
      wire_breaks: 0,
    })),
    openFlagKinds: [],
    sets: [
      {
        setId: SET_ID,
        name: "Jack 1",
        jack_grip_mm: null,
        max_force_n: null,
        draw_in_mm: setDrawIn,
        id: CAL.id,
        calibrated_on: CAL.calibratedOn,
        valid_until: CAL.validUntil,
        slope_n_per_mpa: SLOPE,
        intercept_n: 0,
        min_pressure_mpa: CAL.minPressureMPa,
        max_pressure_mpa: CAL.maxPressureMPa,
      },
    ] as TendonState["sets"],
    dispositions: [],
    version: 0,
  };
  const server = planEvaluation(state, { projectId: p.id, tendonId: tendon.id, reason: "property" });
  return { tablet, server, local };
}
