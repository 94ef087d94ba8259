import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { reportFileName } from "@/lib/reports/pour-rows";
import { pourSnapshot } from "@/lib/reports/report-changes";
import type { ReportSignatureInput } from "@/lib/schemas/report-signature";
import { getPourReport, type PourReport } from "./get-pour-report";
import { sha256, signReportRevision } from "./sign-report-revision";

/** What a signature covers: the sha256 of the unsigned report's bytes (same content, same bytes). */
export async function reportContentSha256(report: PourReport): Promise<string> {
  return sha256(await renderPourPdf(report));
}

/** The content hash of a pour's stressing report as it stands now. */
export async function pourReportContentSha256(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<string> {
  return reportContentSha256(await getPourReport(db, input));
}

/**
 * The inspector signs the pour's stressing report as it stands. What is signed is the sha256 of the
 * unsigned report's bytes (the PDF is drawn the same for the same content). The signed file (the
 * report with the signature block: name, licence, statement, time, that sha256 and what changed
 * since the last revision) is frozen in the upload store with its own sha256. Signing content that
 * is already signed is refused; any change since gives a new revision that needs a new signature.
 */
export async function signPourReport(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; signer: { id: string }; values: ReportSignatureInput },
): Promise<{ revision: number; fileSha256: string; contentSha256: string; changes: string[] }> {
  const report = await getPourReport(db, input);
  return signReportRevision(db, {
    ...input,
    report: { kind: "pour_stressing", pourId: input.pourId },
    unsigned: await renderPourPdf(report),
    snapshot: pourSnapshot(report),
    unlisted: "no record, flag or release changed",
    sign: (block) => renderPourPdf(report, block),
    fileName: (revision) => reportFileName(report, "pdf", revision),
  });
}
