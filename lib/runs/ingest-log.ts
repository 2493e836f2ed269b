import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, rm } from "node:fs/promises";
import path from "node:path";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { insertRunLog, supersedeRunLogs } from "@/db/run-logs";
import { getRun } from "@/db/runs";
import { insertStoredFile } from "@/db/stored-files";
import type { LogColumns } from "@/lib/analysis";
import { columnMappingSchema, createLogParser, type ColumnMapping, type LogImportError } from "@/lib/analysis/log-import";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { deleteObject, putObjectFromFile } from "@/lib/storage";
import { isRunOpen } from "./run-status";

/** Largest data log accepted: a 2-million-row log is ≈ 70 MB. */
export const LOG_MAX_BYTES = 200 * 1024 * 1024;

export type IngestResult =
  | { ok: true; runLogId: string; rows: number; bytes: number; sha256: string; columns: LogColumns; warnings: string[] }
  | { ok: false; error: LogImportError };

/**
 * Reads an uploaded log once, as it arrives: each chunk is parsed into typed-array columns, hashed
 * and spooled to a temporary file. Only a log that parsed completely is stored, the raw file in object
 * storage and the samples as chunked channels, in one transaction with its audit event; the run's
 * earlier log stays stored, no longer current. A refused or failed upload leaves the run as it was.
 */
export async function ingestLog(
  actor: SignedInUser,
  runId: string,
  upload: { name: string; chunks: AsyncIterable<Uint8Array>; mapping: unknown; onProgress?: (p: { bytes: number; rows: number }) => void },
): Promise<IngestResult> {
  const mapping: ColumnMapping = columnMappingSchema.parse(upload.mapping);
  const run = await getRun(getDb(), runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!isRunOpen(run.status)) {
    throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its log can no longer change.`);
  }

  const spoolDir = path.join(process.cwd(), ".data", "uploads");
  await mkdir(spoolDir, { recursive: true });
  const spool = path.join(spoolDir, `${randomUUID()}.csv`);
  const key = `logs/${runId}/${randomUUID()}.csv`;
  let stored = false;
  try {
    const file = await open(spool, "w");
    const hash = createHash("sha256");
    let bytes = 0;
    const parser = createLogParser(mapping, { maxBytes: LOG_MAX_BYTES, onProgress: upload.onProgress });
    try {
      for await (const chunk of upload.chunks) {
        const refused = parser.push(chunk);
        if (refused) return { ok: false, error: refused };
        hash.update(chunk);
        bytes += chunk.byteLength;
        await file.write(chunk);
      }
    } finally {
      await file.close();
    }
    const parsed = parser.finish();
    if (!parsed.ok) return { ok: false, error: parsed.error };
    const sha256 = hash.digest("hex");

    await putObjectFromFile(key, { path: spool, sizeBytes: bytes, sha256 }, "text/csv");
    stored = true;
    const runLogId = await getDb().transaction().execute(async (tx) => {
      const current = await getRun(tx, runId, { forUpdate: true });
      if (!current || !isRunOpen(current.status)) {
        throw new DomainError("conflict", "The run changed while the log was uploading; nothing was stored.");
      }
      const f = await insertStoredFile(tx, { storageKey: key, originalName: upload.name.slice(0, 200), contentType: "text/csv", sizeBytes: bytes, sha256, purpose: "run-log", uploadedBy: actor.id });
      await supersedeRunLogs(tx, runId);
      // With timestamps the log says when it started; elapsed-time logs are placed by the step records.
      const first = mapping.time.form === "timestamp" ? new Date(parsed.firstTime) : null;
      const loggedFrom = first && !Number.isNaN(first.getTime()) ? first : null;
      const id = await insertRunLog(tx, { runId, storedFileId: f.id, mapping, columns: parsed.columns, loggedFrom, uploadedBy: actor.id });
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: `${actor.displayName} <${actor.email}>`,
        action: "run.upload-log",
        entityType: "run",
        entityId: runId,
        after: { file: f.originalName, sha256, sizeBytes: bytes, rows: parsed.rows },
      });
      return id;
    });
    return { ok: true, runLogId, rows: parsed.rows, bytes, sha256, columns: parsed.columns, warnings: parsed.warnings.map((w) => w.message) };
  } catch (error) {
    if (stored) await deleteObject(key).catch((e: unknown) => console.error(`could not remove orphaned ${key}`, e));
    throw error;
  } finally {
    await rm(spool, { force: true });
  }
}
