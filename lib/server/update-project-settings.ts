import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { ProjectSettings } from "@/lib/schemas/project-settings";
import { recordAudit } from "./record-audit";

export async function updateProjectSettings(
  db: Db,
  input: { projectId: string; values: ProjectSettings; by: string },
): Promise<void> {
  const v = input.values;
  await db.transaction().execute(async (trx) => {
    const updated = await trx
      .updateTable("projects")
      .set({
        name: v.name,
        address: v.address,
        unit_system: v.unitSystem,
        reading_resolution: v.readingResolution,
        tolerance_pct: v.tolerancePct,
        group_tolerance_pct: v.groupTolerancePct,
        short_tendon_floor_mm: v.shortTendonFloorMm,
        comparison_basis: v.comparisonBasis,
        count_jack_grip: v.countJackGrip,
        friction_mu: v.frictionMu,
        wobble_per_m: v.wobblePerM,
        anchor_set_mm: v.anchorSetMm,
        calibration_validity_days: v.calibrationValidityDays,
        required_concrete_mpa: v.requiredConcreteMPa,
        engineer_of_record_name: v.engineerOfRecordName,
        engineer_of_record_email: v.engineerOfRecordEmail,
        notify_emails: v.notifyEmails,
        blind_entry: v.blindEntry,
        release_by: v.releaseBy,
        updated_at: new Date(),
      })
      .where("id", "=", input.projectId)
      .executeTakeFirst();
    if (!updated.numUpdatedRows) throw new AppError("NOT_FOUND", "No such project.");
    await recordAudit(trx, {
      action: "project.configure",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      detail: { tolerancePct: v.tolerancePct, basis: v.comparisonBasis },
    });
  });
}
