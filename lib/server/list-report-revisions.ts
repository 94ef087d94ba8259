import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { pourSnapshot } from "@/lib/reports/report-changes";
import { getPourReport, type PourReport } from "./get-pour-report";
import { listSignedRevisions, type ReportStanding } from "./list-signed-revisions";

export type { ReportRevision } from "./list-signed-revisions";

/**
 * The pour's stressing report as it stands, its signed revisions newest first, and whether the report as it
 * stands now is the last one signed or has changed since (and what changed), so a new signature
 * is asked for.
 */
export async function listReportRevisions(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<ReportStanding & { report: PourReport; timeZone: string }> {
  const { report, ...standing } = await listSignedRevisions(
    db,
    { projectId: input.projectId, which: { kind: "pour_stressing", pourId: input.pourId } },
    { report: getPourReport(db, input), render: (r) => renderPourPdf(r), snapshot: pourSnapshot },
  );
  return { report, timeZone: report.timeZone, ...standing };
}
