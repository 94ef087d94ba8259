import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { EquipmentSetInput } from "@/lib/schemas/equipment";

export async function createEquipmentSet(
  db: Db,
  input: { projectId: string; values: Omit<EquipmentSetInput, "drawInMm"> & { drawInMm?: number | null } },
): Promise<{ setId: string }> {
  const v = input.values;
  const clash = await db
    .selectFrom("equipment_sets")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("name", "=", v.name)
    .executeTakeFirst();
  if (clash)
    throw new AppError("CONFLICT", `A set named ${v.name} exists already.`, { name: ["Another set has this name."] });
  const row = await db
    .insertInto("equipment_sets")
    .values({
      project_id: input.projectId,
      name: v.name,
      jack_serial: v.jackSerial,
      gauge_serial: v.gaugeSerial,
      pump_serial: v.pumpSerial,
      jack_grip_mm: v.jackGripMm,
      max_force_n: v.maxForceN,
      draw_in_mm: v.drawInMm ?? null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { setId: row.id };
}
