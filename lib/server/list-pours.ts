import "server-only";
import type { Db } from "@/db/connect";
import { qualified } from "@/lib/schemas/columns";
import { POUR_COLUMNS, pourFromRow, type Pour } from "@/lib/schemas/pour";

/** A pour on the project's pour list: the one pour DTO with its count of tendons. */
export interface PourSummary extends Pour {
  tendonCount: number;
}

export async function listPours(db: Db, projectId: string): Promise<PourSummary[]> {
  const rows = await db
    .selectFrom("pours")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .leftJoin("tendons", (j) => j.onRef("tendons.pour_id", "=", "pours.id").on("tendons.project_id", "=", projectId))
    .select((eb) => [
      ...qualified("pours", POUR_COLUMNS),
      "pour_states.status",
      eb.fn.count<number>("tendons.id").as("tendon_count"),
    ])
    .where("pours.project_id", "=", projectId)
    .groupBy(["pours.id", "pour_states.status"])
    .orderBy("pours.planned_stressing_date", (o) => o.asc().nullsLast())
    .orderBy("pours.name")
    .execute();
  return rows.map((r) => ({
    ...pourFromRow(r),
    tendonCount: Number(r.tendon_count),
  }));
}
