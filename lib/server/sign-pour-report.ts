import "server-only";
import { createHash } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { renderPourPdf } from "@/lib/reports/pour-pdf";
import { reportFileName } from "@/lib/reports/pour-rows";
import { describeChanges, pourSnapshot, type ReportSnapshot } from "@/lib/reports/report-changes";
import type { ReportSignatureInput } from "@/lib/schemas/report-signature";
import { storeGeneratedFile } from "@/lib/storage";
import { getPourReport, type PourReport } from "./get-pour-report";
import { recordAudit } from "./record-audit";

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

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
  const contentSha256 = await reportContentSha256(report);
  const last = await db
    .selectFrom("report_revisions")
    .select(["revision", "content_sha256", "snapshot"])
    .where("project_id", "=", input.projectId)
    .where("pour_id", "=", input.pourId)
    .where("kind", "=", "pour_stressing")
    .orderBy("revision", "desc")
    .limit(1)
    .executeTakeFirst();
  if (last?.content_sha256 === contentSha256) {
    throw new AppError(
      "CONFLICT",
      `Nothing has changed since revision ${last.revision} was signed; download the signed copy instead.`,
    );
  }
  const snapshot = pourSnapshot(report);
  const changes = last ? describeChanges(last.snapshot as ReportSnapshot, snapshot) : [];
  if (last && !changes.length) changes.push("the report's details changed (no record, flag or release changed)");
  const revision = (last?.revision ?? 0) + 1;
  const signedAt = new Date();
  const signed = await renderPourPdf(report, {
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
    name: reportFileName(report, "pdf", revision),
    createdBy: input.signer.id,
  });
  try {
    await db
      .insertInto("report_revisions")
      .values({
        project_id: input.projectId,
        pour_id: input.pourId,
        kind: "pour_stressing",
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
      throw new AppError("CONFLICT", "Someone signed this report a moment ago; reload to see the revision.");
    throw error;
  }
  await recordAudit(db, {
    action: "report.sign",
    outcome: "success",
    actorUserId: input.signer.id,
    projectId: input.projectId,
    target: `pour:${input.pourId}`,
    detail: { revision, fileSha256: stored.sha256, contentSha256 },
  });
  return { revision, fileSha256: stored.sha256, contentSha256, changes };
}
