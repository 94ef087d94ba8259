import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { recordAudit } from "./record-audit";

/** The answer; `At` is how the signing moment travels (a Date here, its ISO text in the browser). */
export type Verification<At = Date> =
  | { match: false }
  | {
      match: true;
      project: string;
      pour: string | null;
      day: string | null;
      revision: number;
      signerName: string;
      licence: string;
      signedAt: At;
      /** False when a later revision has been signed since. */
      latest: boolean;
      /** The latest signed revision when this one is superseded by it; null when this one is the latest. */
      supersededBy: number | null;
    };

/**
 * Says whether a report file (by its sha256, computed from the file the reader holds) is a signed
 * revision, and which. Anyone holding a file may ask; the answer names only what the signed file
 * itself shows. Every question is audited.
 */
export async function verifyReportFile(
  db: Kysely<Database>,
  input: { sha256: string; ip?: string | null },
): Promise<Verification> {
  const row = await db
    .selectFrom("report_revisions as r")
    .innerJoin("projects", "projects.id", "r.project_id")
    .leftJoin("pours", "pours.id", "r.pour_id")
    .select([
      "r.project_id",
      "r.pour_id",
      "r.kind",
      "r.report_day",
      "r.revision",
      "r.signer_name",
      "r.licence",
      "r.signed_at",
      "projects.code",
      "projects.name as projectName",
      "pours.name as pourName",
    ])
    .where("r.file_sha256", "=", input.sha256)
    .orderBy("r.signed_at", "desc")
    .limit(1)
    .executeTakeFirst();
  await recordAudit(db, {
    action: "report.verify",
    outcome: row ? "success" : "failure",
    projectId: row?.project_id ?? null,
    ip: input.ip ?? null,
    detail: { sha256: input.sha256 },
  });
  if (!row) return { match: false };
  let later = db
    .selectFrom("report_revisions")
    .select("revision")
    .where("project_id", "=", row.project_id)
    .where("kind", "=", row.kind)
    .where("revision", ">", row.revision);
  later = row.pour_id ? later.where("pour_id", "=", row.pour_id) : later.where("report_day", "=", row.report_day);
  const newer = await later.orderBy("revision", "desc").limit(1).executeTakeFirst();
  return {
    match: true,
    project: `${row.projectName} (${row.code})`,
    pour: row.pourName,
    day: row.report_day ? new Date(row.report_day).toISOString().slice(0, 10) : null,
    revision: row.revision,
    signerName: row.signer_name,
    licence: row.licence,
    signedAt: new Date(row.signed_at),
    latest: !newer,
    supersededBy: newer?.revision ?? null,
  };
}
