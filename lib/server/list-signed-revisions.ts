import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { SignatureBlock } from "@/lib/reports/pdf-frame";
import { describeChanges, type ReportSnapshot } from "@/lib/reports/report-changes";
import { sha256 } from "./sign-report-revision";

/** A signed revision: what its signature block prints, and the sha256 of the file as stored. */
export interface ReportRevision extends SignatureBlock {
  fileSha256: string;
}

/** Which signed report: a pour's stressing report, or a day's inspection report. */
export type SignedReport = { kind: "pour_stressing"; pourId: string } | { kind: "daily_inspection"; day: string };

export interface ReportStanding {
  revisions: ReportRevision[];
  current: { contentSha256: string; signed: boolean; changesSinceSigned: string[] };
}

/**
 * A signed report's revisions, newest first, and whether the report as it stands now (rendered
 * and hashed as the signature would) is the last one signed or has changed since, and what
 * changed, so a new signature is asked for. The report is read beside the revisions.
 */
export async function listSignedRevisions<R>(
  db: Kysely<Database>,
  input: { projectId: string; which: SignedReport },
  standing: {
    report: Promise<R>;
    render: (report: R) => Promise<Uint8Array>;
    snapshot: (report: R) => ReportSnapshot;
  },
): Promise<ReportStanding & { report: R }> {
  const { which } = input;
  const [report, rows] = await Promise.all([
    standing.report,
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
      .where("kind", "=", which.kind)
      .where((eb) =>
        which.kind === "pour_stressing" ? eb("pour_id", "=", which.pourId) : eb("report_day", "=", which.day),
      )
      .orderBy("revision", "desc")
      .execute(),
  ]);
  const contentSha256 = sha256(await standing.render(report));
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
          ? describeChanges(last.snapshot as ReportSnapshot, standing.snapshot(report))
          : [],
    },
  };
}
