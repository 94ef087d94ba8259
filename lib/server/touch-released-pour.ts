import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { recordAudit } from "./record-audit";

/**
 * What a release and a reopening both do after writing their own row: touch the pour, which sends
 * its new state to the tablets on their next pull, and audit the change of state on the pour.
 */
export async function touchReleasedPour(
  trx: Kysely<Database>,
  input: { projectId: string; pourId: string; byUserId: string; action: string; detail: Record<string, unknown> },
): Promise<void> {
  await trx
    .updateTable("pours")
    .set({ updated_at: new Date() })
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.pourId)
    .execute();
  await recordAudit(trx, {
    action: input.action,
    outcome: "success",
    actorUserId: input.byUserId,
    projectId: input.projectId,
    target: input.pourId,
    detail: input.detail,
  });
}
