import "server-only";
import type { Kysely } from "kysely";
import type { Db } from "@/db/connect";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { StrandLotInput } from "@/lib/schemas/strand-lot";
import { requireStoredAttachment } from "@/lib/storage";

export async function createStrandLot(
  db: Db,
  input: { projectId: string; values: StrandLotInput },
): Promise<{ strandLotId: string }> {
  const v = input.values;
  await requireFreeLotNumber(db, { projectId: input.projectId, lotNumber: v.lotNumber });
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
      ...strandLotColumns(v),
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { strandLotId: row.id };
}

/** A strand lot's columns as the form gives them, on create and on edit. */
export function strandLotColumns(v: StrandLotInput) {
  return {
    lot_number: v.lotNumber,
    strand_size: v.strandSize,
    area_mm2: v.areaMm2,
    modulus_mpa: v.modulusMPa,
    breaking_load_n: v.breakingLoadN,
    certificate_attachment_id: v.certificateAttachmentId,
  };
}

/** Refuses a lot number already registered on the project (`exceptId`: the lot being edited). */
export async function requireFreeLotNumber(
  db: Kysely<Database>,
  input: { projectId: string; lotNumber: string; exceptId?: string },
): Promise<void> {
  const clash = await db
    .selectFrom("strand_lots")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("lot_number", "=", input.lotNumber)
    .$if(input.exceptId !== undefined, (q) => q.where("id", "!=", input.exceptId!))
    .executeTakeFirst();
  if (clash)
    throw new AppError("CONFLICT", `Lot ${input.lotNumber} is registered already.`, {
      lotNumber: ["Already registered on this project."],
    });
}
