import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MPA_PER_PSI } from "@/lib/units";
import { findStrandSize, predictElongation, type TendonInput } from "@/lib/elongation";
import type { LocalRecord } from "@/lib/offline/db";
import { provisionalVerdict } from "@/lib/offline/tendon-view";
import type { FieldProject, FieldTendon } from "@/lib/schemas/sync";
import { planEvaluation, type EvaluatedRecord, type TendonState } from "@/lib/server/evaluate-tendon";

// Property: a reading generated from the prediction itself (the engine's elongation at the
// specified force, turned into what the crew would read by each method) is in band, with no
// deviation, on every basis, reading method and stressing order, on the tablet's path and on the
// server's path, and the two paths give the same numbers to the digit. The force it implies is the
// gauge force. And at any gauge force a reading generated from the prediction at that force
// (elongation proportional to force, P·L/(A·E) with friction losses proportional to P; the seating
// a fixed draw-in) implies that force: elongation and gauge agree, on both paths, and no
// force_disagreement is raised.

const strand = findStrandSize("0.5 in")!;
const PJ = 0.8 * strand.minBreakingStrengthN;
const SLOPE = 6000;
const CAL = {
  id: "0190a0b0-0000-7000-8000-00000000ca11",
  calibratedOn: "2026-11-01",
  validUntil: "2027-04-30",
  slope: SLOPE,
  intercept: 0,
  minPressureMPa: 2,
  maxPressureMPa: 60,
};
const SET_ID = "0190a0b0-0000-7000-8000-0000000000dd";
const GRIP = 457.2;

