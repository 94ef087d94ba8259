import "server-only";
import type { Db } from "@/db/connect";
import type { StressingEnds, TendonKind, TendonSegment } from "@/db/types";
import { AppError } from "@/lib/errors";

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
  lengthMm: number;
}

/** The tendons of one pour with their lot numbers; 404 when the pour is not the project's. */
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
      "strand_lots.lot_number",
    ])
    .where("tendons.project_id", "=", input.projectId)
    .where("tendons.pour_id", "=", input.pourId)
    .orderBy("tendons.tag")
    .execute();
  return {
    pour,
    tendons: rows.map((r) => ({
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
      lengthMm: r.segments.reduce((s, x) => s + x.lengthMm, 0),
    })),
  };
}
