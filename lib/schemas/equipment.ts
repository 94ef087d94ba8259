import type { Selectable } from "kysely";
import { z } from "zod";
import type { EquipmentSetsTable } from "@/db/types";
import { plainText } from "./tendon";

export const equipmentSetSchema = z.strictObject({
  name: plainText("set name", 80),
  jackSerial: plainText("jack serial", 60),
  gaugeSerial: plainText("gauge serial", 60),
  pumpSerial: plainText("pump serial", 60).nullable(),
  jackGripMm: z
    .number({ error: "Give the grip length." })
    .min(0, "The grip length cannot be negative.")
    .max(2000, "A grip over 2 m looks wrong.")
    .nullable(),
  maxForceN: z
    .number({ error: "Give the jack's rated force." })
    .positive("The rated force must be above 0.")
    .max(20_000_000, "That force looks wrong.")
    .nullable(),
  /** Wedge draw-in lost at each re-grip between strokes: the default of ram-travel records that type none. */
  drawInMm: z
    .number({ error: "Give the draw-in per re-grip." })
    .finite()
    .nonnegative("Draw-in cannot be negative.")
    .max(49, "Draw-in over 49 mm per re-grip is not a reading.")
    .nullable()
    .default(null),
});
export type EquipmentSetInput = z.infer<typeof equipmentSetSchema>;

export const equipmentParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  setId: z.uuid({ error: "Not an equipment set id." }),
});

/**
 * An equipment set as every reader gets it (the tablet's pull, the equipment list, the stressing
 * report): the one DTO, made from a row by `equipmentSetFromRow` only. Its calibrations are
 * `Calibration`s (lib/schemas/calibration.ts).
 */
export interface EquipmentSet {
  id: string;
  projectId: string;
  name: string;
  jackSerial: string;
  gaugeSerial: string;
  pumpSerial: string | null;
  jackGripMm: number | null;
  /** The jack's rated force, N. */
  maxForceN: number | null;
  /** Draw-in per re-grip, the default of ram-travel records that type none. */
  drawInMm: number | null;
}

/** The columns `equipmentSetFromRow` reads: select these (`.select(EQUIPMENT_SET_COLUMNS)`). */
export const EQUIPMENT_SET_COLUMNS = [
  "id",
  "project_id",
  "name",
  "jack_serial",
  "gauge_serial",
  "pump_serial",
  "jack_grip_mm",
  "max_force_n",
  "draw_in_mm",
] as const satisfies readonly (keyof EquipmentSetsTable)[];

export type EquipmentSetRow = Pick<Selectable<EquipmentSetsTable>, (typeof EQUIPMENT_SET_COLUMNS)[number]>;

export function equipmentSetFromRow(row: EquipmentSetRow): EquipmentSet {
  return {
    id: row.id,
    projectId: row.project_id,
    name: row.name,
    jackSerial: row.jack_serial,
    gaugeSerial: row.gauge_serial,
    pumpSerial: row.pump_serial,
    jackGripMm: row.jack_grip_mm,
    maxForceN: row.max_force_n,
    drawInMm: row.draw_in_mm,
  };
}

/** The set as a record, a lift-off check or a detension names it on the report. */
export type EquipmentNamed = Pick<EquipmentSet, "name" | "jackSerial" | "gaugeSerial" | "pumpSerial">;

/** The naming columns of a set read beside a record, a lift-off check or a detension. */
export function equipmentNamedFromRow(
  row: Pick<Selectable<EquipmentSetsTable>, "name" | "jack_serial" | "gauge_serial" | "pump_serial">,
): EquipmentNamed {
  return { name: row.name, jackSerial: row.jack_serial, gaugeSerial: row.gauge_serial, pumpSerial: row.pump_serial };
}
