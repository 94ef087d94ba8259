import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Role } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { inTransaction } from "./in-transaction";
import { lockPour } from "./require-open-pour";
import { touchReleasedPour } from "./touch-released-pour";

/**
 * Reopens a released pour: the engineer of record's act, with a reason, written beside the
 * release it undoes (both append-only) and audited. The pour then takes records and tendons
 * again and may be released anew.
 */
export async function reopenPour(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; by: { id: string; name: string; role: Role }; reason: string },
): Promise<{ reopeningId: string }> {
  if (input.by.role !== "engineer")
    throw new AppError("FORBIDDEN", "Only the engineer of record reopens a released pour.");
  return inTransaction(db, async (trx) => {
    await lockPour(trx, input);
    const state = await trx
      .selectFrom("pour_states")
      .select("release_id")
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .executeTakeFirstOrThrow();
    if (!state.release_id) throw new AppError("CONFLICT", "This pour is not released, so there is nothing to reopen.");
    const row = await trx
      .insertInto("pour_reopenings")
      .values({
        project_id: input.projectId,
        pour_id: input.pourId,
        release_id: state.release_id,
        reopened_by: input.by.id,
        reopened_by_name: input.by.name,
        reason: input.reason,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await touchReleasedPour(trx, {
      projectId: input.projectId,
      pourId: input.pourId,
      byUserId: input.by.id,
      action: "pour.reopen",
      detail: { releaseId: state.release_id, reason: input.reason },
    });
    return { reopeningId: row.id };
  });
}
