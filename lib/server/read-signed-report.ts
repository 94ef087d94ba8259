import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { AppError } from "@/lib/errors";
import { readAttachment } from "@/lib/storage";

/** The frozen file of one signed revision of a pour's stressing report, as it was signed. */
export function readSignedReport(db: Kysely<Database>, input: { projectId: string; pourId: string; revision: number }) {
  return readSignedRevision(db, input, `Revision ${input.revision} of this report has not been signed.`);
}

/** The frozen file of one signed revision of a day's special-inspection report, as it was signed. */
export function readSignedDailyReport(
  db: Kysely<Database>,
  input: { projectId: string; day: string; revision: number },
) {
  return readSignedRevision(db, input, `Revision ${input.revision} of the report of ${input.day} has not been signed.`);
}

/** The signed file of a report revision, refused when the stored bytes are not the ones signed. */
async function readSignedRevision(
  db: Kysely<Database>,
  input: { projectId: string; revision: number } & ({ pourId: string } | { day: string }),
  notSigned: string,
) {
  const [column, value, kind] =
    "pourId" in input
      ? (["pour_id", input.pourId, "pour_stressing"] as const)
      : (["report_day", input.day, "daily_inspection"] as const);
  const row = await db
    .selectFrom("report_revisions")
    .select(["attachment_id", "file_sha256"])
    .where("project_id", "=", input.projectId)
    .where(column, "=", value)
    .where("kind", "=", kind)
    .where("revision", "=", input.revision)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", notSigned);
  const file = await readAttachment(db, { projectId: input.projectId, attachmentId: row.attachment_id });
  if (file.attachment.sha256 !== row.file_sha256)
    throw new AppError(
      "CONFLICT",
      "The stored file does not match the signed revision's sha256; tell the project admin.",
    );
  return file;
}
