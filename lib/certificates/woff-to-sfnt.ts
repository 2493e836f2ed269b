import { inflateSync } from "node:zlib";

/**
 * Unpacks a WOFF 1.0 font into the plain TrueType/OpenType (sfnt) file it wraps (W3C WOFF File
 * Format 1.0, sections 3–5: a 44-byte header, 20-byte table directory entries, each table zlib-
 * compressed unless compressing did not pay). The font reader behind the PDF renderer inflates a
 * WOFF table again on every glyph lookup, which made each certificate take seconds; the unpacked
 * font is read once and kept.
 */
export function convertWoffToSfnt(woff: Uint8Array): Buffer {
  const input = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
  if (input.length < 44 || input.toString("latin1", 0, 4) !== "wOFF") throw new Error("not a WOFF 1.0 font");
  const flavor = input.readUInt32BE(4);
  const numTables = input.readUInt16BE(12);
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20;
    const tag = input.readUInt32BE(at);
    const offset = input.readUInt32BE(at + 4);
    const compLength = input.readUInt32BE(at + 8);
    const origLength = input.readUInt32BE(at + 12);
    const checksum = input.readUInt32BE(at + 16);
    const stored = input.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(stored) : Buffer.from(stored);
    if (data.length !== origLength) throw new Error(`WOFF table ${i} unpacks to ${data.length} bytes, not ${origLength}`);
    return { tag, checksum, data };
  });
  // sfnt offset table (OpenType spec, "Organization of an OpenType font"): binary-search fields from numTables.
  const power = 2 ** Math.floor(Math.log2(Math.max(1, numTables)));
  const headerLength = 12 + 16 * numTables;
  const padded = (n: number) => (n + 3) & ~3;
  const total = headerLength + tables.reduce((sum, t) => sum + padded(t.data.length), 0);
  const out = Buffer.alloc(total);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(power * 16, 6);
  out.writeUInt16BE(Math.log2(power), 8);
  out.writeUInt16BE(numTables * 16 - power * 16, 10);
  let offset = headerLength;
  tables.forEach((t, i) => {
    const at = 12 + i * 16;
    out.writeUInt32BE(t.tag, at);
    out.writeUInt32BE(t.checksum, at + 4);
    out.writeUInt32BE(offset, at + 8);
    out.writeUInt32BE(t.data.length, at + 12);
    t.data.copy(out, offset);
    offset += padded(t.data.length);
  });
  return out;
}
