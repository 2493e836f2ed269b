import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getRecordedFile, type RecordedFile } from "@/db/stored-file-records";
import { DomainError } from "@/lib/errors";
import { readObjectOrNull, sha256Hex } from "@/lib/storage";

export const INTEGRITY_FAULT_ACTION = "storage.integrity-fault";

/** Who asked for the file, for the audit trail; a script or a job passes nothing. */
export interface Reader {
  id: string;
  displayName: string;
  email: string;
}

export type FileCheck = { ok: true; bytes: Uint8Array } | { ok: false; problem: "missing" | "changed"; foundSha256: string | null; foundBytes: number | null };

/** Reads a stored file and compares it with the SHA-256 recorded at upload. Records nothing. */
export async function checkRecordedFile(file: RecordedFile): Promise<FileCheck> {
  const bytes = await readObjectOrNull(file.storageKey);
  if (!bytes) return { ok: false, problem: "missing", foundSha256: null, foundBytes: null };
  const found = sha256Hex(bytes);
  return found === file.sha256 ? { ok: true, bytes } : { ok: false, problem: "changed", foundSha256: found, foundBytes: bytes.byteLength };
}

export function describeFault(file: RecordedFile, problem: "missing" | "changed"): string {
  return problem === "missing"
    ? `The stored copy of ${file.record} is missing from the file store.`
    : `The stored copy of ${file.record} does not match the SHA-256 recorded when it was stored: it has been changed outside Cellwright.`;
}

/** Writes a refused read to the audit trail (its own transaction: the refusal is kept whatever the caller does next). */
export async function recordIntegrityFault(file: RecordedFile, fault: Extract<FileCheck, { ok: false }>, reader?: Reader, during?: string): Promise<void> {
  await recordAuditEvent(getDb(), {
    actorId: reader?.id ?? null,
    actorLabel: reader ? `${reader.displayName} <${reader.email}>` : "integrity check",
    action: INTEGRITY_FAULT_ACTION,
    entityType: "stored-file",
    entityId: file.id,
    detail: {
      record: file.record,
      problem: fault.problem === "missing" ? "missing from the file store" : "content does not match the recorded SHA-256",
      recordedSha256: file.sha256,
      recordedBytes: file.sizeBytes,
      foundSha256: fault.foundSha256,
      foundBytes: fault.foundBytes,
      ...(during && { during }),
    },
  });
}

/**
 * The one way a stored file is read for anyone: its bytes only if they hash to the SHA-256 recorded
 * at upload. A missing or changed file is refused with a message naming the record, and the refusal
 * is written to the audit trail, where admins see it (Administration → Integrity).
 */
export async function readVerifiedFile(fileId: string, reader?: Reader, during?: string): Promise<{ file: RecordedFile; bytes: Uint8Array }> {
  const file = await getRecordedFile(getDb(), fileId);
  if (!file) throw new DomainError("not-found", "The file record is missing.");
  const check = await checkRecordedFile(file);
  if (check.ok) return { file, bytes: check.bytes };
  await recordIntegrityFault(file, check, reader, during);
  throw new DomainError("integrity", `${describeFault(file, check.problem)} It is not handed out; the fault is recorded for the administrators.`);
}
