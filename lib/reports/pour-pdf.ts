import PDFDocument from "pdfkit";
import { CAUTION_TEXT } from "@/lib/cautions";
import type { PourReport } from "@/lib/server/get-pour-report";
import {
  basisLines,
  calibrationLines,
  concreteLine,
  flagLines,
  RECORD_COLUMNS,
  recordRows,
  releaseLine,
  reportTime,
  strandLotLines,
  type RecordColumn,
} from "./pour-rows";
import { countOf } from "@/lib/format/count";

/**
 * The pour's stressing report as a PDF, drawn with pdfkit's built-in Helvetica: black on white,
 * 9 pt and up, the tendon table's header repeated on every page, "Page n of m" on each page.
 * Landscape Letter for projects in US units, landscape A4 for SI.
 */

const BODY = 9;
const MARGIN = 36;
const PAD = 2;

/**
 * The record table's columns on paper: the CSV's columns grouped so a landscape page holds them,
 * each cell the CSV's strings joined line by line.
 */
const PDF_COLUMNS: { title: string; width: number; from: RecordColumn[] }[] = [
  { title: "Tendon, end, stressing", width: 62, from: ["Tendon", "End", "Stressing"] },
  { title: "Stressed, operator", width: 62, from: ["Stressed", "Operator"] },
  { title: "Equipment, calibration", width: 94, from: ["Equipment set", "Jack, gauge, pump", "Calibration"] },
  {
    title: "Gauge: initial, final, target",
    width: 54,
    from: ["Initial pressure", "Final pressure", "Target pressure"],
  },
  { title: "Force: gauge, elongation", width: 54, from: ["Force", "Force from elongation"] },
  { title: "Readings as entered, seating", width: 74, from: ["Readings as entered", "Seating"] },
  { title: "Measured", width: 56, from: ["Measured"] },
  {
    title: "Predicted: Tautline, shop, governs",
    width: 68,
    from: ["Predicted (Tautline)", "Predicted (shop drawing)", "Governs"],
  },
  { title: "Deviation", width: 48, from: ["Deviation"] },
  { title: "Verdict, basis", width: 68, from: ["Verdict", "Basis"] },
  { title: "Breaks, remarks, photos", width: 70, from: ["Wire breaks", "Remarks", "Photos"] },
  { title: "Flags", width: 62, from: ["Flags"] },
];
const LABELLED = new Set<RecordColumn>([
  "Initial pressure",
  "Final pressure",
  "Target pressure",
  "Predicted (Tautline)",
  "Predicted (shop drawing)",
  "Governs",
  "Wire breaks",
  "Seating",
  "Force",
  "Force from elongation",
]);
const LABELS: Partial<Record<RecordColumn, string>> = {
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
  const value = (c: RecordColumn) => row[RECORD_COLUMNS.indexOf(c)] ?? "";
  return PDF_COLUMNS.map((col) =>
    col.from
      .map((c) => (value(c) && LABELLED.has(c) ? `${LABELS[c]}: ${value(c)}` : value(c)))
      .filter(Boolean)
      .join("\n"),
  );
}

/** What the signer typed and when, printed on a signed revision. */
export interface SignatureBlock {
  revision: number;
  signerName: string;
  licence: string;
  statement: string;
  signedAt: Date;
  contentSha256: string;
  changes: string[];
}

/**
 * The standard PDF fonts carry WinAnsi characters only: the minus sign, the Greek mu and the
 * multiplication cross are mapped to characters they have.
 */
export function pdfText(text: string): string {
  return text
    .replace(/\u2212/g, "-")
    .replace(/\u03bc/g, "\u00b5")
    .replace(/\u2192/g, "->")
    .replace(/[\u2018\u2019]/g, "'")
    .replace(/[\u201c\u201d]/g, '"')
    .replace(/[^\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2022\u2026\u00d7\n]/g, "?");
}

