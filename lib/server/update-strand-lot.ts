import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { StrandLotInput } from "@/lib/schemas/strand-lot";
import { requireStoredAttachment } from "@/lib/storage";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";
import { requireFreeLotNumber, strandLotColumns } from "./create-strand-lot";
import { raiseTendonVersions } from "./evaluate-tendon";
import { reevaluateTendons } from "./reevaluate-project";

/** The lot's values a prediction reads: a change of any of them judges its stressed tendons again. */
const JUDGING_FIELDS = { area_mm2: "area", modulus_mpa: "modulus", strand_size: "strand size" } as const;

/**
 * Corrects a strand lot's mill-certificate values. In the same transaction, every stressed tendon
 * of the lot is judged again with the cause as its reason (new evaluations; flags raised and
 * closed by the rules), and the edit is audited with what changed and how many tendons it touched.
 */
export async function updateStrandLot(
  db: Db,
  input: { projectId: string; strandLotId: string; values: StrandLotInput; by: string },
): Promise<{ strandLotId: string; reevaluated: number; changed: number; closedFlags: number }> {
  const v = input.values;
  return inTransaction(db, async (trx) => {
    const before = await trx
      .selectFrom("strand_lots")
      .selectAll()
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.strandLotId)
      .forUpdate()
      .executeTakeFirst();
    if (!before) throw new AppError("NOT_FOUND", "No such strand lot on this project.");
    await requireFreeLotNumber(trx, {
      projectId: input.projectId,
      lotNumber: v.lotNumber,
      exceptId: input.strandLotId,
    });
    const users = await trx
      .selectFrom("tendons")
      .select(["id", "tag", "strand_size"])
      .where("project_id", "=", input.projectId)
      .where("strand_lot_id", "=", input.strandLotId)
      .execute();
    const otherSize = users.filter((t) => t.strand_size !== v.strandSize);
    if (otherSize.length)
      throw new AppError("INVALID_INPUT", "Tendons of another strand size use this lot.", {
        strandSize: [
          `${otherSize.length} tendon(s) of this lot are ${otherSize[0]!.strand_size} strand (${otherSize
            .slice(0, 5)
            .map((t) => t.tag)
            .join(", ")}${otherSize.length > 5 ? ", …" : ""}).`,
        ],
      });
    if (v.certificateAttachmentId && v.certificateAttachmentId !== before.certificate_attachment_id)
      await requireStoredAttachment(trx, {
        projectId: input.projectId,
        attachmentId: v.certificateAttachmentId,
        purpose: "mill_certificate",
        field: "certificateAttachmentId",
      });
    await trx
      .updateTable("strand_lots")
      .set({
        ...strandLotColumns(v),
      })
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.strandLotId)
      .execute();

    const after = { area_mm2: v.areaMm2, modulus_mpa: v.modulusMPa, strand_size: v.strandSize };
    const moved = (Object.keys(JUDGING_FIELDS) as (keyof typeof JUDGING_FIELDS)[]).filter(
      (k) => before[k] !== after[k],
    );
    // Raising the version of every tendon of the lot holds them until this transaction ends, so a
    // record pushed meanwhile (read on the old values) is refused by its guard and judged again.
    if (moved.length) await raiseTendonVersions(trx, { projectId: input.projectId, strandLotId: input.strandLotId });
    const stressed = moved.length
      ? await trx
          .selectFrom("records")
          .select("tendon_id")
          .distinct()
          .where("project_id", "=", input.projectId)
          .where("tendon_id", "in", (eb) =>
            eb
              .selectFrom("tendons")
              .select("tendons.id")
              .where("tendons.project_id", "=", input.projectId)
              .where("tendons.strand_lot_id", "=", input.strandLotId),
          )
          .execute()
      : [];
    const reason = `strand lot ${v.lotNumber} edited: ${moved.map((k) => JUDGING_FIELDS[k]).join(", ")}`;
    const result = stressed.length
      ? await reevaluateTendons(trx, {
          projectId: input.projectId,
          tendonIds: stressed.map((r) => r.tendon_id),
          reason,
        })
      : { reevaluated: 0, changed: 0, closedFlags: 0 };
    await recordAudit(trx, {
      action: "strand_lot.update",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      target: input.strandLotId,
      detail: {
        lotNumber: v.lotNumber,
        changed: (
          [
            ["lot number", before.lot_number, v.lotNumber],
            ["strand size", before.strand_size, v.strandSize],
            ["area mm2", before.area_mm2, v.areaMm2],
            ["modulus MPa", before.modulus_mpa, v.modulusMPa],
            ["breaking load N", before.breaking_load_n, v.breakingLoadN],
            ["certificate", before.certificate_attachment_id, v.certificateAttachmentId],
          ] as const
        )
          .filter(([, a, b]) => a !== b)
          .map(([field, from, to]) => ({ field, from, to })),
        reevaluated: result.reevaluated,
        verdictsChanged: result.changed,
        flagsClosed: result.closedFlags,
        ...(result.reevaluated && { reason }),
      },
    });
    return { strandLotId: input.strandLotId, ...result };
  });
}
