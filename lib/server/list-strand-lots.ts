import "server-only";
import type { Db } from "@/db/connect";
import { qualified } from "@/lib/schemas/columns";
import { STRAND_LOT_COLUMNS, strandLotFromRow, type StrandLot } from "@/lib/schemas/strand-lot";
import { DEFAULT_STRAND_MODULUS_MPA, findStrandSize } from "@/lib/elongation";

/** A lot on the lot list: the one lot DTO with its certificate on file, its use and its change against nominal. */
export interface StrandLotView extends StrandLot {
  /** The mill certificate, when it is stored. */
  certificateAttachmentId: string | null;
  certificateName: string | null;
  tendonCount: number;
  /** Change against ASTM A416 nominal area and the AASHTO default modulus, in %. */
  againstNominal: { areaPct: number; modulusPct: number; areaTimesModulusPct: number; breakingPct: number } | null;
}

export function againstNominal(
  lot: Pick<StrandLot, "strandSize" | "areaMm2" | "modulusMPa" | "breakingLoadN">,
): StrandLotView["againstNominal"] {
  const nominal = findStrandSize(lot.strandSize);
  if (!nominal) return null;
  const e = DEFAULT_STRAND_MODULUS_MPA.aashto;
  const pct = (v: number, n: number) => ((v - n) / n) * 100;
  return {
    areaPct: pct(lot.areaMm2, nominal.areaMm2),
    modulusPct: pct(lot.modulusMPa, e),
    areaTimesModulusPct: pct(lot.areaMm2 * lot.modulusMPa, nominal.areaMm2 * e),
    breakingPct: pct(lot.breakingLoadN, nominal.minBreakingStrengthN),
  };
}

export async function listStrandLots(db: Db, projectId: string): Promise<StrandLotView[]> {
  const rows = await db
    .selectFrom("strand_lots")
    .leftJoin("attachments", (j) =>
      j
        .onRef("attachments.id", "=", "strand_lots.certificate_attachment_id")
        .on("attachments.project_id", "=", projectId)
        .on("attachments.status", "=", "stored"),
    )
    .select((eb) => [
      ...qualified("strand_lots", STRAND_LOT_COLUMNS),
      "attachments.id as attachment_id",
      "attachments.original_name",
      eb
        .selectFrom("tendons")
        .select((t) => t.fn.countAll<number>().as("n"))
        .whereRef("tendons.strand_lot_id", "=", "strand_lots.id")
        .where("tendons.project_id", "=", projectId)
        .as("tendon_count"),
    ])
    .where("strand_lots.project_id", "=", projectId)
    .orderBy("strand_lots.lot_number")
    .execute();
  return rows.map((r) => {
    const lot = strandLotFromRow(r);
    return {
      ...lot,
      certificateAttachmentId: r.attachment_id,
      certificateName: r.original_name,
      tendonCount: Number(r.tendon_count ?? 0),
      againstNominal: againstNominal(lot),
    };
  });
}
