import PDFDocument from "pdfkit";
import { CAUTION_TEXT } from "@/lib/cautions";
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
import { drawTable, pdfText, type SignatureBlock } from "./pour-pdf";

/**
 * The daily special-inspection report as a PDF, drawn like the pour's stressing report (pdfkit's
 * built-in Helvetica, black on white, landscape Letter for US projects and A4 for SI, the record
 * table's header repeated on every page, "Page n of m"). The same content gives the same bytes:
 * the creation date is the content's own time.
 */

const BODY = 9;
const MARGIN = 36;

const PDF_COLUMNS: { title: string; width: number; from: DailyRecordColumn[] }[] = [
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
const LABELS: Partial<Record<DailyRecordColumn, string>> = {
  "Initial pressure": "initial",
  "Final pressure": "final",
  "Target pressure": "target",
  "Predicted (Tautline)": "Tautline",
  "Predicted (shop drawing)": "shop",
  Governs: "governs",
  "Wire breaks": "wire breaks",
  Seating: "seating",
  Force: "gauge",
  "Force from elongation": "elongation",
};

function pdfCells(row: string[]): string[] {
  const value = (c: DailyRecordColumn) => row[DAILY_RECORD_COLUMNS.indexOf(c)] ?? "";
  return PDF_COLUMNS.map((col) =>
    col.from
      .map((c) => (value(c) && LABELS[c] ? `${LABELS[c]}: ${value(c)}` : value(c)))
      .filter(Boolean)
      .join("\n"),
  );
}

export async function renderDailyPdf(report: DailyReport, signature?: SignatureBlock): Promise<Buffer> {
  const doc = new PDFDocument({
    size: report.project.unitSystem === "us" ? "LETTER" : "A4",
    layout: "landscape",
    margins: { top: MARGIN + 14, bottom: MARGIN + 14, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: {
      Title: pdfText(`Daily special-inspection report ${report.project.code} ${report.day}`),
      Author: "Tautline",
      Subject: pdfText(`${report.project.name}, ${report.day}`),
      CreationDate: signature?.signedAt ?? report.asOf,
      ModDate: signature?.signedAt ?? report.asOf,
    },
  });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  const left = doc.page.margins.left;
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const text = (t: string, options: PDFKit.Mixins.TextOptions = {}) => doc.text(pdfText(t), { width, ...options });
  const font = (bold: boolean, size = BODY) =>
    doc
      .font(bold ? "Helvetica-Bold" : "Helvetica")
      .fontSize(size)
      .fillColor("black");
  const heading = (t: string) => {
    if (doc.y + 40 > bottom()) doc.addPage();
    doc.moveDown(0.8);
    font(true, 12);
    text(t);
    doc.moveDown(0.3);
    font(false);
  };
  const keyValues = (rows: [string, string][]) => {
    for (const [k, v] of rows) {
      font(true);
      const kh = doc.heightOfString(pdfText(k), { width: 170 });
      font(false);
      const vh = doc.heightOfString(pdfText(v), { width: width - 180 });
      if (doc.y + Math.max(kh, vh) > bottom()) doc.addPage();
      const top = doc.y;
      font(true);
      doc.text(pdfText(k), left, top, { width: 170 });
      font(false);
      doc.text(pdfText(v), left + 180, top, { width: width - 180 });
      doc.x = left;
      doc.y = top + Math.max(kh, vh) + 2;
    }
  };
  const lines = (items: string[], empty: string) => {
    if (!items.length) text(empty);
    for (const item of items) {
      if (doc.y + 24 > bottom()) doc.addPage();
      text(item);
      doc.moveDown(0.2);
    }
  };
  const caution = () => {
    font(false, 10);
    const h = doc.heightOfString(pdfText(`Caution. ${CAUTION_TEXT}`), { width: width - 16 });
    if (doc.y + h + 12 > bottom()) doc.addPage();
    const top = doc.y;
    doc
      .lineWidth(1.5)
      .strokeColor("black")
      .rect(left, top, width, h + 12)
      .stroke();
    font(true, 10);
    doc.text("Caution. ", left + 8, top + 6, { width: width - 16, continued: true });
    font(false, 10);
    doc.text(pdfText(CAUTION_TEXT));
    doc.x = left;
    doc.y = top + h + 18;
    font(false);
  };

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
      .filter(Boolean)
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
  if (signature) {
    keyValues([
      ["Signed by", `${signature.signerName}, ${signature.licence}`],
      ["Statement", signature.statement],
      ["Signed", dailyTime(report, signature.signedAt)],
      ["Revision", String(signature.revision)],
      ["What changed", signature.changes.length ? signature.changes.join("; ") : "first signed revision"],
      ["Content sha256", signature.contentSha256],
    ]);
  } else {
    text(
      "Not signed. This copy shows the day as it stands, with the remarks of the last signed revision; a signed revision is downloaded from the project's daily report page.",
    );
  }

  heading("Flags raised this day");
  const flags = dailyFlagLines(report);
  if (!flags.length) text("No flag was raised this day.");
  for (const f of flags) {
    if (doc.y + 30 > bottom()) doc.addPage();
    font(true, 10);
    text(f.heading);
    font(false);
    for (const line of f.lines) text(line, { indent: 10 });
    doc.moveDown(0.4);
  }

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

  // Every stressing of the day, its header drawn again at the top of every page it runs onto.
  doc.addPage();
  font(true, 12);
  text("Stressing records of the day, pour by pour, every stressing of every end in order");
  doc.moveDown(0.3);
  const rows = dailyRecordRows(report).map(pdfCells);
  if (!rows.length) {
    font(false);
    text("No stressing was recorded this day.");
  } else drawTable(doc, { left, width, bottom, font, columns: PDF_COLUMNS, rows });
  font(false);
  doc.moveDown(0.8);
  caution();

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const margins = doc.page.margins;
    doc.page.margins = { ...margins, top: 0, bottom: 0 };
    font(false);
    doc.text(pdfText(`${report.project.code} · ${report.day} · daily special-inspection report`), left, MARGIN - 4, {
      width,
      align: "left",
      lineBreak: false,
    });
    doc.text(`Page ${i + 1 - range.start} of ${range.count}`, left, doc.page.height - MARGIN - 4, {
      width,
      align: "right",
      lineBreak: false,
    });
    doc.page.margins = margins;
  }
  doc.end();
  return done;
}
