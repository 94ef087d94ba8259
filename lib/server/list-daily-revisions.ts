import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { dailySnapshot } from "@/lib/reports/daily-rows";
import { getDailyReport, type DailyReport } from "./get-daily-report";
import { listSignedRevisions, type ReportStanding } from "./list-signed-revisions";

/**
 * The day's report as it stands (with the remarks of its last signed revision), its signed
 * revisions newest first, and whether the day as it stands is the last one signed or has changed
 * since (and what changed), so a new signature is asked for.
 */
export async function listDailyRevisions(
  db: Kysely<Database>,
  input: { projectId: string; day: string },
): Promise<ReportStanding & { report: DailyReport }> {
  return listSignedRevisions(
    db,
    { projectId: input.projectId, which: { kind: "daily_inspection", day: input.day } },
    { report: getDailyReport(db, input), render: (r) => renderDailyPdf(r), snapshot: dailySnapshot },
  );
}
