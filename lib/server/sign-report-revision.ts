import "server-only";
import { createHash } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import type { SignatureBlock } from "@/lib/reports/pdf-frame";
import { describeChanges, type ReportSnapshot } from "@/lib/reports/report-changes";
import type { ReportSignatureInput } from "@/lib/schemas/report-signature";
import { storeGeneratedFile } from "@/lib/storage";
import { recordAudit } from "./record-audit";

export const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/**
 * Signs one report as it stands, for the pour's stressing report and the day's inspection report
 * alike. What is signed is the sha256 of the unsigned report's bytes (same content, same bytes).
 * Signing content already signed is refused; otherwise the signed file (with the signature block
 * and what changed since the last revision) is frozen in the upload store with its own sha256, a
 * report_revisions row records it, and the signature is audited.
 */
export async function signReportRevision(
  db: Kysely<Database>,
  input: {
    projectId: string;
    signer: { id: string };
    values: Pick<ReportSignatureInput, "signerName" | "licence" | "statement">;
    /** Which report: a pour's, or a day's of the project. */
    report: { kind: "pour_stressing"; pourId: string } | { kind: "daily_inspection"; day: string };
    unsigned: Uint8Array;
    snapshot: ReportSnapshot;
    /** What else may have changed when no listed item did, in words: "no record, flag or release changed". */
    unlisted: string;
    sign: (block: SignatureBlock) => Promise<Uint8Array>;
    fileName: (revision: number) => string;
    /** What a daily report's inspector attests (conformance, witness), kept with the revision. */
    attestation?: Record<string, unknown>;
  },
): Promise<{ revision: number; fileSha256: string; contentSha256: string; changes: string[] }> {
  const which = input.report;
  const contentSha256 = sha256(input.unsigned);
  const last = await db
    .selectFrom("report_revisions")
    .select(["revision", "content_sha256", "snapshot"])
    .where("project_id", "=", input.projectId)
    .where("kind", "=", which.kind)
    .$if(which.kind === "pour_stressing", (q) => q.where("pour_id", "=", (which as { pourId: string }).pourId))
    .$if(which.kind === "daily_inspection", (q) => q.where("report_day", "=", (which as { day: string }).day))
    .orderBy("revision", "desc")
    .limit(1)
    .executeTakeFirst();
  const of = which.kind === "daily_inspection" ? ` of ${which.day}` : "";
  if (last?.content_sha256 === contentSha256) {
    throw new AppError(
      "CONFLICT",
      `Nothing has changed since revision ${last.revision}${of} was signed; download the signed copy instead.`,
    );
  }
  const changes = last ? describeChanges(last.snapshot as ReportSnapshot, input.snapshot) : [];
  if (last && !changes.length) changes.push(`the report's details changed (${input.unlisted})`);
  const revision = (last?.revision ?? 0) + 1;
  const signedAt = new Date();
  const signed = await input.sign({ revision, ...input.values, signedAt, contentSha256, changes });
  const stored = await storeGeneratedFile(db, {
    projectId: input.projectId,
    purpose: "signed_report",
    contentType: "application/pdf",
    bytes: signed,
    name: input.fileName(revision),
    createdBy: input.signer.id,
  });
  try {
    await db
      .insertInto("report_revisions")
      .values({
        project_id: input.projectId,
        pour_id: which.kind === "pour_stressing" ? which.pourId : null,
        kind: which.kind,
        ...(which.kind === "daily_inspection" && { report_day: which.day }),
        revision,
        content_sha256: contentSha256,
        file_sha256: stored.sha256,
        snapshot: JSON.stringify(input.snapshot),
        changes: JSON.stringify(changes),
        attachment_id: stored.id,
        signer_user_id: input.signer.id,
        signer_name: input.values.signerName,
        licence: input.values.licence,
        statement: input.values.statement,
        signed_at: signedAt,
        ...(input.attestation && { attestation: JSON.stringify(input.attestation) }),
      })
      .execute();
  } catch (error) {
    if ((error as { code?: string }).code === "23505")
      throw new AppError(
        "CONFLICT",
        `Someone signed this ${which.kind === "daily_inspection" ? "day's report" : "report"} a moment ago; reload to see the revision.`,
      );
    throw error;
  }
  await recordAudit(db, {
    action: "report.sign",
    outcome: "success",
    actorUserId: input.signer.id,
    projectId: input.projectId,
    target: which.kind === "daily_inspection" ? `day:${which.day}` : `pour:${which.pourId}`,
    detail: {
      ...(which.kind === "daily_inspection" && { kind: which.kind }),
      revision,
      fileSha256: stored.sha256,
      contentSha256,
    },
  });
  return { revision, fileSha256: stored.sha256, contentSha256, changes };
}