type EndPlan = {
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

const endPlan = fc.record({
  method: fc.constantFrom("marks" as const, "strokes" as const),
  initialShare: fc.option(fc.double({ min: 0.1, max: 0.3, noNaN: true }), { nil: null }),
  strokes: fc.integer({ min: 1, max: 4 }),
  drawIn: fc.double({ min: 0, max: 8, noNaN: true }),
  typeDrawIn: fc.boolean(),
  seating: fc.option(fc.double({ min: 3, max: 9, noNaN: true }), { nil: null }),
  steps: fc.boolean(),
});

const project: FieldProject = {
  id: "0190a0b0-0000-7000-8000-0000000000aa",
  code: "P",
  name: "Property",
  unitSystem: "si",
  readingResolution: "1mm",
  tolerancePct: 7,
  shortTendonFloorMm: null,
  comparisonBasis: "gross",
  countJackGrip: true,
  frictionMu: 0.07,
  wobblePerM: 0.0033,
  anchorSetMm: 6,
  blindEntry: false,
  timeZone: "America/Denver",
};

/** What the crew reads at one end for a tendon behaving exactly as predicted. */
function perfectReading(plan: EndPlan, grossMm: number, axial: number, setDrawIn: number | null, k = 1) {
  const basisNet = plan.method === "marks";
  const set = plan.seating ?? project.anchorSetMm;
  const grip = basisNet ? 0 : (PJ * GRIP) / axial;
  const fromZero = k * (grossMm + grip); // at the gauge force k·Pj, before seating
  // The initial pressure is a share of the specified force; from zero it is a share k·… of the pull.
  // With gauge steps the marks are set at 20 % of Pj and read again at each step (from a mark 37 mm out).
  const initialShare = plan.steps ? 0.2 : plan.initialShare;
  const share = initialShare === null ? 0 : initialShare / k;
  const sincePi = fromZero * (1 - share);
  const drawIn = plan.typeDrawIn ? plan.drawIn : (setDrawIn ?? 0);
  const measured = basisNet ? sincePi - set : sincePi + (plan.strokes - 1) * drawIn;
  const steps = plan.steps
    ? [0.2, 0.4, 0.6, 0.8, 1].map((f) => ({ pressureMPa: (f * k * PJ) / SLOPE, readingMm: 37 + f * fromZero }))
    : null;
  return { measured, initialMPa: initialShare === null ? null : (initialShare * PJ) / SLOPE, steps };
}

describe("a perfect reading is in band on every basis, method and order", () => {
  // Gauge steps at 20/40/60/80/100 % on marks (net) and on ram travel (gross) are among the plans.
  it("on the tablet and on the server, to the digit", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 8_000, max: 60_000, noNaN: true }),
        fc.double({ min: 0, max: 1.2, noNaN: true }),
        fc.constantFrom("A" as const, "both" as const),
        fc.constantFrom("sequential" as const, "simultaneous" as const),
        endPlan,
        endPlan,
        fc.option(fc.double({ min: 0, max: 8, noNaN: true }), { nil: null }),
        fc.constantFrom(1, 1, 0.9, 0.95, 0.97, 1.02, 1.05),
        fc.double({ min: 0.9, max: 1.05, noNaN: true }),
        (lengthMm, angleRad, ends, order, planA, planB, setDrawIn, kA, kB) => {
          // The gauge force of each end, a share k of the specified force; with kA = 1 both ends are
          // pulled to the specified force and the reading is also the prediction itself (in band, 0 %).
          const kOf = (end: "A" | "B") => (end === "A" ? kA : kA === 1 ? 1 : kB);
          const segments = [{ lengthMm, angleRad }];
          const tendon: FieldTendon = {
            id: "0190a0b0-0000-7000-8000-0000000000cc",
            projectId: project.id,
            pourId: "0190a0b0-0000-7000-8000-0000000000bb",
            tag: "T1",
            kind: "unbonded_monostrand",
            strandSize: "0.5 in",
            strandCount: 1,
            segments,
            ends,
            jackGripMm: GRIP,
            strandLotId: null,
          };
          const engine = (e: TendonInput["ends"]) =>
            predictElongation({
              segments,
              strandAreaMm2: strand.areaMm2,
              strandCount: 1,
              modulusMPa: 28_500_000 * MPA_PER_PSI,
              jackingForceN: PJ,
              wobblePerM: project.wobblePerM,
              mu: project.frictionMu,
              ends: e,
            });
          const whole = engine(ends);
          const grossA =
            ends === "A" ? whole.grossMm : order === "simultaneous" ? whole.perEndMm.A! : engine("A").grossMm;
          const grossB = order === "simultaneous" ? whole.perEndMm.B! : whole.grossMm - engine("A").grossMm;
          const plans: ["A" | "B", EndPlan, number][] =
            ends === "A"
              ? [["A", planA, grossA]]
              : [
                  ["A", planA, grossA],
                  ["B", planB, grossB],
                ];

          const local: LocalRecord[] = plans.map(([end, plan, gross], i) => {
            const r = perfectReading(plan, gross, whole.axialStiffnessN, setDrawIn, kOf(end));
            const id = `0190a0b0-0000-7000-8000-00000000000${i + 1}`;
            return {
              id,
              projectId: project.id,
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
              finalPressureMPa: (kOf(end) * PJ) / SLOPE,
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
            projectId: project.id,
            name: "Jack 1",
            jackSerial: "J",
            gaugeSerial: "G",
            jackGripMm: null,
            drawInMm: setDrawIn,
          };
          const tablet = provisionalVerdict(
            {
              project,
              tendon,
              lot: null,
              set,
              calibrations: [{ ...CAL, projectId: project.id, equipmentSetId: SET_ID }],
            },
            local,
          )!;
          // The force the elongation implies is the gauge force, on every basis and method.
          for (const f of tablet.forces!) {
            expect(f.gaugeForceN).toBeCloseTo(kOf(f.end) * PJ, 6);
            expect(Math.abs(f.impliedForceN! - f.gaugeForceN!)).toBeLessThan(1e-6 * PJ);
            expect(Math.abs(f.differencePct!)).toBeLessThan(1e-6);
          }
          expect(tablet.flagKinds).not.toContain("force_disagreement");
          if (kA === 1) {
            expect(tablet.verdict).toBe("in band");
            expect(Math.abs(tablet.deviationPct!)).toBeLessThan(1e-9);
          }

          const state: TendonState = {
            basis: {
              project: {
                ...project,
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
          const server = planEvaluation(state, { projectId: project.id, tendonId: tendon.id, reason: "property" });
          expect(server.outcome.verdict).toBe(tablet.verdict);
          expect(server.outcome.deviationPct).toBe(tablet.deviationPct);
          expect(server.outcome.flagKinds).not.toContain("force_disagreement");
          const stored = JSON.parse(String(server.evaluation.inputs)) as {
            readings: { end: "A" | "B"; impliedForceN: number; gaugeForceN: number; forceDifferencePct: number }[];
          };
          expect(stored.readings.map((r) => [r.end, r.impliedForceN, r.forceDifferencePct])).toEqual(
            tablet.forces!.map((f) => [f.end, f.impliedForceN, f.differencePct]),
          );
          if (kA === 1) expect(server.outcome.flagKinds).not.toContain("out_of_band");
        },
      ),
      { numRuns: 150 },
    );
  }, 120_000);
});
