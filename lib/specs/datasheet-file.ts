/** Datasheets are PDFs up to 10 MB: checked by content, not by the name or the browser's claim. */
export const DATASHEET_MAX_BYTES = 10 * 1024 * 1024;

export type FileCheck = { ok: true } | { ok: false; message: string };

export function checkDatasheetFile(file: { name: string; bytes: Uint8Array }): FileCheck {
  if (file.bytes.byteLength === 0) return { ok: false, message: `“${file.name}” is empty.` };
  if (file.bytes.byteLength > DATASHEET_MAX_BYTES) {
    const mb = (file.bytes.byteLength / 1024 / 1024).toFixed(1);
    return { ok: false, message: `“${file.name}” is ${mb} MB; a datasheet may be at most 10 MB.` };
  }
  // Every PDF starts with "%PDF-" (ISO 32000-1, 7.5.2), possibly after a few bytes of junk.
  const head = new TextDecoder("latin1").decode(file.bytes.subarray(0, 1024));
  if (!head.includes("%PDF-")) {
    return { ok: false, message: `“${file.name}” is not a PDF. Upload the datasheet as a PDF file.` };
  }
  return { ok: true };
}
