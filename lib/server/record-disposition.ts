import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Decision } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import type { DispositionInput } from "@/lib/schemas/review";
import { inTransaction } from "./in-transaction";
import { queueCrewNotice } from "./queue-crew-notice";
import { recordAudit } from "./record-audit";

/** Decisions that settle the flag at once; the others wait for the field work they order. */
const SETTLES: readonly Decision[] = ["accept", "replace", "other"];

/**
 * The engineer of record's disposition of a flag, appended (never edited), with the engineer's
 * name and licence statement. Accept, replace and other close the flag; restress and
 * detension-and-restress keep it with the engineer until the restress is evaluated in band; a
 * lift-off check keeps it until a further disposition.
 */
export async function recordDisposition(
  db: Kysely<Database>,
  input: { projectId: string; flagId: string; engineer: { id: string; name: string }; disposition: DispositionInput },
): Promise<{ dispositionId: string; flagStatus: "closed" | "with_engineer" }> {
  return inTransaction(db, async (trx) => {
    const flag = await trx
      .selectFrom("flags")
      .select(["id", "status", "tendon_id"])
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.flagId)
      .forUpdate()
      .executeTakeFirst();
    if (!flag) throw new AppError("NOT_FOUND", "No such flag on this project.");
    if (flag.status === "closed") throw new AppError("CONFLICT", "This flag is already closed.");
    const { decision, reasons, licenceStatement } = input.disposition;
    const row = await trx
      .insertInto("dispositions")
      .values({
        project_id: input.projectId,
        flag_id: flag.id,
        tendon_id: flag.tendon_id,
        decision,
        reasons,
        engineer_user_id: input.engineer.id,
        engineer_name: input.engineer.name,
        licence_statement: licenceStatement,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const flagStatus = SETTLES.includes(decision) ? "closed" : "with_engineer";
    await trx
      .updateTable("flags")
      .set(
        flagStatus === "closed"
          ? {
              status: "closed",
              closed_at: new Date(),
              closed_by: input.engineer.id,
              close_reason: `Disposition ${decision}: ${reasons}`,
            }
          : { status: "with_engineer" },
      )
      .where("project_id", "=", input.projectId)
      .where("id", "=", flag.id)
      .execute();
    await recordAudit(trx, {
      action: "disposition.create",
      outcome: "success",
      actorUserId: input.engineer.id,
      projectId: input.projectId,
      target: flag.id,
      detail: { decision },
    });
    // The crew and the inspector are told of an order for field work (lib/server/queue-crew-notice.ts).
    await queueCrewNotice(trx, { projectId: input.projectId, notice: { kind: "disposition", dispositionId: row.id } });
    return { dispositionId: row.id, flagStatus };
  });
}
