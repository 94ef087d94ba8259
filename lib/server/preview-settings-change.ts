import "server-only";
import type { Db } from "@/db/connect";
import type { ProjectSettings } from "@/lib/schemas/project-settings";
import { trialRejudging, type RejudgePreview } from "./preview-rejudging";
import { updateProjectSettings } from "./update-project-settings";

/**
 * What saving the project's settings would do to the stored verdicts and flags, without writing
 * anything: the save itself runs in a transaction that is rolled back (see `trialRejudging`). It
 * counts the flags raised and closed as well as the verdicts, since a group-average band or a
 * member's wire-loss limit moves flags and never a tendon's own verdict.
 */
export function previewSettingsChange(
  db: Db,
  input: { projectId: string; values: ProjectSettings; by: string },
): Promise<RejudgePreview> {
  return trialRejudging(db, input.projectId, (trx) => updateProjectSettings(trx, input));
}
