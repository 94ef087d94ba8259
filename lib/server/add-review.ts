import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { FlagKind } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import type { ReviewInput } from "@/lib/schemas/review";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";

/** Flags about the paperwork, which the inspector may close once the cause is found. */
export const PAPERWORK_FLAGS: readonly FlagKind[] = [
  "calibration_expired",
  "calibration_range",
  "concrete_unconfirmed",
  "reading_missing",
];

/**
 * The inspector's findings on a flag, appended to its trail: a note, a re-measured reading, a
 * paperwork error, a photo, sending it on to the engineer, or closing a paperwork-only flag.
 * Findings never change a record: a paperwork correction is a new revision (correct-record.ts).
 */
export async function addReview(
  db: Kysely<Database>,
  input: { projectId: string; flagId: string; author: { id: string }; review: ReviewInput },
): Promise<{ reviewId: string; flagStatus: string }> {
  return inTransaction(db, async (trx) => {
    const flag = await trx
      .selectFrom("flags")
      .select(["id", "kind", "status", "tendon_id"])
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.flagId)
      .forUpdate()
      .executeTakeFirst();
    if (!flag) throw new AppError("NOT_FOUND", "No such flag on this project.");
    if (flag.status === "closed")
      throw new AppError("CONFLICT", "This flag is already closed; its trail can be read but not added to.");
    const { review } = input;

    if (review.kind === "photo") {
      const photo = await trx
        .selectFrom("attachments")
        .select("id")
        .where("project_id", "=", input.projectId)
        .where("id", "=", review.attachmentId)
        .where("status", "=", "stored")
        .executeTakeFirst();
      if (!photo)
        throw new AppError("INVALID_INPUT", "That photo is not uploaded to this project.", {
          attachmentId: ["Upload the photo first."],
        });
    }
    if (review.kind === "closed_paperwork" && !PAPERWORK_FLAGS.includes(flag.kind)) {
      const latest = await trx
        .selectFrom("evaluations")
        .select(["verdict", "provisional"])
        .where("project_id", "=", input.projectId)
        .where("tendon_id", "=", flag.tendon_id)
        .orderBy("created_at", "desc")
        .limit(1)
        .executeTakeFirst();
      const correctedInBand = flag.kind === "out_of_band" && latest?.verdict === "in band" && !latest.provisional;
      if (!correctedInBand) {
        throw new AppError(
          "CONFLICT",
          "Only the engineer of record can close this flag. The inspector closes paperwork flags, or an out-of-band flag once a corrected record is in band.",
        );
      }
    }

    const row = await trx
      .insertInto("reviews")
      .values({
        project_id: input.projectId,
        flag_id: flag.id,
        author_user_id: input.author.id,
        kind: review.kind,
        body: review.body,
        remeasured_mm: review.kind === "remeasured" ? review.remeasuredMm : null,
        attachment_id: review.kind === "photo" ? review.attachmentId : null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();

    let flagStatus: string = flag.status;
    if (review.kind === "sent_to_engineer") {
      flagStatus = "with_engineer";
      await trx
        .updateTable("flags")
        .set({ status: "with_engineer" })
        .where("project_id", "=", input.projectId)
        .where("id", "=", flag.id)
        .execute();
    }
    if (review.kind === "closed_paperwork") {
      flagStatus = "closed";
      await trx
        .updateTable("flags")
        .set({
          status: "closed",
          closed_at: new Date(),
          closed_by: input.author.id,
          close_reason: `Paperwork: ${review.body}`,
        })
        .where("project_id", "=", input.projectId)
        .where("id", "=", flag.id)
        .execute();
    }
    await recordAudit(trx, {
      action: `flag.review.${review.kind}`,
      outcome: "success",
      actorUserId: input.author.id,
      projectId: input.projectId,
      target: flag.id,
    });
    return { reviewId: row.id, flagStatus };
  });
}
