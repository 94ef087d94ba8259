import { z } from "zod";
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
