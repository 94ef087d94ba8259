import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { FlagMailMode } from "@/lib/schemas/domain";
import { queueDigest } from "./queue-shift-digests";
import { recordAudit } from "./record-audit";

/**
 * A member chooses, for themself on one project, one e-mail per flag or a digest per shift.
 * Choosing the digest starts it now: flags raised before were e-mailed already. Going back to
 * one e-mail per flag queues at once a digest of what was raised since the last one, so no flag
 * falls between the two. The member's row is held (FOR UPDATE) while it changes, so a dispatcher
 * composing the same digest waits or skips it. Answers the mode and whether a digest was queued.
 */
export async function setFlagMail(
  db: Kysely<Database>,
  input: { projectId: string; userId: string; mode: FlagMailMode; now?: Date },
): Promise<{ mode: FlagMailMode; digestQueued: boolean }> {
  const now = input.now ?? new Date();
  return db.transaction().execute(async (trx) => {
    const member = await trx
      .selectFrom("project_members")
      .select(["flag_mail", "digest_from"])
      .where("project_id", "=", input.projectId)
      .where("user_id", "=", input.userId)
      .forUpdate()
      .executeTakeFirst();
    if (!member) throw new AppError("NOT_FOUND", "You are not on this project.");
    if (member.flag_mail === input.mode) return { mode: input.mode, digestQueued: false };
    let digestQueued = false;
    if (input.mode === "each" && member.digest_from && +member.digest_from < +now)
      digestQueued = await queueDigest(trx, {
        projectId: input.projectId,
        userId: input.userId,
        from: member.digest_from,
        through: now,
      });
    await trx
      .updateTable("project_members")
      .set({ flag_mail: input.mode, digest_from: input.mode === "digest" ? now : null })
      .where("project_id", "=", input.projectId)
      .where("user_id", "=", input.userId)
      .execute();
    await recordAudit(trx, {
      action: "member.flag_mail",
      outcome: "success",
      actorUserId: input.userId,
      projectId: input.projectId,
      target: input.userId,
      detail: { flagMail: input.mode, digestQueued },
    });
    return { mode: input.mode, digestQueued };
  });
}
