import type { PourReport } from "@/lib/server/get-pour-report";
import {
  basisLines,
  calibrationLines,
  concreteLine,
  concreteResultLines,
  flagLines,
  RECORD_COLUMNS,
  recordRows,
  releaseLine,
  reopeningLines,
  reportTime,
  strandLotLines,
  type RecordColumn,
} from "./pour-rows";
import { countOf } from "@/lib/format/count";
import { groupedCells, openReportPdf, pdfText, type GroupedColumn, type SignatureBlock } from "./pdf-frame";

export { pdfText, type SignatureBlock };

/**
 * The pour's stressing report as a PDF, in the shared frame of lib/reports/pdf-frame.ts (running
 * head, "Page n of m", caution box, the record table's header repeated on every page it runs onto).
 * The summary, basis, equipment and lots flow straight into the record table.
 */

/**
 * The record table's columns on paper: the CSV's columns grouped so a landscape page holds them,
 * each cell the CSV's strings joined line by line. The equipment and the readings as entered, the
 * cells that set a row's height, take the widest columns; every title fits its column whole.
 */
const PDF_COLUMNS: GroupedColumn<RecordColumn>[] = [
  { title: "Tendon, end, stressing", width: 62, from: ["Tendon", "End", "Stressing"] },
  { title: "Stressed, operator", width: 62, from: ["Stressed", "Operator"] },
  { title: "Equipment, calibration", width: 100, from: ["Equipment set", "Jack, gauge, pump", "Calibration"] },
  {
    title: "Gauge: initial, final, target",
    width: 54,
    from: ["Initial pressure", "Final pressure", "Target pressure"],
  },
  { title: "Force: gauge, elongation", width: 54, from: ["Force", "Force from elongation"] },
  { title: "Readings as entered, seating", width: 84, from: ["Readings as entered", "Seating"] },
  { title: "Measured", width: 50, from: ["Measured"] },
  {
    title: "Predicted: Tautline, shop, governs",
    width: 68,
    from: ["Predicted (Tautline)", "Predicted (shop drawing)", "Governs"],
  },
  { title: "Deviation", width: 48, from: ["Deviation"] },
  { title: "Verdict, basis", width: 68, from: ["Verdict", "Basis"] },
  { title: "Breaks, remarks, photos", width: 64, from: ["Wire breaks", "Remarks", "Photos"] },
  { title: "Flags", width: 58, from: ["Flags"] },
];
export async function renderPourPdf(report: PourReport, signature?: SignatureBlock): Promise<Buffer> {
  const pdf = openReportPdf({
    unitSystem: report.project.unitSystem,
    title: `Stressing report ${report.project.code} ${report.pour.name}`,
    subject: `${report.project.name}, ${report.pour.name}`,
    createdAt: signature?.signedAt ?? report.asOf,
  });
  const { doc, font, text, heading, keyValues, caution } = pdf;

  // Page 1: the summary a reader signs against.
  font(true, 16);
  text(`Stressing report: ${report.pour.name}${signature ? ` (revision ${signature.revision})` : ""}`);
  font(false, 11);
  text(`${report.project.name} (${report.project.code})${report.project.address ? `, ${report.project.address}` : ""}`);
  font(false);
  text(
    [
      // A level named "Level 2" prints as it is, not "Level: Level 2".
      report.pour.level
        ? /^level\b/i.test(report.pour.level)
          ? report.pour.level
          : `Level: ${report.pour.level}`
        : null,
      `Pour status: ${report.pour.status}`,
      report.pour.plannedStressingDate ? `Planned stressing: ${report.pour.plannedStressingDate}` : null,
      report.project.engineerOfRecordName ? `Engineer of record: ${report.project.engineerOfRecordName}` : null,
      `Times in ${report.timeZone}`,
      `Content as of ${reportTime(report, report.asOf)}`,
    ]
      .filter((item): item is string => Boolean(item))
      // Each item kept on one line (a date and its time never split); the line wraps between items.
      .map((item) => item.replace(/ /g, "\u00a0"))
      .join("   ·   "),
  );
  text(concreteLine(report));
  doc.moveDown(0.6);
  caution();

  heading("Release");
  text(releaseLine(report));
  for (const line of reopeningLines(report)) text(line);

  const stressed = report.tendons.filter((t) => t.evaluation && !t.evaluation.provisional);
  const count = (v: string) => stressed.filter((t) => t.evaluation?.verdict === v).length;
  const restresses = report.records.filter((r) => r.stressing > 1).length;
  heading("Summary");
  text(
    `${countOf(report.tendons.length, "tendon")} on the schedule; ${stressed.length} evaluated with every end read ` +
      `(${count("in band")} in band, ${count("long")} long, ${count("short")} short); ` +
      `${report.tendons.length - stressed.length} not yet complete. ` +
      `${countOf(report.records.length, "stressing record")}, ${restresses} of them restresses; ` +
      `${countOf(report.liftoffChecks.length, "lift-off check")}, ${countOf(report.detensions.length, "detension")}. ` +
      `${countOf(report.flags.length, "flag")}, ${report.flags.filter((f) => f.status !== "closed").length} still open.`,
  );

  heading("Inspector's signature");
  pdf.signature(
    signature,
    (d) => reportTime(report, d),
    "Not signed. This copy shows the records as they stand; a signed revision is downloaded from the pour's report page.",
  );

  heading("Concrete results");
  pdf.lines(concreteResultLines(report), "No concrete test result has been entered for this pour.");

  heading("Computation basis and its sources");
  keyValues(basisLines(report));

  heading("Equipment sets and calibrations");
  if (!report.equipment.length) text("No equipment set has been used on this pour yet.");
  keyValues(calibrationLines(report));

  heading("Strand lots");
  if (!report.strandLots.length) text("No tendon on this pour names a strand lot; nominal strand values apply.");
  keyValues(strandLotLines(report));

  // Every stressing record, straight after the lots; its header drawn again on every page it runs onto.
  pdf.table(
    "Stressing records, every stressing of every end in order",
    PDF_COLUMNS,
    recordRows(report).map((row) => groupedCells(PDF_COLUMNS, RECORD_COLUMNS, row)),
    "This pour has no tendons on its schedule.",
  );

  heading("Flags and dispositions");
  const flags = flagLines(report);
  if (!flags.length) text("No flag was raised on this pour.");
  for (const f of flags) pdf.group(f.heading, f.lines);

  doc.moveDown(0.6);
  caution();

  return pdf.finish(`${report.project.code} · ${report.pour.name} · stressing report`);
}
