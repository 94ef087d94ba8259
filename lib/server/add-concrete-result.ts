import "server-only";
import { showStrength } from "@/lib/format/quantities";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { ConcreteResultInput } from "@/lib/schemas/concrete-result";
import { requireStoredAttachment } from "@/lib/storage";
import { concreteGateMet, confirmedStrength, type ConfirmedStrength } from "@/lib/stressing/concrete-strength";
import { inTransaction } from "./in-transaction";
import { recordAudit } from "./record-audit";

export interface ConcreteGate {
  requiredMPa: number | null;
  confirmed: ConfirmedStrength;
  met: boolean;
  /** Open concrete flags of the pour closed by this entry. */
  closedFlags: number;
}

/**
 * Stores one set of the lab's results for a pour, works out the pour's confirmed strength by the
 * rule in lib/stressing/concrete-strength.ts and writes it on the pour (who, when). When the
 * strength reaches the project's required strength, the pour's open concrete flag is closed with
 * the figures as its reason. One transaction; the pour row is held so two entries take turns.
 */
export async function addConcreteResult(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; by: { id: string; name: string }; result: ConcreteResultInput },
): Promise<ConcreteGate & { resultId: string }> {
  return inTransaction(db, async (trx) => {
    const pour = await trx
      .selectFrom("pours")
      .innerJoin("projects", "projects.id", "pours.project_id")
      .select(["pours.id", "projects.required_concrete_mpa", "projects.unit_system"])
      .where("pours.project_id", "=", input.projectId)
      .where("pours.id", "=", input.pourId)
      .forUpdate("pours")
      .executeTakeFirst();
    if (!pour) throw new AppError("NOT_FOUND", "No such pour on this project.");
    const { attachmentId, ...r } = input.result;
    if (attachmentId)
      await requireStoredAttachment(trx, {
        projectId: input.projectId,
        attachmentId,
        purpose: "lab_report",
        field: "attachmentId",
      });

    const row = await trx
      .insertInto("concrete_results")
      .values({
        project_id: input.projectId,
        pour_id: pour.id,
        specimen: r.specimen,
        strength_mpa: r.strengthMPa,
        age_days: r.ageDays,
        specimen_count: r.specimenCount,
        attachment_id: attachmentId ?? null,
        entered_by: input.by.id,
      })
      .returning("id")
      .executeTakeFirstOrThrow();

    const results = await trx
      .selectFrom("concrete_results")
      .select(["strength_mpa", "age_days", "specimen_count"])
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", pour.id)
      .execute();
    const confirmed = confirmedStrength(
      results.map((x) => ({ strengthMPa: x.strength_mpa, ageDays: x.age_days, specimenCount: x.specimen_count })),
    );
    await trx
      .updateTable("pours")
      .set({
        concrete_strength_mpa: confirmed.strengthMPa,
        concrete_confirmed_by: confirmed.strengthMPa === null ? null : input.by.id,
        concrete_confirmed_at: confirmed.strengthMPa === null ? null : new Date(),
        updated_at: new Date(),
      })
      .where("project_id", "=", input.projectId)
      .where("id", "=", pour.id)
      .execute();

    const required = pour.required_concrete_mpa;
    const met = concreteGateMet(confirmed.strengthMPa, required);
    let closedFlags = 0;
    const units = { unitSystem: pour.unit_system };
    if (met && confirmed.strengthMPa !== null) {
      const closed = await trx
        .updateTable("flags")
        .set({
          status: "closed",
          closed_at: new Date(),
          closed_by: input.by.id,
          close_reason:
            `Concrete confirmed by ${input.by.name}: ${showStrength(units, confirmed.strengthMPa)} (${confirmed.basis.toLowerCase().replace(/\.$/, "")})` +
            (required === null ? "." : ` reaches the ${showStrength(units, required)} required before stressing.`),
        })
        .where("project_id", "=", input.projectId)
        .where("pour_id", "=", pour.id)
        .where("kind", "=", "concrete_unconfirmed")
        .where("status", "!=", "closed")
        .executeTakeFirst();
      closedFlags = Number(closed.numUpdatedRows);
    }
    await recordAudit(trx, {
      action: "concrete.confirm",
      outcome: "success",
      actorUserId: input.by.id,
      projectId: input.projectId,
      target: pour.id,
      detail: { resultId: row.id, strengthMPa: confirmed.strengthMPa, met, closedFlags },
    });
    return { resultId: row.id, requiredMPa: required, confirmed, met, closedFlags };
  });
}
