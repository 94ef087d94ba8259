import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { StrandLotInput } from "@/lib/schemas/strand-lot";
import { requireStoredAttachment } from "@/lib/storage";

export async function createStrandLot(
  db: Db,
  input: { projectId: string; values: StrandLotInput },
): Promise<{ strandLotId: string }> {
  const v = input.values;
  const clash = await db
    .selectFrom("strand_lots")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("lot_number", "=", v.lotNumber)
    .executeTakeFirst();
  if (clash)
    throw new AppError("CONFLICT", `Lot ${v.lotNumber} is registered already.`, {
      lotNumber: ["Already registered on this project."],
    });
  if (v.certificateAttachmentId) {
    await requireStoredAttachment(db, {
      projectId: input.projectId,
      attachmentId: v.certificateAttachmentId,
      purpose: "mill_certificate",
      field: "certificateAttachmentId",
    });
  }
  const row = await db
    .insertInto("strand_lots")
    .values({
      project_id: input.projectId,
      lot_number: v.lotNumber,
      strand_size: v.strandSize,
      area_mm2: v.areaMm2,
      modulus_mpa: v.modulusMPa,
      breaking_load_n: v.breakingLoadN,
      certificate_attachment_id: v.certificateAttachmentId,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { strandLotId: row.id };
}
