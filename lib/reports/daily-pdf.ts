import type { DailyReport } from "@/lib/server/get-daily-report";
import {
  DAILY_RECORD_COLUMNS,
  dailyConcreteLines,
  dailyConformanceLine,
  dailyDispositionLines,
  dailyEquipmentLines,
  dailyFlagLines,
  dailyRecordRows,
  dailySummary,
  dailyTailCutLines,
  dailyTime,
  dailyWitnessLines,
  type DailyRecordColumn,
} from "./daily-rows";
import { groupedCells, openReportPdf, type GroupedColumn, type SignatureBlock } from "./pdf-frame";

/**
 * The daily special-inspection report as a PDF, in the same frame as the pour's stressing report
 * (lib/reports/pdf-frame.ts: running head, "Page n of m", caution box, the record table's header
 * repeated on every page it runs onto). The same content gives the same bytes: the creation date
 * is the content's own time.
 */

const PDF_COLUMNS: GroupedColumn<DailyRecordColumn>[] = [
  { title: "Pour, tendon, end, stressing", width: 70, from: ["Pour", "Tendon", "End", "Stressing"] },
  { title: "Stressed, operator", width: 66, from: ["Stressed", "Operator"] },
  { title: "Method, readings as entered", width: 84, from: ["Method", "Readings as entered", "Seating"] },
  { title: "Equipment set", width: 56, from: ["Equipment set"] },
  {
    title: "Gauge: initial, final, target",
    width: 62,
    from: ["Initial pressure", "Final pressure", "Target pressure"],
  },
  { title: "Force: gauge, elongation", width: 56, from: ["Force", "Force from elongation"] },
  { title: "Measured", width: 52, from: ["Measured"] },
  {
    title: "Predicted: Tautline, shop, governs",
    width: 70,
    from: ["Predicted (Tautline)", "Predicted (shop drawing)", "Governs"],
  },
  { title: "Deviation", width: 46, from: ["Deviation"] },
  { title: "Verdict, basis", width: 66, from: ["Verdict", "Basis"] },
  { title: "Breaks, remarks, photos, flags", width: 90, from: ["Wire breaks", "Remarks", "Photos", "Flags"] },
];
export async function renderDailyPdf(report: DailyReport, signature?: SignatureBlock): Promise<Buffer> {
  const pdf = openReportPdf({
    unitSystem: report.project.unitSystem,
    title: `Daily special-inspection report ${report.project.code} ${report.day}`,
    subject: `${report.project.name}, ${report.day}`,
    createdAt: signature?.signedAt ?? report.asOf,
  });
  const { doc, font, text, heading, keyValues, lines, caution } = pdf;

  // Page 1: what the inspector signs for.
  font(true, 16);
  text(`Daily special-inspection report: ${report.day}${signature ? ` (revision ${signature.revision})` : ""}`);
  font(false, 11);
  text(`${report.project.name} (${report.project.code})${report.project.address ? `, ${report.project.address}` : ""}`);
  font(false);
  text(
    [
      `Post-tensioning: tendon stressing`,
      report.project.engineerOfRecordName ? `Engineer of record: ${report.project.engineerOfRecordName}` : null,
      `Times in ${report.timeZone}`,
      `Content as of ${dailyTime(report, report.asOf)}`,
    ]
      .filter((item): item is string => Boolean(item))
      // Each item kept on one line (a date and its time never split); the line wraps between items.
      .map((item) => item.replace(/ /g, "\u00a0"))
      .join("   ·   "),
  );
  doc.moveDown(0.6);
  caution();

  heading("Summary");
  text(dailySummary(report));

  heading("What was stressed and what the inspector witnessed");
  const witnessed = dailyWitnessLines(report);
  if (!witnessed.length) text("No tendon was stressed this day.");
  keyValues(
    witnessed.map((w) => [
      w.label,
      `Stressed: ${w.stressed}. ${w.stated[0]!.toUpperCase()}${w.stated.slice(1).replace(/\.+$/, "")}.`,
    ]),
  );

  heading("Statement of conformance");
  font(true);
  text(dailyConformanceLine(report));
  font(false);

  heading("Inspector's remarks");
  text(report.remarks || "No remarks.");

  heading("Inspector's signature");
  pdf.signature(
    signature,
    (d) => dailyTime(report, d),
    "Not signed. This copy shows the day as it stands, with the remarks of the last signed revision; a signed revision is downloaded from the project's daily report page.",
  );

  heading("Flags raised this day");
  const flags = dailyFlagLines(report);
  if (!flags.length) text("No flag was raised this day.");
  for (const f of flags) pdf.group(f.heading, f.lines);

  heading("Dispositions recorded this day");
  lines(dailyDispositionLines(report), "No disposition was recorded this day.");

  heading("Equipment sets and calibrations used");
  const equipment = dailyEquipmentLines(report);
  if (!equipment.length) text("No equipment set was used this day.");
  keyValues(equipment);

  heading("Concrete results entered");
  lines(dailyConcreteLines(report), "No concrete result was entered this day.");

  heading("Tails cut");
  lines(dailyTailCutLines(report), "No tendon had its tails cut this day.");

  // Every stressing, lift-off check and detension of the day, straight after; its header drawn again on every page it runs onto.
  pdf.table(
    "Stressing records, lift-off checks and detensions of the day, pour by pour, every end in order",
    PDF_COLUMNS,
    dailyRecordRows(report).map((row) => groupedCells(PDF_COLUMNS, DAILY_RECORD_COLUMNS, row)),
    "No stressing, lift-off check or detension was recorded this day.",
  );
  doc.moveDown(0.8);
  caution();

  return pdf.finish(`${report.project.code} · ${report.day} · daily special-inspection report`);
}
