import Papa from "papaparse";
import { safeRows } from "@/lib/csv/safe-cell";
import type { PourReport } from "@/lib/server/get-pour-report";
import { RECORD_COLUMNS, recordRows } from "./pour-rows";

/**
 * The pour's report as CSV: one row per stressing of each tendon end, in order (the original and
 * each restress), in the project's display units, with the project code and pour on each row. The
 * same strings as the PDF's record table.
 */

export const CSV_COLUMNS = ["Project", "Pour", ...RECORD_COLUMNS] as const;

export function pourCsvTable(report: PourReport): { fields: string[]; data: string[][] } {
  return {
    fields: [...CSV_COLUMNS],
    data: recordRows(report).map((row) => [report.project.code, report.pour.name, ...row]),
  };
}

export function renderPourCsv(report: PourReport): string {
  // Every cell through the one formula guard (lib/csv/safe-cell.ts); signed figures stay as they are.
  const table = pourCsvTable(report);
  return Papa.unparse({ fields: table.fields, data: safeRows(table.data) }, { newline: "\r\n" });
}
