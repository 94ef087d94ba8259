import "server-only";
import type { Db } from "@/db/connect";
import {
  CALIBRATION_COLUMNS,
  calibrationFromRow,
  calibrationState,
  pickCalibration,
  type Calibration,
  type CalibrationState,
} from "@/lib/schemas/calibration";
import { dayInZone } from "@/lib/format/dates";
import { getProjectTimeZone } from "./get-project-time-zone";

/** A calibration on the equipment screen: the one calibration DTO. */
export type CalibrationView = Calibration;

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
      .select(CALIBRATION_COLUMNS)
      .where("project_id", "=", projectId)
      .orderBy("calibrated_on", "desc")
      .orderBy("created_at", "desc")
      .execute(),
  ]);
  return sets.map((s) => {
    const history: CalibrationView[] = calibrations.filter((c) => c.equipment_set_id === s.id).map(calibrationFromRow);
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
