import "server-only";
import type { Db } from "@/db/connect";
import type { PourStatus } from "@/lib/schemas/domain";

export interface PourSummary {
  id: string;
  name: string;
  level: string | null;
  areaM2: number | null;
  plannedStressingDate: string | null;
  status: PourStatus;
  tendonCount: number;
}

export async function listPours(db: Db, projectId: string): Promise<PourSummary[]> {
  const rows = await db
    .selectFrom("pours")
    .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
    .leftJoin("tendons", (j) => j.onRef("tendons.pour_id", "=", "pours.id").on("tendons.project_id", "=", projectId))
    .select((eb) => [
      "pours.id",
      "pours.name",
      "pours.level",
      "pours.area_m2",
      "pours.planned_stressing_date",
      "pour_states.status",
      eb.fn.count<number>("tendons.id").as("tendon_count"),
    ])
    .where("pours.project_id", "=", projectId)
    .groupBy(["pours.id", "pour_states.status"])
    .orderBy("pours.planned_stressing_date", (o) => o.asc().nullsLast())
    .orderBy("pours.name")
    .execute();
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    level: r.level,
    areaM2: r.area_m2,
    plannedStressingDate: r.planned_stressing_date,
    status: r.status,
    tendonCount: Number(r.tendon_count),
  }));
}
