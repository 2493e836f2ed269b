/**
 * PostgreSQL's binary COPY format (PostgreSQL manual, COPY, "Binary Format"): a signature, flags and
 * header-extension length; per row a field count and length-prefixed values in network byte order;
 * -1 as the trailer. bytea goes as its raw bytes, so a chunk of samples is neither hex-encoded by the
 * client nor decoded by the server. Pure: used by the log worker and by the log benchmark.
 */
export type CopyField = { uuid: string } | { int4: number } | { bytea: Uint8Array } | null;

export const COPY_BINARY_HEADER = Buffer.from([0x50, 0x47, 0x43, 0x4f, 0x50, 0x59, 0x0a, 0xff, 0x0d, 0x0a, 0x00, 0, 0, 0, 0, 0, 0, 0, 0]);
export const COPY_BINARY_TRAILER = Buffer.from([0xff, 0xff]);

/** One row as a list of buffers (the bytea payloads are not copied). */
export function encodeCopyRow(fields: readonly CopyField[]): Buffer[] {
  const out: Buffer[] = [];
  const head = Buffer.alloc(2);
  head.writeInt16BE(fields.length, 0);
  out.push(head);
  for (const f of fields) {
    if (f === null) {
      out.push(int32(-1));
    } else if ("uuid" in f) {
      const hex = f.uuid.replace(/-/g, "");
      if (!/^[0-9a-f]{32}$/i.test(hex)) throw new RangeError("not a UUID");
      out.push(int32(16), Buffer.from(hex, "hex"));
    } else if ("int4" in f) {
      const b = Buffer.alloc(8);
      b.writeInt32BE(4, 0);
      b.writeInt32BE(f.int4, 4);
      out.push(b);
    } else {
      out.push(int32(f.bytea.byteLength), Buffer.from(f.bytea.buffer, f.bytea.byteOffset, f.bytea.byteLength));
    }
  }
  return out;
}

function int32(n: number): Buffer {
  const b = Buffer.alloc(4);
  b.writeInt32BE(n, 0);
  return b;
}

/** A Float64Array's bytes as stored in the chunk columns (little-endian float64, docs/decisions/004). */
export function float64Bytes(a: Float64Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}
