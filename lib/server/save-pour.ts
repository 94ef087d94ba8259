import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { PourInput } from "@/lib/schemas/pour";

function values(v: PourInput) {
  return {
    name: v.name,
    level: v.level,
    area_m2: v.areaM2,
    planned_stressing_date: v.plannedStressingDate,
  };
}

async function assertNameFree(db: Db, projectId: string, name: string, except?: string): Promise<void> {
  let q = db.selectFrom("pours").select("id").where("project_id", "=", projectId).where("name", "=", name);
  if (except) q = q.where("id", "!=", except);
  if (await q.executeTakeFirst())
    throw new AppError("CONFLICT", `A pour named ${name} exists already.`, { name: ["Another pour has this name."] });
}

/** Creates a pour, or updates it when `pourId` is given. */
export async function savePour(
  db: Db,
  input: { projectId: string; pourId?: string; values: PourInput },
): Promise<{ pourId: string }> {
  await assertNameFree(db, input.projectId, input.values.name, input.pourId);
  if (!input.pourId) {
    const row = await db
      .insertInto("pours")
      .values({ project_id: input.projectId, ...values(input.values) })
      .returning("id")
      .executeTakeFirstOrThrow();
    return { pourId: row.id };
  }
  const updated = await db
    .updateTable("pours")
    .set({ ...values(input.values), updated_at: new Date() })
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.pourId)
    .executeTakeFirst();
  if (!updated.numUpdatedRows) throw new AppError("NOT_FOUND", "No such pour on this project.");
  return { pourId: input.pourId };
}
