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
import { EQUIPMENT_SET_COLUMNS, equipmentSetFromRow, type EquipmentSet } from "@/lib/schemas/equipment";
import { dayInZone } from "@/lib/format/dates";
import { getProjectTimeZone } from "./get-project-time-zone";

/** A calibration on the equipment screen: the one calibration DTO. */
export type CalibrationView = Calibration;

/** A set on the equipment screen: the one set DTO with its calibrations and their state today. */
export interface EquipmentSetView extends EquipmentSet {
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
      .select(EQUIPMENT_SET_COLUMNS)
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
      ...equipmentSetFromRow(s),
      current,
      state: calibrationState(current?.validUntil ?? null, today),
      history,
    };
  });
}
