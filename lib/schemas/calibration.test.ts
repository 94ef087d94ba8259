import { describe, expect, it } from "vitest";
import { addDays, calibrationFromRow, calibrationSchema, pickCalibration, type CalibrationRow } from "./calibration";
import { latestDayAnywhere } from "@/lib/format/dates";

const points = [0, 10, 20, 30].map((p) => ({ pressureMPa: p, forceN: 5000 * p }));
const base = { validUntil: null, points, laboratory: null, certificateAttachmentId: null };

describe("a calibration's date", () => {
  it("refuses a date after today anywhere on Earth, naming calibratedOn", () => {
    const tomorrowEverywhere = addDays(latestDayAnywhere(), 1);
    const parsed = calibrationSchema.safeParse({ ...base, calibratedOn: tomorrowEverywhere });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join("."))).toContain("calibratedOn");
    expect(parsed.error?.issues.find((i) => i.path[0] === "calibratedOn")?.message).toMatch(/future/);
  });

  it("accepts today's date and earlier ones", () => {
    const today = new Date().toISOString().slice(0, 10);
    expect(calibrationSchema.safeParse({ ...base, calibratedOn: today }).success).toBe(true);
    expect(calibrationSchema.safeParse({ ...base, calibratedOn: "2026-06-01" }).success).toBe(true);
  });

  it("reads the latest day anywhere from UTC+14", () => {
    expect(latestDayAnywhere(Date.parse("2026-12-02T09:59:00Z"))).toBe("2026-12-02");
    expect(latestDayAnywhere(Date.parse("2026-12-02T10:00:00Z"))).toBe("2026-12-03");
  });
});

describe("pickCalibration", () => {
  const list = [
    { id: "b", calibratedOn: "2026-06-01" },
    { id: "c", calibratedOn: "2026-11-20" },
    { id: "a", calibratedOn: "2026-11-20" },
    { id: "d", calibratedOn: "2026-12-10" },
    { id: "e", calibratedOn: "2026-11-25", retiredAt: "2026-11-30T12:00:00Z" },
  ];

  it("takes the latest calibration made on or before the day, never a retired one", () => {
    expect(pickCalibration(list, "2026-12-01")?.id).toBe("c");
    expect(pickCalibration(list, "2026-12-10")?.id).toBe("d");
    expect(pickCalibration(list, "2026-07-01")?.id).toBe("b");
    expect(pickCalibration(list, "2026-05-31")).toBeNull();
  });

  it("gives the same answer whatever order the rows come in", () => {
    const reversed = [...list].reverse();
    for (const day of ["2026-11-20", "2026-11-26", "2026-12-11"])
      expect(pickCalibration(reversed, day)?.id).toBe(pickCalibration(list, day)?.id);
  });
});

describe("calibrationFromRow", () => {
  const row: CalibrationRow = {
    id: "c1",
    project_id: "p1",
    equipment_set_id: "s1",
    calibrated_on: "2026-03-02",
    valid_until: "2027-03-01",
    points,
    slope_n_per_mpa: 5000,
    intercept_n: -120,
    r2: 0.9998,
    min_pressure_mpa: 0,
    max_pressure_mpa: 30,
    laboratory: "Site lab",
    certificate_attachment_id: null,
    retired_at: null,
    retired_reason: null,
    replaced_by: null,
  };

  it("names every column in the DTO's words", () => {
    expect(calibrationFromRow(row)).toEqual({
      id: "c1",
      projectId: "p1",
      equipmentSetId: "s1",
      calibratedOn: "2026-03-02",
      validUntil: "2027-03-01",
      points,
      slope: 5000,
      intercept: -120,
      r2: 0.9998,
      minPressureMPa: 0,
      maxPressureMPa: 30,
      laboratory: "Site lab",
      certificateAttachmentId: null,
      retiredAt: null,
      retiredReason: null,
      replacedBy: null,
    });
  });

  it("gives the retirement instant as ISO text whether the row holds a Date or JSON text", () => {
    const asDate = calibrationFromRow({ ...row, retired_at: new Date("2026-04-01T08:30:00Z"), replaced_by: "c2" });
    const asText = calibrationFromRow({ ...row, retired_at: "2026-04-01T08:30:00+00:00", replaced_by: "c2" });
    expect(asDate.retiredAt).toBe("2026-04-01T08:30:00.000Z");
    expect(asText.retiredAt).toBe("2026-04-01T08:30:00.000Z");
    expect(pickCalibration([asDate], "2026-05-01")).toBeNull();
  });
});
