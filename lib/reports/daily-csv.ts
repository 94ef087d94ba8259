import Papa from "papaparse";
import { safeRows } from "@/lib/csv/safe-cell";
import type { DailyReport } from "@/lib/server/get-daily-report";
import { CSV_DAILY_COLUMNS, dailyCsvRows } from "./daily-rows";
import type { SignatureState } from "./signature-lines";

/**
 * The day's inspection report as CSV: one row per stressing, lift-off check and detension recorded
 * that day (section "stressing": the stressing report's rows and columns, with the pour and the
 * reading method), then the flags, dispositions,
 * equipment, concrete results, tail cuts, the inspector's remarks and the signature of this content
 * (or that it is not signed), each a row with its words.
 */
export function renderDailyCsv(report: DailyReport, signature: SignatureState): string {
  // Every cell through the one formula guard (lib/csv/safe-cell.ts).
  return Papa.unparse(
    { fields: [...CSV_DAILY_COLUMNS], data: safeRows(dailyCsvRows(report, signature)) },
    { newline: "\r\n" },
  );
}
