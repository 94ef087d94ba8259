import "server-only";
import { projectBasisFromRow } from "@/lib/stressing/basis";
import type { Db } from "@/db/connect";
import { AppError } from "@/lib/errors";
import type { ProjectSettings } from "@/lib/schemas/project-settings";

export interface ProjectSettingsView extends ProjectSettings {
  id: string;
  code: string;
}

/** A project's settings in SI, as the settings form and the computations read them. */
export async function getProjectSettings(db: Db, projectId: string): Promise<ProjectSettingsView> {
  const p = await db.selectFrom("projects").selectAll().where("id", "=", projectId).executeTakeFirst();
  if (!p) throw new AppError("NOT_FOUND", "No such project.");
  return {
    id: p.id,
    code: p.code,
    name: p.name,
    address: p.address,
    unitSystem: p.unit_system,
    readingResolution: p.reading_resolution,
    ...projectBasisFromRow(p),
    groupTolerancePct: p.group_tolerance_pct,
    calibrationValidityDays: p.calibration_validity_days,
    requiredConcreteMPa: p.required_concrete_mpa,
    engineerOfRecordName: p.engineer_of_record_name,
    engineerOfRecordEmail: p.engineer_of_record_email,
    notifyEmails: p.notify_emails,
    blindEntry: p.blind_entry,
    releaseBy: p.release_by,
    clockSkewMinutes: p.clock_skew_minutes,
    liftoffBandPct: p.liftoff_band_pct,
    shiftEndMinutes: p.shift_end_minutes,
  };
}
