import "server-only";
import type { Kysely } from "kysely";
import type { Db } from "@/db/connect";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { TendonInput } from "@/lib/schemas/tendon";
import { lockOpenPour } from "./require-open-pour";

/** Adds one tendon to a pour; the tag must be new in the pour and the lot the project's. */
export async function createTendon(
  db: Db,
  input: { projectId: string; pourId: string; values: TendonInput },
): Promise<{ tendonId: string }> {
  const v = input.values;
  return db.transaction().execute(async (trx) => {
    // The pour's row lock serialises the tag check with other writers of its tendons (the
    // schedule import takes it too), so two at once cannot both pass it.
    await lockOpenPour(trx, input);
    await checkScheduleRow(trx, { projectId: input.projectId, pourId: input.pourId, values: v });
    const row = await trx
      .insertInto("tendons")
      .values({
        project_id: input.projectId,
        pour_id: input.pourId,
        ...scheduleColumns(v),
        member: v.member ?? null,
        stressing_order: v.stressingOrder ?? null,
        jacking_force_n: v.jackingForceN ?? null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    return { tendonId: row.id };
  });
}

/** The columns a schedule row always sets, on create and on edit (the optional ones each write its own way). */
export function scheduleColumns(v: TendonInput) {
  return {
    tag: v.tag,
    kind: v.kind,
    strand_size: v.strandSize,
    strand_count: v.strandCount,
    segments: JSON.stringify(v.segments),
    ends: v.ends,
    jack_grip_mm: v.jackGripMm,
    shop_elongation_mm: v.shopElongationMm,
    strand_lot_id: v.strandLotId,
  };
}

/**
 * What a tendon's schedule row must satisfy on create and on edit: a tag not already in the pour
 * (case aside; `exceptTendonId` for the row being edited) and, when it names one, a strand lot of
 * this project of the tendon's strand size. Run under the pour's row lock.
 */
export async function checkScheduleRow(
  trx: Kysely<Database>,
  input: { projectId: string; pourId: string; values: TendonInput; exceptTendonId?: string },
): Promise<void> {
  const v = input.values;
  const clash = await trx
    .selectFrom("tendons")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("pour_id", "=", input.pourId)
    .$if(input.exceptTendonId !== undefined, (q) => q.where("id", "!=", input.exceptTendonId!))
    .where((eb) => eb(eb.fn("lower", ["tag"]), "=", v.tag.toLowerCase()))
    .executeTakeFirst();
  if (clash)
    throw new AppError("CONFLICT", `The tag ${v.tag} is already in this pour.`, { tag: ["Already in this pour."] });
  if (!v.strandLotId) return;
  const lot = await trx
    .selectFrom("strand_lots")
    .select("strand_size")
    .where("project_id", "=", input.projectId)
    .where("id", "=", v.strandLotId)
    .executeTakeFirst();
  if (!lot)
    throw new AppError("INVALID_INPUT", "Pick a strand lot of this project.", {
      strandLotId: ["Not a lot of this project."],
    });
  if (lot.strand_size !== v.strandSize)
    throw new AppError("INVALID_INPUT", "The lot is another strand size.", {
      strandLotId: [`This lot is ${lot.strand_size} strand.`],
    });
}
