import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { AppError } from "@/lib/errors";
import { dayInZone } from "@/lib/format/dates";
import { attestationProblems, dailyFileName, dailySnapshot } from "@/lib/reports/daily-rows";
import type { DailySignatureInput } from "@/lib/schemas/daily-report";
import { getDailyReport } from "./get-daily-report";
import { signReportRevision } from "./sign-report-revision";

/**
 * The inspector signs the day's special-inspection report as it stands, with the remarks they
 * typed, by the same mechanism as the pour's stressing report: what is signed is the sha256 of the
 * unsigned report's bytes (same content, same bytes); the signed file (with the signature block)
 * is frozen in the upload store with its own sha256 and a report_revisions row of kind
 * daily_inspection. The statement of conformance and what was witnessed of each group stressed that
 * day are part of the content (and kept with the revision as its attestation); they are checked
 * against the day first (attestationProblems), naming the field. Signing content already signed is
 * refused; any change since (a record, a flag, the remarks, the attestation) gives a new revision
 * that says what changed.
 */
export async function signDailyReport(
  db: Kysely<Database>,
  input: { projectId: string; day: string; signer: { id: string }; values: DailySignatureInput },
): Promise<{ revision: number; fileSha256: string; contentSha256: string; changes: string[] }> {
  const { conformance, witness, remarks } = input.values;
  const attestation = { conformance, witness };
  const report = await getDailyReport(db, { ...input, remarks, attestation });
  // The route's check only knows the day has begun somewhere on Earth; the site's own day decides.
  if (input.day > dayInZone(Date.now(), report.timeZone)) {
    const message = "That day has not begun on site yet; sign today's report or an earlier day's.";
    throw new AppError("INVALID_INPUT", message, { day: [message] });
  }
  const problems = attestationProblems(report, { ...attestation, remarks });
  if (Object.keys(problems).length)
    throw new AppError("INVALID_INPUT", Object.values(problems).flat()[0] ?? "Check the statement.", problems);
  return signReportRevision(db, {
    ...input,
    attestation,
    report: { kind: "daily_inspection", day: input.day },
    unsigned: await renderDailyPdf(report),
    snapshot: dailySnapshot(report),
    unlisted: "no record, flag or remark changed",
    sign: (block) => renderDailyPdf(report, block),
    fileName: (revision) => dailyFileName(report, "pdf", revision),
  });
}
