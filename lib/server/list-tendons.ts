import "server-only";
import type { Db } from "@/db/connect";
import type { TendonSegment } from "@/db/types";
import type { StressingEnds, TendonKind, Verdict } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { predictTendon, projectBasisFromRow, targetPressureMPa } from "@/lib/stressing/basis";
import { listEquipmentSets } from "./list-equipment-sets";

export interface TendonRow {
  id: string;
  tag: string;
  kind: TendonKind;
  strandSize: string;
  strandCount: number;
  segments: TendonSegment[];
  ends: StressingEnds;
  jackGripMm: number | null;
  shopElongationMm: number | null;
  strandLot: string | null;
  /** The member the schedule names, or null. */
  member: string | null;
  /** How the schedule says the two-end tendon is stressed, or null. */
  stressingOrder: "sequential" | "simultaneous" | null;
  /** The schedule's specified jacking force, N, or null (the project's factor of fpu·A). */
  jackingForceN: number | null;
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
): Promise<{ pour: { id: string; name: string }; tendons: TendonRow[] }> {
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
      .select([
        "tolerance_pct",
        "short_tendon_floor_mm",
        "comparison_basis",
        "count_jack_grip",
        "friction_mu",
        "wobble_per_m",
        "anchor_set_mm",
        "jacking_force_factor",
      ])
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
      "tendons.id",
      "tendons.tag",
      "tendons.kind",
      "tendons.strand_size",
      "tendons.strand_count",
      "tendons.segments",
      "tendons.ends",
      "tendons.jack_grip_mm",
      "tendons.shop_elongation_mm",
      "tendons.member",
      "tendons.stressing_order",
      "tendons.jacking_force_n",
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
      let prediction: ReturnType<typeof predictTendon> | null = null;
      try {
        const lot =
          r.area_mm2 && r.modulus_mpa && r.breaking_load_n
            ? { areaMm2: r.area_mm2, modulusMPa: r.modulus_mpa, breakingLoadN: r.breaking_load_n }
            : null;
        prediction = predictTendon({
          project: basis,
          tendon: {
            strandSize: r.strand_size,
            strandCount: r.strand_count,
            segments: r.segments,
            ends: r.ends,
            jackGripMm: r.jack_grip_mm,
            jackingForceN: r.jacking_force_n,
          },
          lot,
        });
      } catch {
        // A schedule row the engine refuses shows no prediction here; the tendon's page says why.
      }
      const evaluation = latest.get(r.id);
      return {
        id: r.id,
        tag: r.tag,
        kind: r.kind,
        strandSize: r.strand_size,
        strandCount: r.strand_count,
        segments: r.segments,
        ends: r.ends,
        jackGripMm: r.jack_grip_mm,
        shopElongationMm: r.shop_elongation_mm,
        strandLot: r.lot_number,
        member: r.member,
        stressingOrder: r.stressing_order,
        jackingForceN: r.jacking_force_n,
        lengthMm: r.segments.reduce((s, x) => s + x.lengthMm, 0),
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
