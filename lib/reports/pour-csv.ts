import Papa from "papaparse";
import { safeRows } from "@/lib/csv/safe-cell";
import type { PourReport } from "@/lib/server/get-pour-report";
import {
  concreteLine,
  concreteResultLines,
  RECORD_COLUMNS,
  recordRows,
  releaseLine,
  reopeningLines,
} from "./pour-rows";
import { signatureLines, type SignatureState } from "./signature-lines";

/**
 * The pour's report as CSV, with the project code and pour on each row: one row per stressing of
 * each tendon end, in order (the original and each restress, with the detensions and lift-off
 * checks in their place; section "stressing"), in the project's display units, the same strings
 * as the PDF's record table; then the concrete (the confirmed strength and each test result), the
 * release with any reopening, and the signature of this content or that it is not signed, each a
 * row with its words in Details.
 */

export const CSV_COLUMNS = ["Project", "Pour", "Section", ...RECORD_COLUMNS, "Details"] as const;

export function pourCsvTable(report: PourReport, signature: SignatureState): { fields: string[]; data: string[][] } {
  const head = (section: string) => [report.project.code, report.pour.name, section];
  const blank = RECORD_COLUMNS.map(() => "");
  const other = (section: string, details: string) => [...head(section), ...blank, details];
  return {
    fields: [...CSV_COLUMNS],
    data: [
      ...recordRows(report).map((row) => [...head("stressing"), ...row, ""]),
      other("concrete", concreteLine(report)),
      ...concreteResultLines(report).map((c) => other("concrete result", c)),
      other("release", releaseLine(report)),
      ...reopeningLines(report).map((r) => other("reopened", r)),
      ...signatureLines(signature, report.timeZone).map(([label, value]) => other("signature", `${label}: ${value}`)),
    ],
  };
}

export function renderPourCsv(report: PourReport, signature: SignatureState): string {
  // Every cell through the one formula guard (lib/csv/safe-cell.ts); signed figures stay as they are.
  const table = pourCsvTable(report, signature);
  return Papa.unparse({ fields: table.fields, data: safeRows(table.data) }, { newline: "\r\n" });
}
