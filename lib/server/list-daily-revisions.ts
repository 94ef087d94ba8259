import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { dailySnapshot } from "@/lib/reports/daily-rows";
import { describeChanges, type ReportSnapshot } from "@/lib/reports/report-changes";
import { getDailyReport, type DailyReport } from "./get-daily-report";
import type { ReportRevision } from "./list-report-revisions";
import { sha256 } from "./sign-report-revision";

/**
 * The day's report as it stands (with the remarks of its last signed revision), its signed
 * revisions newest first, and whether the day as it stands is the last one signed or has changed
 * since (and what changed), so a new signature is asked for.
 */
export async function listDailyRevisions(
  db: Kysely<Database>,
  input: { projectId: string; day: string },
): Promise<{
  report: DailyReport;
  revisions: ReportRevision[];
  current: { contentSha256: string; signed: boolean; changesSinceSigned: string[] };
}> {
  const [report, rows] = await Promise.all([
    getDailyReport(db, input),
    db
      .selectFrom("report_revisions")
      .select([
        "revision",
        "signer_name",
        "licence",
        "statement",
        "signed_at",
        "content_sha256",
        "file_sha256",
        "changes",
        "snapshot",
      ])
      .where("project_id", "=", input.projectId)
      .where("kind", "=", "daily_inspection")
      .where("report_day", "=", input.day)
      .orderBy("revision", "desc")
      .execute(),
  ]);
  const contentSha256 = sha256(await renderDailyPdf(report));
  const last = rows[0];
  return {
    report,
    revisions: rows.map((r) => ({
      revision: r.revision,
      signerName: r.signer_name,
      licence: r.licence,
      statement: r.statement,
      signedAt: new Date(r.signed_at),
      contentSha256: r.content_sha256,
      fileSha256: r.file_sha256,
      changes: r.changes,
    })),
    current: {
      contentSha256,
      signed: last?.content_sha256 === contentSha256,
      changesSinceSigned:
        last && last.content_sha256 !== contentSha256
          ? describeChanges(last.snapshot as ReportSnapshot, dailySnapshot(report))
          : [],
    },
  };
}
