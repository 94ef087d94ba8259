import { PDFParse } from "pdf-parse";

/** A PDF's text as pdf-parse reads it: the whole `text`, each page's, and the `total` of pages. */
export async function pdfParsed(buffer: Buffer | Uint8Array) {
  const parser = new PDFParse({ data: new Uint8Array(buffer) });
  try {
    return await parser.getText();
  } finally {
    await parser.destroy();
  }
}

/** A PDF's text as one line (runs of whitespace as one space), for checks on what a report says. */
export async function pdfText(buffer: Buffer | Uint8Array): Promise<string> {
  return (await pdfParsed(buffer)).text.replace(/\s+/g, " ");
}
