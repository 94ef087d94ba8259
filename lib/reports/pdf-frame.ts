import PDFDocument from "pdfkit";
import { CAUTION_TEXT } from "@/lib/cautions";

/**
 * What the stressing report and the daily special-inspection report share on paper: pdfkit's
 * built-in Helvetica, black on white, 9 pt and up, landscape Letter for projects in US units and
 * landscape A4 for SI; the running head and "Page n of m" on every page; the caution box; headings,
 * key-value rows, signature block and the record table. Sections flow one after the other: a
 * heading never ends a page, a table's header stays with its first rows and comes again at the top
 * of every page the table runs onto, a key-value row or a caution is never split.
 */

export const BODY = 9;
const MARGIN = 36;
const PAD = 2;
/** Key column width of key-value rows, and the gap to the value. */
const KEY = 170;
const GAP = 10;

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

export interface TableColumn {
  title: string;
  width: number;
}

/** A column on paper made of several of the CSV's columns, each cell their strings line by line. */
export interface GroupedColumn<C extends string> extends TableColumn {
  from: readonly C[];
}

/** How a value is introduced inside a grouped cell, where several share it ("final: 4150 psi"). */
const CELL_LABELS: Record<string, string> = {
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

/** A CSV row (its values in the order of `names`) as the cells of the grouped columns on paper. */
export function groupedCells<C extends string>(
  columns: readonly GroupedColumn<C>[],
  names: readonly C[],
  row: string[],
): string[] {
  const value = (c: C) => row[names.indexOf(c)] ?? "";
  return columns.map((col) =>
    col.from
      .map((c) => (value(c) && CELL_LABELS[c] ? `${CELL_LABELS[c]}: ${value(c)}` : value(c)))
      .filter(Boolean)
      .join("\n"),
  );
}

export interface ReportPdf {
  doc: PDFKit.PDFDocument;
  /** Left edge and width of the text block. */
  left: number;
  width: number;
  font: (bold: boolean, size?: number) => void;
  /** A paragraph across the text block. */
  text: (t: string, options?: PDFKit.Mixins.TextOptions) => void;
  /** A section heading, on a new page when it and `keep` points of what follows do not fit. */
  heading: (t: string, keep?: number) => void;
  /** Bold key, value beside it; a row is never split over two pages. */
  keyValues: (rows: [string, string][]) => void;
  /** One paragraph per item, or `empty` when there is none. */
  lines: (items: string[], empty: string) => void;
  /** A bold heading with indented lines under it (a flag and its trail), kept together with its first line. */
  group: (heading: string, lines: string[]) => void;
  /** The one caution wording in its box, never split. */
  caution: () => void;
  /** The signer's block, or what an unsigned copy is. */
  signature: (signature: SignatureBlock | undefined, time: (d: Date) => string, unsigned: string) => void;
  /** A titled table of wrapped cells (see drawTable). */
  table: (title: string, columns: readonly TableColumn[], rows: string[][], empty: string) => void;
  /** Writes the running head and page numbers on every page and gives the file. */
  finish: (runningHead: string) => Promise<Buffer>;
}

export function openReportPdf(options: {
  unitSystem: string;
  title: string;
  subject: string;
  /** The content's own time (or the signature's), so the same content always gives the same bytes. */
  createdAt: Date;
}): ReportPdf {
  const doc = new PDFDocument({
    size: options.unitSystem === "us" ? "LETTER" : "A4",
    layout: "landscape",
    margins: { top: MARGIN + 14, bottom: MARGIN + 14, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: {
      Title: pdfText(options.title),
      Author: "Tautline",
      Subject: pdfText(options.subject),
      CreationDate: options.createdAt,
      ModDate: options.createdAt,
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
  const atTop = () => doc.y <= doc.page.margins.top + 1;
  const font = (bold: boolean, size = BODY) => {
    doc
      .font(bold ? "Helvetica-Bold" : "Helvetica")
      .fontSize(size)
      .fillColor("black");
  };
  const text = (t: string, o: PDFKit.Mixins.TextOptions = {}) => {
    doc.text(pdfText(t), left, doc.y, { width, ...o });
  };
  /** Starts a new page unless `height` points still fit on this one. */
  const room = (height: number) => {
    if (doc.y + height > bottom() && !atTop()) doc.addPage();
  };
  const keyValueHeight = ([k, v]: [string, string]) => {
    font(true);
    const kh = doc.heightOfString(pdfText(k), { width: KEY });
    font(false);
    return Math.max(kh, doc.heightOfString(pdfText(v), { width: width - KEY - GAP }));
  };
  const headingHeight = (t: string) => {
    font(true, 12);
    const h = doc.heightOfString(pdfText(t), { width }) + doc.currentLineHeight() * 1.1;
    font(false);
    return h;
  };

  const heading = (t: string, keep = 3 * doc.currentLineHeight()) => {
    room(headingHeight(t) + keep);
    if (!atTop()) doc.moveDown(0.8);
    font(true, 12);
    text(t);
    doc.moveDown(0.3);
    font(false);
  };
  const keyValues = (rows: [string, string][]) => {
    for (const row of rows) {
      const h = keyValueHeight(row);
      room(h);
      const top = doc.y;
      font(true);
      doc.text(pdfText(row[0]), left, top, { width: KEY });
      font(false);
      doc.text(pdfText(row[1]), left + KEY + GAP, top, { width: width - KEY - GAP });
      doc.x = left;
      doc.y = top + h + 2;
    }
  };
  const lines = (items: string[], empty: string) => {
    font(false);
    if (!items.length) text(empty);
    for (const item of items) {
      room(doc.heightOfString(pdfText(item), { width }));
      text(item);
      doc.moveDown(0.2);
    }
  };
  const group = (title: string, items: string[]) => {
    font(true, 10);
    const first = doc.heightOfString(pdfText(title), { width });
    font(false);
    room(first + (items[0] ? doc.heightOfString(pdfText(items[0]), { width: width - 10 }) : 0));
    font(true, 10);
    text(title);
    font(false);
    // Each line indented as a whole, its wrapped lines under its first.
    for (const line of items) doc.text(pdfText(line), left + 10, doc.y, { width: width - 10 });
    doc.x = left;
    doc.moveDown(0.4);
  };
  const caution = () => {
    font(false, 10);
    const h = doc.heightOfString(pdfText(`Caution. ${CAUTION_TEXT}`), { width: width - 16 });
    room(h + 12);
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
  const signature = (s: SignatureBlock | undefined, time: (d: Date) => string, unsigned: string) => {
    if (!s) return text(unsigned);
    keyValues([
      ["Signed by", `${s.signerName}, ${s.licence}`],
      ["Statement", s.statement],
      ["Signed", time(s.signedAt)],
      ["Revision", String(s.revision)],
      ["What changed", s.changes.length ? s.changes.join("; ") : "first signed revision"],
      ["Content sha256", s.contentSha256],
    ]);
  };
  const table = (title: string, columns: readonly TableColumn[], rows: string[][], empty: string) => {
    if (!rows.length) {
      heading(title);
      return text(empty);
    }
    drawTable(doc, {
      left,
      width,
      bottom,
      font,
      columns,
      rows,
      title: (continued) => {
        if (!atTop()) doc.moveDown(0.8);
        font(true, 12);
        text(continued ? `${title} (continued)` : title);
        doc.moveDown(0.3);
      },
      titleHeight: headingHeight(title) + doc.currentLineHeight(),
    });
    font(false);
  };

  const finish = (runningHead: string) => {
    const range = doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i);
      const margins = doc.page.margins;
      doc.page.margins = { ...margins, top: 0, bottom: 0 };
      font(false);
      doc.text(pdfText(runningHead), left, MARGIN - 4, { width, align: "left", lineBreak: false });
      doc
        .lineWidth(0.5)
        .strokeColor("black")
        .moveTo(left, MARGIN + 8)
        .lineTo(left + width, MARGIN + 8)
        .stroke();
      doc.text(`Page ${i + 1 - range.start} of ${range.count}`, left, doc.page.height - MARGIN - 4, {
        width,
        align: "right",
        lineBreak: false,
      });
      doc.page.margins = margins;
    }
    doc.end();
    return done;
  };

  return { doc, left, width, font, text, heading, keyValues, lines, group, caution, signature, table, finish };
}

/** How many of a table's first rows stay with its header on a page. */
const KEEP_ROWS = 2;

/**
 * A table of wrapped cells with a rule under each row. The title and header start a new page when
 * they and the first rows do not fit; on every page the table runs onto, the title (marked
 * continued) and the header are drawn again.
 */
/**
 * A table cell's text for paper: a figure and its unit ("32.64 kip", "4150 psi", "+3.6 %") never
 * split over two lines of a narrow column.
 */
export function cellText(text: string): string {
  return pdfText(text).replace(/(\d) (kip|kN|psi|MPa|ksi|in|mm|ft|m|%)(?=$|[\s,;:.)])/g, "$1\u00a0$2");
}

export function drawTable(
  doc: PDFKit.PDFDocument,
  t: {
    left: number;
    width: number;
    bottom: () => number;
    font: (bold: boolean, size?: number) => unknown;
    columns: readonly TableColumn[];
    rows: string[][];
    title?: (continued: boolean) => void;
    titleHeight?: number;
  },
): void {
  const scale = t.width / t.columns.reduce((a, c) => a + c.width, 0);
  const colWidths = t.columns.map((c) => c.width * scale);
  const cellHeight = (cells: string[], bold: boolean) => {
    t.font(bold, bold ? BODY : BODY - 1);
    return (
      Math.max(...cells.map((c, i) => doc.heightOfString(cellText(c) || " ", { width: colWidths[i]! - 2 * PAD }))) +
      2 * PAD
    );
  };
  const drawRow = (cells: string[], bold: boolean) => {
    const h = cellHeight(cells, bold);
    const top = doc.y;
    let x = t.left;
    cells.forEach((c, i) => {
      doc.text(cellText(c), x + PAD, top + PAD, { width: colWidths[i]! - 2 * PAD, lineBreak: true });
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
  const headerHeight = cellHeight(header, true);
  const opening =
    (t.titleHeight ?? 0) + headerHeight + t.rows.slice(0, KEEP_ROWS).reduce((a, r) => a + cellHeight(r, false), 0);
  if (doc.y + opening > t.bottom() && doc.y > doc.page.margins.top + 1) doc.addPage();
  t.title?.(false);
  drawRow(header, true);
  for (const cells of t.rows) {
    if (doc.y + cellHeight(cells, false) > t.bottom()) {
      doc.addPage();
      t.title?.(true);
      drawRow(header, true);
    }
    drawRow(cells, false);
  }
}
