import "server-only";
import type { Db } from "@/db/connect";
import type { CalibrationPoint } from "@/db/types";
import { calibrationState, pickCalibration, type CalibrationState } from "@/lib/schemas/calibration";
import { dayInZone } from "@/lib/format/dates";
import { getProjectTimeZone } from "./get-project-time-zone";

export interface CalibrationView {
  id: string;
  calibratedOn: string;
  validUntil: string;
  points: CalibrationPoint[];
  slope: number;
  intercept: number;
  r2: number;
  minPressureMPa: number;
  maxPressureMPa: number;
  laboratory: string | null;
  certificateAttachmentId: string | null;
  /** Retired (or corrected): never picked again. */
  retiredAt: string | null;
  retiredReason: string | null;
}

export interface EquipmentSetView {
  id: string;
  name: string;
  jackSerial: string;
  gaugeSerial: string;
  pumpSerial: string | null;
  jackGripMm: number | null;
  maxForceN: number | null;
  /** Draw-in per re-grip, the default of ram-travel records that type none. */
  drawInMm: number | null;
  /** The calibration in force today (`pickCalibration`: the newest not retired), the one records use. */
  current: CalibrationView | null;
  state: CalibrationState;
  history: CalibrationView[];
}

/** Today's date at the project's site (its time zone), the day a calibration's state is judged on. */
export async function projectToday(db: Db, projectId: string): Promise<string> {
  return dayInZone(new Date(), await getProjectTimeZone(db, projectId));
}

/** Every set with its calibrations, newest first, and its state today (expired, running out, valid). */
export async function listEquipmentSets(db: Db, projectId: string, day?: string): Promise<EquipmentSetView[]> {
  const today = day ?? (await projectToday(db, projectId));
  const [sets, calibrations] = await Promise.all([
    db
      .selectFrom("equipment_sets")
      .select(["id", "name", "jack_serial", "gauge_serial", "pump_serial", "jack_grip_mm", "max_force_n", "draw_in_mm"])
      .where("project_id", "=", projectId)
      .orderBy("name")
      .execute(),
    db
      .selectFrom("calibrations")
      .select([
        "id",
        "equipment_set_id",
        "calibrated_on",
        "valid_until",
        "points",
        "slope_n_per_mpa",
        "intercept_n",
        "r2",
        "min_pressure_mpa",
        "max_pressure_mpa",
        "laboratory",
        "certificate_attachment_id",
        "retired_at",
        "retired_reason",
      ])
      .where("project_id", "=", projectId)
      .orderBy("calibrated_on", "desc")
      .orderBy("created_at", "desc")
      .execute(),
  ]);
  return sets.map((s) => {
    const history: CalibrationView[] = calibrations
      .filter((c) => c.equipment_set_id === s.id)
      .map((c) => ({
        id: c.id,
        calibratedOn: c.calibrated_on,
        validUntil: c.valid_until,
        points: c.points,
        slope: c.slope_n_per_mpa,
        intercept: c.intercept_n,
        r2: c.r2,
        minPressureMPa: c.min_pressure_mpa,
        maxPressureMPa: c.max_pressure_mpa,
        laboratory: c.laboratory,
        certificateAttachmentId: c.certificate_attachment_id,
        retiredAt: c.retired_at ? new Date(c.retired_at).toISOString() : null,
        retiredReason: c.retired_reason,
      }));
    const current = pickCalibration(history, today);
    return {
      id: s.id,
      name: s.name,
      jackSerial: s.jack_serial,
      gaugeSerial: s.gauge_serial,
      pumpSerial: s.pump_serial,
      jackGripMm: s.jack_grip_mm,
      maxForceN: s.max_force_n,
      drawInMm: s.draw_in_mm,
      current,
      state: calibrationState(current?.validUntil ?? null, today),
      history,
    };
  });
}
