import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { listRecordedFiles } from "@/db/stored-file-records";
import { putObject, readObjectOrNull, sha256Hex } from "@/lib/storage";
import { describeFault } from "./read-verified-file";

/**
 * The payload inside aws-chunked framing (`<hex size>[;…]\r\n<data>\r\n … 0\r\n<trailers>`), or null when
 * the bytes are not framed that way. Uploads made before the S3 client sent bodies as-is were stored
 * with this framing by the local stand-in.
 */
export function unframeAwsChunked(bytes: Uint8Array): Uint8Array | null {
  const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const parts: Buffer[] = [];
  let at = 0;
  for (;;) {
    const eol = buf.indexOf("\r\n", at);
    if (eol < 0 || eol - at > 200) return null;
    const header = buf.subarray(at, eol).toString("latin1").split(";")[0]!;
    if (!/^[0-9a-fA-F]+$/.test(header)) return null;
    const size = parseInt(header, 16);
    at = eol + 2;
    if (size === 0) return Buffer.concat(parts);
    if (at + size + 2 > buf.length || buf.toString("latin1", at + size, at + size + 2) !== "\r\n") return null;
    parts.push(buf.subarray(at, at + size));
    at += size + 2;
  }
}

/**
 * Repairs stored objects of an existing database that hold the framing around the bytes that were sent:
 * when the unframed bytes hash to the SHA-256 recorded at upload, they are stored again and the repair is
 * written to the audit trail. Anything else that does not match is only reported. Returns what it did, in words.
 */
export async function repairFramedObjects(actorLabel: string): Promise<{ repaired: string[]; unrepaired: string[] }> {
  const repaired: string[] = [];
  const unrepaired: string[] = [];
  for (const file of await listRecordedFiles(getDb())) {
    const bytes = await readObjectOrNull(file.storageKey);
    if (bytes && sha256Hex(bytes) === file.sha256) continue;
    const unframed = bytes && unframeAwsChunked(bytes);
    if (!bytes || !unframed || sha256Hex(unframed) !== file.sha256) {
      unrepaired.push(describeFault(file, bytes ? "changed" : "missing"));
      continue;
    }
    await putObject(file.storageKey, unframed, file.purpose === "run-log" ? "text/csv" : "application/pdf");
    await recordAuditEvent(getDb(), {
      actorId: null,
      actorLabel,
      action: "storage.repair",
      entityType: "stored-file",
      entityId: file.id,
      detail: { record: file.record, repair: "removed upload framing stored around the file; the bytes now match the SHA-256 recorded at upload", recordedSha256: file.sha256, storedBytesBefore: bytes.byteLength, bytesAfter: unframed.byteLength },
    });
    repaired.push(`repaired ${file.record}`);
  }
  return { repaired, unrepaired };
}
