import { PDFDocument } from "pdf-lib";

import { DATASHEET_MAX_BYTES, datasheetTooLargeMessage } from "./datasheet-limits";

export { DATASHEET_MAX_BYTES, datasheetTooLargeMessage };
export type FileCheck = { ok: true; pages: number } | { ok: false; message: string };

/**
 * A datasheet is stored only if it opens as a PDF with at least one page (ISO 32000-1 §7.5: header,
 * body, cross-reference, trailer) — not merely because "%PDF-" appears somewhere near the start.
 */
export async function checkDatasheetFile(file: { name: string; bytes: Uint8Array }): Promise<FileCheck> {
  if (file.bytes.byteLength === 0) return { ok: false, message: `“${file.name}” is empty.` };
  if (file.bytes.byteLength > DATASHEET_MAX_BYTES) return { ok: false, message: datasheetTooLargeMessage(file.bytes.byteLength) };
  const notPdf = { ok: false, message: `“${file.name}” is not a PDF that can be opened. Upload the datasheet as a PDF file.` } as const;
  // The header comes first (§7.5.2); pdf-lib alone would also search further in.
  if (new TextDecoder("latin1").decode(file.bytes.subarray(0, 5)) !== "%PDF-") return notPdf;
  try {
    const doc = await PDFDocument.load(file.bytes, { ignoreEncryption: true, updateMetadata: false, throwOnInvalidObject: true });
    const pages = doc.getPageCount();
    return pages > 0 ? { ok: true, pages } : notPdf;
  } catch {
    return notPdf;
  }
}
