import { PDFDocument, StandardFonts } from "pdf-lib";

/** A real one-page PDF (pdf-lib), for tests that store datasheets. */
export async function tinyPdf(text: string): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const page = doc.addPage([595, 842]);
  page.drawText(text, { x: 56, y: 780, size: 12, font: await doc.embedFont(StandardFonts.Helvetica) });
  return doc.save({ useObjectStreams: false });
}
