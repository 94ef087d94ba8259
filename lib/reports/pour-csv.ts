import Papa from "papaparse";
import type { PourReport } from "@/lib/server/get-pour-report";
import { RECORD_COLUMNS, recordRows } from "./pour-rows";

/**
 * Text a spreadsheet would run as a formula ("=", "@", a tab, or "+"/"-" not starting a number)
 * gets a leading quote from papaparse; signed figures such as "+1.2 %" stay as they are.
 */
export const FORMULA_START = /^([=@\t\r]|[+\-](?![\d.]))/;

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
  return Papa.unparse(pourCsvTable(report), { escapeFormulae: FORMULA_START, newline: "\r\n" });
}