export async function renderPourPdf(report: PourReport, signature?: SignatureBlock): Promise<Buffer> {
  const doc = new PDFDocument({
    size: report.project.unitSystem === "us" ? "LETTER" : "A4",
    layout: "landscape",
    margins: { top: MARGIN + 14, bottom: MARGIN + 14, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: {
      Title: pdfText(`Stressing report ${report.project.code} ${report.pour.name}`),
      Author: "Tautline",
      Subject: pdfText(`${report.project.name}, ${report.pour.name}`),
      // Fixed to the content's own time, so the same content always gives the same bytes.
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
  const text = (t: string, options: PDFKit.Mixins.TextOptions = {}) => doc.text(pdfText(t), options);
  const font = (bold: boolean, size = BODY) =>
    doc
      .font(bold ? "Helvetica-Bold" : "Helvetica")
      .fontSize(size)
      .fillColor("black");
  const heading = (t: string) => {
    if (doc.y + 40 > bottom()) doc.addPage();
    doc.moveDown(0.8);
    font(true, 12);
    text(t, { width });
    doc.moveDown(0.3);
    font(false);
  };
  const keyValues = (rows: [string, string][]) => {
    for (const [k, v] of rows) {
      const y = doc.y;
      font(true);
      const kh = doc.heightOfString(pdfText(k), { width: 170 });
      font(false);
      const vh = doc.heightOfString(pdfText(v), { width: width - 180 });
      if (y + Math.max(kh, vh) > bottom()) doc.addPage();
      const top = doc.y;
      font(true);
      doc.text(pdfText(k), left, top, { width: 170 });
      font(false);
      doc.text(pdfText(v), left + 180, top, { width: width - 180 });
      doc.x = left;
      doc.y = top + Math.max(kh, vh) + 2;
    }
  };
  const caution = () => {
    font(false, 10);
    const body = `Caution. ${CAUTION_TEXT}`;
    const h = doc.heightOfString(pdfText(body), { width: width - 16 });
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

  // Page 1: the summary a reader signs against.
  font(true, 16);
  text(`Stressing report: ${report.pour.name}${signature ? ` (revision ${signature.revision})` : ""}`, { width });
  font(false, 11);
  text(
    `${report.project.name} (${report.project.code})${report.project.address ? `, ${report.project.address}` : ""}`,
    { width },
  );
  font(false);
  text(
    [
      report.pour.level ? `Level: ${report.pour.level}` : null,
      `Pour status: ${report.pour.status}`,
      report.pour.plannedStressingDate ? `Planned stressing: ${report.pour.plannedStressingDate}` : null,
      report.project.engineerOfRecordName ? `Engineer of record: ${report.project.engineerOfRecordName}` : null,
      `Content as of ${reportTime(report, report.asOf)}`,
    ]
      .filter(Boolean)
      .join("   ·   "),
    { width },
  );
  text(concreteLine(report), { width });
  doc.moveDown(0.6);
  caution();

  heading("Release");
  text(releaseLine(report), { width });

  const stressed = report.tendons.filter((t) => t.evaluation && !t.evaluation.provisional);
  const count = (v: string) => stressed.filter((t) => t.evaluation?.verdict === v).length;
  const restresses = report.records.filter((r) => r.stressing > 1).length;
  heading("Summary");
  text(
    `${countOf(report.tendons.length, "tendon")} on the schedule; ${stressed.length} evaluated with every end read ` +
      `(${count("in band")} in band, ${count("long")} long, ${count("short")} short); ` +
      `${report.tendons.length - stressed.length} not yet complete. ` +
      `${countOf(report.records.length, "stressing record")}, ${restresses} of them restresses or lift-offs. ` +
      `${countOf(report.flags.length, "flag")}, ${report.flags.filter((f) => f.status !== "closed").length} still open.`,
    { width },
  );

  heading("Inspector's signature");
  if (signature) {
    keyValues([
      ["Signed by", `${signature.signerName}, ${signature.licence}`],
      ["Statement", signature.statement],
      ["Signed", reportTime(report, signature.signedAt)],
      ["Revision", String(signature.revision)],
      ["What changed", signature.changes.length ? signature.changes.join("; ") : "first signed revision"],
      ["Content sha256", signature.contentSha256],
    ]);
  } else {
    text(
      "Not signed. This copy shows the records as they stand; a signed revision is downloaded from the pour's report page.",
      { width },
    );
  }

  heading("Computation basis and its sources");
  keyValues(basisLines(report));

  heading("Equipment sets and calibrations");
  if (!report.equipment.length) text("No equipment set has been used on this pour yet.", { width });
  keyValues(calibrationLines(report));

  heading("Strand lots");
  if (!report.strandLots.length)
    text("No tendon on this pour names a strand lot; nominal strand values apply.", { width });
  keyValues(strandLotLines(report));

  // Every stressing record, its header drawn again at the top of every page it runs onto.
  doc.addPage();
  font(true, 12);
  text("Stressing records, every stressing of every end in order", { width });
  doc.moveDown(0.3);
  drawTable(doc, {
    left,
    width,
    bottom,
    font,
    columns: PDF_COLUMNS,
    rows: recordRows(report).map(pdfCells),
  });
  font(false);
  if (!report.tendons.length) text("This pour has no tendons on its schedule.", { width });

  heading("Flags and dispositions");
  const flags = flagLines(report);
  if (!flags.length) text("No flag was raised on this pour.", { width });
  for (const f of flags) {
    if (doc.y + 30 > bottom()) doc.addPage();
    font(true, 10);
    text(f.heading, { width });
    font(false);
    for (const line of f.lines) text(line, { width, indent: 10 });
    doc.moveDown(0.4);
  }

  doc.moveDown(0.6);
  caution();

  // Running head and page numbers, written once the page count is known.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const margins = doc.page.margins;
    doc.page.margins = { ...margins, top: 0, bottom: 0 };
    font(false);
    doc.text(pdfText(`${report.project.code} · ${report.pour.name} · stressing report`), left, MARGIN - 4, {
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

/**
 * A table of wrapped cells with a rule under each row, its header drawn again at the top of every
 * page it runs onto; the stressing report and the daily report draw their records with it.
 */
export function drawTable(
  doc: PDFKit.PDFDocument,
  t: {
    left: number;
    width: number;
    bottom: () => number;
    font: (bold: boolean, size?: number) => unknown;
    columns: readonly { title: string; width: number }[];
    rows: string[][];
  },
): void {
  const scale = t.width / t.columns.reduce((a, c) => a + c.width, 0);
  const colWidths = t.columns.map((c) => c.width * scale);
  const cellHeight = (cells: string[]) =>
    Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c) || " ", { width: colWidths[i]! - 2 * PAD }))) +
    2 * PAD;
  const drawRow = (cells: string[], bold: boolean) => {
    t.font(bold, bold ? BODY : BODY - 1);
    const h = cellHeight(cells);
    const top = doc.y;
    let x = t.left;
    cells.forEach((c, i) => {
      doc.text(pdfText(c), x + PAD, top + PAD, { width: colWidths[i]! - 2 * PAD, lineBreak: true });
      x += colWidths[i]!;
    });
    doc
      .lineWidth(bold ? 1 : 0.5)
      .strokeColor("black")
      .moveTo(t.left, top + h)
      .lineTo(t.left + t.width, top + h)
      .stroke();
    doc.x = t.left;
    doc.y = top + h;
  };
  const header = t.columns.map((c) => c.title);
  drawRow(header, true);
  for (const cells of t.rows) {
    t.font(false, BODY - 1);
    if (doc.y + cellHeight(cells) > t.bottom()) {
      doc.addPage();
      drawRow(header, true);
    }
    drawRow(cells, false);
  }
}
