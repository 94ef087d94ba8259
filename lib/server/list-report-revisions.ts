import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { SignatureBlock } from "@/lib/reports/pdf-frame";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { describeChanges, pourSnapshot, type ReportSnapshot } from "@/lib/reports/report-changes";
import { getPourReport, type PourReport } from "./get-pour-report";
import { sha256 } from "./sign-report-revision";

/** A signed revision: what its signature block prints, and the sha256 of the file as stored. */
export interface ReportRevision extends SignatureBlock {
  fileSha256: string;
}

/**
 * The pour's stressing report as it stands, its signed revisions newest first, and whether the report as it
 * stands now is the last one signed or has changed since (and what changed), so a new signature
 * is asked for.
 */
export async function listReportRevisions(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<{
  report: PourReport;
  timeZone: string;
  revisions: ReportRevision[];
  current: { contentSha256: string; signed: boolean; changesSinceSigned: string[] };
}> {
  const [report, rows] = await Promise.all([
    getPourReport(db, input),
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
      .where("pour_id", "=", input.pourId)
      .where("kind", "=", "pour_stressing")
      .orderBy("revision", "desc")
      .execute(),
  ]);
  const contentSha256 = sha256(await renderPourPdf(report));
  const last = rows[0];
  return {
    report,
    timeZone: report.timeZone,
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
          ? describeChanges(last.snapshot as ReportSnapshot, pourSnapshot(report))
          : [],
    },
  };
}
