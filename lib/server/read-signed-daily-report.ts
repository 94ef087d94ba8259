import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { readAttachment } from "@/lib/storage";

/** The frozen file of one signed revision of a day's special-inspection report, as it was signed. */
export async function readSignedDailyReport(
  db: Kysely<Database>,
  input: { projectId: string; day: string; revision: number },
) {
  const row = await db
    .selectFrom("report_revisions")
    .select(["attachment_id", "file_sha256"])
    .where("project_id", "=", input.projectId)
    .where("kind", "=", "daily_inspection")
    .where("report_day", "=", input.day)
    .where("revision", "=", input.revision)
    .executeTakeFirst();
  if (!row)
    throw new AppError("NOT_FOUND", `Revision ${input.revision} of the report of ${input.day} has not been signed.`);
  const file = await readAttachment(db, { projectId: input.projectId, attachmentId: row.attachment_id });
  if (file.attachment.sha256 !== row.file_sha256)
    throw new AppError(
      "CONFLICT",
      "The stored file does not match the signed revision's sha256; tell the project admin.",
    );
  return file;
}
