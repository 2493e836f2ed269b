/** Datasheets are PDFs up to 10 MB. Shared by the upload form (checked before sending) and the server. */
export const DATASHEET_MAX_BYTES = 10 * 1024 * 1024;

export function datasheetTooLargeMessage(sizeBytes?: number): string {
  const size = sizeBytes === undefined ? "larger than 10 MB" : `${(sizeBytes / 1024 / 1024).toFixed(1)} MB`;
  return `The datasheet is ${size}; a datasheet may be at most 10 MB. Save a smaller PDF (fewer images, or only the pages with the cell's ratings) and upload it again.`;
}
