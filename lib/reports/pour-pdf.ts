import PDFDocument from "pdfkit";
import { CAUTION_TEXT } from "@/components/ui/caution";
import type { PourReport } from "@/lib/server/get-pour-report";
import { showForce, showPressure } from "@/lib/stressing/display";
import { MPA_PER_PSI } from "@/lib/units";
import { basisLines, flagLines, isoMinute, releaseLine, TENDON_COLUMNS, tendonRows, type TendonColumn } from "./pour-rows";

/**
 * The pour's stressing report as a PDF, drawn with pdfkit's built-in Helvetica: black on white,
 * 9 pt and up, the tendon table's header repeated on every page, "Page n of m" on each page.
 * Landscape Letter for projects in US units, landscape A4 for SI.
 */

const BODY = 9;
const MARGIN = 36;
const PAD = 2;

// Column widths in points, scaled to the page; each fits its header's longest word in bold 9 pt.
const WIDTHS: Record<TendonColumn, number> = {
  Tendon: 48,
  Ends: 36,
  Strands: 42,
  Length: 36,
  Strand: 50,
  End: 22,
  "Equipment set": 52,
  "Gauge pressure": 44,
  Force: 42,
  Measured: 46,
  "Measured total": 46,
  Predicted: 45,
  Deviation: 45,
  Verdict: 54,
  "Evaluated (UTC)": 50,
  Flags: 60,
};
/** Columns that belong to one end's record; the others belong to the tendon. */
const END_COLUMNS = new Set<TendonColumn>(["End", "Equipment set", "Gauge pressure", "Force", "Measured"]);

/**
 * The standard PDF fonts carry WinAnsi characters only: the minus sign, the Greek mu and the
 * multiplication cross are mapped to characters they have.
 */
export function pdfText(text: string): string {
  return text
    .replace(/\u2212/g, "-")
    .replace(/\u03bc/g, "\u00b5")
    .replace(/[\u2018\u2019]/g, "'")
    .replace(/[\u201c\u201d]/g, '"')
    .replace(/[^\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2022\u2026\u00d7\n]/g, "?");
}

