import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { renderDailyCsv } from "@/lib/reports/daily-csv";
import { dailyFileName } from "@/lib/reports/daily-rows";
import { listDailyRevisions } from "./list-daily-revisions";

/**
 * The day's special-inspection report as CSV as it stands, with the signature of the last signed
 * revision when that revision is of exactly this content (same content sha256), else a row saying
 * it is not signed and, when a revision was signed, that it no longer matches.
 */
export async function getDailyCsv(
  db: Kysely<Database>,
  input: { projectId: string; day: string },
): Promise<{ csv: string; fileName: string }> {
  const { report, revisions, current } = await listDailyRevisions(db, input);
  return {
    csv: renderDailyCsv(report, { last: revisions[0] ?? null, current: current.signed }),
    fileName: dailyFileName(report, "csv"),
  };
}
