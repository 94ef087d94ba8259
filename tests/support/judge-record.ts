import type { JudgeRecord } from "@/lib/stressing/judge";

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
