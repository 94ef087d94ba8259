import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderPourCsv } from "@/lib/reports/pour-csv";
import { reportFileName } from "@/lib/reports/pour-rows";
import { listReportRevisions } from "./list-report-revisions";

/**
 * The pour's stressing report as CSV as it stands, with the signature of the last signed revision
 * when that revision is of exactly this content (same content sha256), else a row saying it is not
 * signed and, when a revision was signed, that it no longer matches.
 */
export async function getPourCsv(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<{ csv: string; fileName: string }> {
  const { report, revisions, current } = await listReportRevisions(db, input);
  return {
    csv: renderPourCsv(report, { last: revisions[0] ?? null, current: current.signed }),
    fileName: reportFileName(report, "csv"),
  };
}
