import type { JudgeRecord } from "@/lib/stressing/judge";
import type { ProjectBasis } from "@/lib/stressing/basis";

/**
 * A record as the judge takes it: end A read by marks at 30 MPa, 100 mm measured, nothing else
 * typed. The fields a test is about replace these (`over`); asking the judge about such a record
 * gives the prediction it compares a reading with.
 */
export function judgeRecord(over: Partial<JudgeRecord> = {}): JudgeRecord {
  return {
    id: "probe",
    chainId: "probe",
    revision: 1,
    end: "A",
    deviceTime: "2026-12-01T16:00:00Z",
    equipmentSetId: "set",
    calibrationId: null,
    expiredCalibrationReason: null,
    readingMethod: "marks",
    initialPressureMPa: null,
    finalPressureMPa: 30,
    measuredMm: 100,
    strokeCount: 1,
    drawInMm: null,
    seatingMm: null,
    stressingOrder: null,
    wireBreaks: 0,
    ...over,
  };
}

/**
 * A project's basis for the judge, as these tests have always written it: the ±7 % band (ACI 318-11
 * §18.20.1, from memory), friction μ = 0.07 and wobble K = 0.0033 per m, a 6 mm anchor set (common
 * practice for greased monostrand), compared net of the set without the jack's grip; `over`
 * changes any of it.
 */
export function projectBasis<T extends Partial<ProjectBasis>>(over: T = {} as T): ProjectBasis & T {
  return {
    tolerancePct: 7,
    shortTendonFloorMm: null,
    comparisonBasis: "net",
    countJackGrip: false,
    frictionMu: 0.07,
    wobblePerM: 0.0033,
    anchorSetMm: 6,
    ...over,
  };
}
