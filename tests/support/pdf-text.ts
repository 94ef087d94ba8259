import { PDFParse } from "pdf-parse";

/** A PDF's text as one line (runs of whitespace as one space), for checks on what a report says. */
export async function pdfText(buffer: Buffer | Uint8Array): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buffer) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}
