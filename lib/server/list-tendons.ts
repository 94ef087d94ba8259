import "server-only";
import type { Db } from "@/db/connect";
import type { Verdict } from "@/lib/schemas/domain";
import { qualified } from "@/lib/schemas/columns";
import { TENDON_COLUMNS, tendonFromRow, type Tendon } from "@/lib/schemas/tendon";
import { AppError } from "@/lib/errors";
import { PREDICTION_BASIS_COLUMNS, predictTendon, projectBasisFromRow, targetPressureMPa } from "@/lib/stressing/basis";
import { listEquipmentSets } from "./list-equipment-sets";

/** A tendon on the pour's list: the one tendon DTO with its lot, length, prediction, targets and latest verdict. */
export interface TendonListItem extends Tendon {
  /** The lot number, or null. */
  strandLot: string | null;
  lengthMm: number;
  /** The prediction on the project's basis and the tendon's lot; null when the schedule cannot be computed. */
  predictedMm: number | null;
  /** The gauge pressure to read on each equipment set with a calibration on file. */
  targets: { set: string; pressureMPa: number | null }[];
  /** The latest evaluation, if any end has been stressed. */
  latest: { verdict: Verdict; deviationPct: number | null; provisional: boolean } | null;
}

/**
 * The tendons of one pour with their lot numbers, predictions, target gauge pressures per set and
 * latest verdicts; 404 when the pour is not the project's.
 */
export async function listTendons(
  db: Db,
  input: { projectId: string; pourId: string },
): Promise<{ pour: { id: string; name: string }; tendons: TendonListItem[] }> {
  const pour = await db
    .selectFrom("pours")
    .select(["id", "name"])
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.pourId)
    .executeTakeFirst();
  if (!pour) throw new AppError("NOT_FOUND", "No such pour on this project.");
  const [project, sets, evaluations] = await Promise.all([
    db
      .selectFrom("projects")
      .select([...PREDICTION_BASIS_COLUMNS, "jacking_force_factor"])
      .where("id", "=", input.projectId)
      .executeTakeFirstOrThrow(),
    listEquipmentSets(db, input.projectId),
    db
      .selectFrom("evaluations")
      .innerJoin("tendons", "tendons.id", "evaluations.tendon_id")
      .select(["evaluations.tendon_id", "evaluations.verdict", "evaluations.deviation_pct", "evaluations.provisional"])
      .distinctOn("evaluations.tendon_id")
      .where("evaluations.project_id", "=", input.projectId)
      .where("tendons.project_id", "=", input.projectId)
      .where("tendons.pour_id", "=", input.pourId)
      .orderBy("evaluations.tendon_id")
      .orderBy("evaluations.created_at", "desc")
      .execute(),
  ]);
  const basis = projectBasisFromRow(project);
  const latest = new Map(evaluations.map((e) => [e.tendon_id, e]));
  const rows = await db
    .selectFrom("tendons")
    .leftJoin("strand_lots", (j) =>
      j.onRef("strand_lots.id", "=", "tendons.strand_lot_id").on("strand_lots.project_id", "=", input.projectId),
    )
    .select([
      ...qualified("tendons", TENDON_COLUMNS),
      "strand_lots.lot_number",
      "strand_lots.area_mm2",
      "strand_lots.modulus_mpa",
      "strand_lots.breaking_load_n",
    ])
    .where("tendons.project_id", "=", input.projectId)
    .where("tendons.pour_id", "=", input.pourId)
    .orderBy("tendons.tag")
    .execute();
  return {
    pour,
    tendons: rows.map((r) => {
      const tendon = tendonFromRow(r);
      let prediction: ReturnType<typeof predictTendon> | null = null;
      try {
        const lot =
          r.area_mm2 && r.modulus_mpa && r.breaking_load_n
            ? { areaMm2: r.area_mm2, modulusMPa: r.modulus_mpa, breakingLoadN: r.breaking_load_n }
            : null;
        prediction = predictTendon({ project: basis, tendon, lot });
      } catch {
        // A schedule row the engine refuses shows no prediction here; the tendon's page says why.
      }
      const evaluation = latest.get(r.id);
      return {
        ...tendon,
        strandLot: r.lot_number,
        lengthMm: tendon.segments.reduce((s, x) => s + x.lengthMm, 0),
        predictedMm: prediction?.predictedMm ?? null,
        targets: sets
          .filter((s) => s.current)
          .map((s) => ({
            set: s.name,
            pressureMPa: prediction && s.current ? targetPressureMPa(s.current, prediction.jackingForceN) : null,
          })),
        latest: evaluation
          ? { verdict: evaluation.verdict, deviationPct: evaluation.deviation_pct, provisional: evaluation.provisional }
          : null,
      };
    }),
  };
}
