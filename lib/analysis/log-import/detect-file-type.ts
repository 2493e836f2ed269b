/** How many leading bytes are searched for NUL bytes (text logs never hold one). */
export const fileTypeProbeBytes = 64 * 1024;

interface Signature {
  bytes: readonly number[];
  describe: (head: Uint8Array) => string;
}

const ascii = (text: string) => Array.from(text, (c) => c.charCodeAt(0));

// Leading "magic numbers" of file kinds an operator might upload by mistake (each format's own spec).
const signatures: readonly Signature[] = [
  { bytes: ascii("%PDF"), describe: () => "a PDF file" },
  { bytes: [0x50, 0x4b, 0x03, 0x04], describe: describeZip },
  { bytes: [0x50, 0x4b, 0x05, 0x06], describe: () => "a ZIP archive" },
  { bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1], describe: () => "an older Office file (for example an Excel .xls workbook)" },
  { bytes: [0x1f, 0x8b], describe: () => "a gzip-compressed file" },
  { bytes: [0x89, 0x50, 0x4e, 0x47], describe: () => "a PNG image" },
  { bytes: [0xff, 0xd8, 0xff], describe: () => "a JPEG image" },
  { bytes: ascii("SQLite format 3"), describe: () => "an SQLite database" },
  { bytes: [0xff, 0xfe], describe: () => "UTF-16 text" },
  { bytes: [0xfe, 0xff], describe: () => "UTF-16 text" },
];

/**
 * Names the kind of file when the first bytes show it is not a text log, or returns null.
 * Give it at least the first 8 bytes (up to `fileTypeProbeBytes`); fewer only at the end of a file.
 */
export function detectWrongFileType(head: Uint8Array): string | null {
  const found = signatures.find((s) => s.bytes.every((b, k) => head[k] === b));
  const kind = found ? found.describe(head) : head.subarray(0, fileTypeProbeBytes).includes(0) ? "a binary file" : null;
  if (kind === null) return null;
  const hint = kind === "UTF-16 text" ? "Save the log as UTF-8 text." : "Export the log from the cycler as CSV text (comma, semicolon or tab separated).";
  return `This is ${kind}, not a CSV text log. ${hint}`;
}

function describeZip(head: Uint8Array): string {
  // An Office Open XML file is a ZIP whose first entries name its parts.
  const text = new TextDecoder("latin1").decode(head.subarray(0, 4096));
  if (text.includes("xl/")) return "an Excel workbook (.xlsx)";
  if (text.includes("word/")) return "a Word document";
  if (text.includes("[Content_Types].xml")) return "an Office document (for example an Excel .xlsx workbook)";
  return "a ZIP archive";
}
