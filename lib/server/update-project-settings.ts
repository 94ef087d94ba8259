import "server-only";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import { inTransaction } from "./in-transaction";
import type { ProjectSettings } from "@/lib/schemas/project-settings";
import { recordAudit } from "./record-audit";
import { reevaluateTendons } from "./reevaluate-project";

/** The settings a verdict depends on: changing any of them judges the stressed tendons again. */
const JUDGING_COLUMNS = [
  "tolerance_pct",
  "short_tendon_floor_mm",
  "friction_mu",
  "wobble_per_m",
  "anchor_set_mm",
  "required_concrete_mpa",
  "time_zone",
  "jacking_force_factor",
  "under_force_pct",
  "seating_excess_mm",
  "governing_value",
  "group_tolerance_pct",
  "wire_loss_limit_pct",
  // The basis the schedule's shop-drawing elongation is stated on (when the shop drawing governs).
  "comparison_basis",
] as const;

export async function updateProjectSettings(
  db: Db,
  input: { projectId: string; values: ProjectSettings; by: string },
): Promise<{ reevaluated: number; changed: number; closedFlags: number }> {
  const v = input.values;
  return inTransaction(db, async (trx) => {
    const before = await trx
      .selectFrom("projects")
      .select(JUDGING_COLUMNS)
      .where("id", "=", input.projectId)
      .forUpdate()
      .executeTakeFirst();
    if (!before) throw new AppError("NOT_FOUND", "No such project.");
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
        ...(v.timeZone !== undefined && { time_zone: v.timeZone }),
        ...(v.jackingForceFactor !== undefined && { jacking_force_factor: v.jackingForceFactor }),
        ...(v.wireLossLimitPct !== undefined && { wire_loss_limit_pct: v.wireLossLimitPct }),
        ...(v.liftoffBandPct !== undefined && { liftoff_band_pct: v.liftoffBandPct }),
        ...(v.underForcePct !== undefined && { under_force_pct: v.underForcePct }),
        ...(v.seatingExcessMm !== undefined && { seating_excess_mm: v.seatingExcessMm }),
        ...(v.clockSkewMinutes !== undefined && { clock_skew_minutes: v.clockSkewMinutes }),
        ...(v.shiftEndMinutes !== undefined && { shift_end_minutes: [...v.shiftEndMinutes].sort((a, b) => a - b) }),
        ...(v.governing !== undefined && { governing_value: v.governing }),
        updated_at: new Date(),
      })
      .where("id", "=", input.projectId)
      .executeTakeFirst();
    if (!updated.numUpdatedRows) throw new AppError("NOT_FOUND", "No such project.");
    const after = await trx
      .selectFrom("projects")
      .select(JUDGING_COLUMNS)
      .where("id", "=", input.projectId)
      .executeTakeFirstOrThrow();
    const moved = JUDGING_COLUMNS.filter((c) => before[c] !== after[c]);
    const reason = `project settings changed: ${moved.map((c) => c.replaceAll("_", " ")).join(", ")}`;
    const result = moved.length
      ? await reevaluateTendons(trx, { projectId: input.projectId, reason })
      : { reevaluated: 0, changed: 0, closedFlags: 0 };
    // Audited with its cause: what moved and how many stressed tendons it judged again.
    await recordAudit(trx, {
      action: "project.configure",
      outcome: "success",
      actorUserId: input.by,
      projectId: input.projectId,
      detail: {
        tolerancePct: v.tolerancePct,
        basis: v.comparisonBasis,
        judgingChanged: moved,
        reevaluated: result.reevaluated,
        verdictsChanged: result.changed,
        flagsClosed: result.closedFlags,
      },
    });
    return result;
  });
}