export async function renderPourPdf(report: PourReport): Promise<Buffer> {
  const doc = new PDFDocument({
    size: report.project.unitSystem === "us" ? "LETTER" : "A4",
    layout: "landscape",
    margins: { top: MARGIN + 14, bottom: MARGIN + 14, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: {
      Title: pdfText(`Stressing report ${report.project.code} ${report.pour.name}`),
      Author: "Tautline",
      Subject: pdfText(`${report.project.name}, ${report.pour.name}`),
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
  const font = (bold: boolean, size = BODY) => doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor("black");
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
    doc.lineWidth(1.5).strokeColor("black").rect(left, top, width, h + 12).stroke();
    font(true, 10);
    doc.text("Caution. ", left + 8, top + 6, { width: width - 16, continued: true });
    font(false, 10);
    doc.text(pdfText(CAUTION_TEXT));
    doc.x = left;
    doc.y = top + h + 18;
    font(false);
  };

  // Title block.
  font(true, 16);
  text(`Stressing report: ${report.pour.name}`, { width });
  font(false, 11);
  text(`${report.project.name} (${report.project.code})${report.project.address ? `, ${report.project.address}` : ""}`, { width });
  font(false);
  text(
    [
      report.pour.level ? `Level: ${report.pour.level}` : null,
      `Pour status: ${report.pour.status}`,
      report.pour.plannedStressingDate ? `Planned stressing: ${report.pour.plannedStressingDate}` : null,
      report.pour.concreteStrengthMpa !== null
        ? `Concrete strength confirmed: ${showPressure(report.project, report.pour.concreteStrengthMpa)}`
        : "Concrete strength: not confirmed",
      report.project.engineerOfRecordName ? `Engineer of record: ${report.project.engineerOfRecordName}` : null,
      `Generated ${isoMinute(report.generatedAt)}`,
    ]
      .filter(Boolean)
      .join("   ·   "),
    { width },
  );
  doc.moveDown(0.6);
  caution();

  heading("Release");
  text(releaseLine(report), { width });

  const stressed = report.tendons.filter((t) => t.evaluation && !t.evaluation.provisional);
  const count = (v: string) => stressed.filter((t) => t.evaluation?.verdict === v).length;
  heading("Summary");
  text(
    `${report.tendons.length} tendons on the schedule; ${stressed.length} evaluated with every end read ` +
      `(${count("in band")} in band, ${count("long")} long, ${count("short")} short); ` +
      `${report.tendons.length - stressed.length} not yet complete. ` +
      `${report.flags.length} flags, ${report.flags.filter((f) => f.status !== "closed").length} still open.`,
    { width },
  );

  heading("Computation basis and its sources");
  keyValues(basisLines(report));

  heading("Equipment sets and calibrations");
  // The calibration line's slope per 1,000 psi (US) or per MPa (SI).
  const pressureStep = report.project.unitSystem === "us" ? 1000 * MPA_PER_PSI : 1;
  const pressureStepLabel = report.project.unitSystem === "us" ? "1,000 psi" : "MPa";
  if (!report.equipment.length) text("No equipment set has been used on this pour yet.", { width });
  keyValues(
    report.equipment.map((s) => [
      s.name,
      `Jack ${s.jackSerial}, gauge ${s.gaugeSerial}${s.pumpSerial ? `, pump ${s.pumpSerial}` : ""}. ` +
        (s.calibrations.length
          ? s.calibrations
              .map(
                (c) =>
                  `Calibrated ${c.calibratedOn}, valid until ${c.validUntil}${c.laboratory ? ` (${c.laboratory})` : ""}: ` +
                  `line of ${showForce(report.project, c.slope * pressureStep)} per ${pressureStepLabel}, ` +
                  `${showForce(report.project, c.intercept)} at zero pressure, r² ${c.r2.toFixed(5)}`,
              )
              .join("; ")
          : "No calibration on file."),
    ]),
  );

  heading("Strand lots");
  if (!report.strandLots.length) text("No tendon on this pour names a strand lot; nominal strand values apply.", { width });
  keyValues(
    report.strandLots.map((l) => [
      l.lotNumber,
      `${l.strandSize} strand, area ${l.areaMm2} mm², modulus ${l.modulusMPa.toLocaleString("en-US")} MPa, ` +
        `breaking load ${showForce(report.project, l.breakingLoadN)} (mill certificate)`,
    ]),
  );

  // The tendon table, its header drawn again at the top of every page it runs onto.
  doc.addPage();
  font(true, 12);
  text("Tendons", { width });
  doc.moveDown(0.3);
  const scale = width / Object.values(WIDTHS).reduce((a, b) => a + b, 0);
  const colWidths = TENDON_COLUMNS.map((c) => WIDTHS[c] * scale);
  const drawRow = (cells: string[], bold: boolean) => {
    font(bold);
    const h = Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c) || " ", { width: colWidths[i]! - 2 * PAD }))) + 2 * PAD;
    const top = doc.y;
    let x = left;
    cells.forEach((c, i) => {
      doc.text(pdfText(c), x + PAD, top + PAD, { width: colWidths[i]! - 2 * PAD, lineBreak: true });
      x += colWidths[i]!;
    });
    doc.lineWidth(bold ? 1 : 0.5).strokeColor("black").moveTo(left, top + h).lineTo(left + width, top + h).stroke();
    doc.x = left;
    doc.y = top + h;
    return h;
  };
  const header = [...TENDON_COLUMNS];
  drawRow(header, true);
  let previousTag: string | null = null;
  let firstOnPage = true;
  for (const row of tendonRows(report)) {
    const tag = row[0]!;
    const continuation = tag === previousTag && !firstOnPage;
    const cells = continuation ? row.map((c, i) => (END_COLUMNS.has(TENDON_COLUMNS[i]!) ? c : "")) : row;
    font(false);
    const h = Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c) || " ", { width: colWidths[i]! - 2 * PAD }))) + 2 * PAD;
    if (doc.y + h > bottom()) {
      doc.addPage();
      drawRow(header, true);
      firstOnPage = true;
      previousTag = null;
      drawRow(row, false);
    } else {
      drawRow(cells, false);
    }
    firstOnPage = false;
    previousTag = tag;
  }
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
