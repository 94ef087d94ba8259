import "server-only";
import { createHash } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { renderDailyPdf } from "@/lib/reports/daily-pdf";
import { dailyFileName, dailySnapshot } from "@/lib/reports/daily-rows";
import { describeChanges, type ReportSnapshot } from "@/lib/reports/report-changes";
import type { DailySignatureInput } from "@/lib/schemas/daily-report";
import { storeGeneratedFile } from "@/lib/storage";
import { getDailyReport } from "./get-daily-report";
import { recordAudit } from "./record-audit";

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/**
 * The inspector signs the day's special-inspection report as it stands, with the remarks they
 * typed, by the same mechanism as the pour's stressing report: what is signed is the sha256 of the
 * unsigned report's bytes (same content, same bytes); the signed file (with the signature block)
 * is frozen in the upload store with its own sha256 and a report_revisions row of kind
 * daily_inspection. Signing content already signed is refused; any change since (a record, a
 * flag, the remarks) gives a new revision that says what changed.
 */
export async function signDailyReport(
  db: Kysely<Database>,
  input: { projectId: string; day: string; signer: { id: string }; values: DailySignatureInput },
): Promise<{ revision: number; fileSha256: string; contentSha256: string; changes: string[] }> {
  const report = await getDailyReport(db, { ...input, remarks: input.values.remarks });
  const contentSha256 = sha256(await renderDailyPdf(report));
  const last = await db
    .selectFrom("report_revisions")
    .select(["revision", "content_sha256", "snapshot"])
    .where("project_id", "=", input.projectId)
    .where("kind", "=", "daily_inspection")
    .where("report_day", "=", input.day)
    .orderBy("revision", "desc")
    .limit(1)
    .executeTakeFirst();
  if (last?.content_sha256 === contentSha256) {
    throw new AppError(
      "CONFLICT",
      `Nothing has changed since revision ${last.revision} of ${input.day} was signed; download the signed copy instead.`,
    );
  }
  const snapshot = dailySnapshot(report);
  const changes = last ? describeChanges(last.snapshot as ReportSnapshot, snapshot) : [];
  if (last && !changes.length) changes.push("the report's details changed (no record, flag or remark changed)");
  const revision = (last?.revision ?? 0) + 1;
  const signedAt = new Date();
  const signed = await renderDailyPdf(report, {
    revision,
    signerName: input.values.signerName,
    licence: input.values.licence,
    statement: input.values.statement,
    signedAt,
    contentSha256,
    changes,
  });
  const stored = await storeGeneratedFile(db, {
    projectId: input.projectId,
    purpose: "signed_report",
    contentType: "application/pdf",
    bytes: signed,
    name: dailyFileName(report, "pdf", revision),
    createdBy: input.signer.id,
  });
  try {
    await db
      .insertInto("report_revisions")
      .values({
        project_id: input.projectId,
        pour_id: null,
        kind: "daily_inspection",
        report_day: input.day,
        revision,
        content_sha256: contentSha256,
        file_sha256: stored.sha256,
        snapshot: JSON.stringify(snapshot),
        changes: JSON.stringify(changes),
        attachment_id: stored.id,
        signer_user_id: input.signer.id,
        signer_name: input.values.signerName,
        licence: input.values.licence,
        statement: input.values.statement,
        signed_at: signedAt,
      })
      .execute();
  } catch (error) {
    if ((error as { code?: string }).code === "23505")
      throw new AppError("CONFLICT", "Someone signed this day's report a moment ago; reload to see the revision.");
    throw error;
  }
  await recordAudit(db, {
    action: "report.sign",
    outcome: "success",
    actorUserId: input.signer.id,
    projectId: input.projectId,
    target: `day:${input.day}`,
    detail: { kind: "daily_inspection", revision, fileSha256: stored.sha256, contentSha256 },
  });
  return { revision, fileSha256: stored.sha256, contentSha256, changes };
}
