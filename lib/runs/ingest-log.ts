import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, rm } from "node:fs/promises";
import path from "node:path";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { insertRunLogRow, supersedeRunLogs } from "@/db/run-logs";
import { getRun } from "@/db/runs";
import { insertStoredFile } from "@/db/stored-files";
import type { LogColumns } from "@/lib/analysis";
import { columnMappingSchema, type ColumnMapping, type LogImportError, type ParsedLog } from "@/lib/analysis/log-import";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { deleteObject, putObjectFromFile } from "@/lib/storage";
import type { CycleMode } from "./cycle-results";
import { isRunOpen } from "./run-status";
import { LOG_MAX_BYTES, storeLogWhileReading } from "./store-log-while-reading";

export { LOG_MAX_BYTES };

export type IngestResult =
  | { ok: true; runLogId: string; rows: number; bytes: number; sha256: string; columns: LogColumns; warnings: string[] }
  | { ok: false; error: LogImportError };

/**
 * Reads a log within the caller's own process (the seed, scripts and tests; the web upload goes
 * through a job: stage-log-upload.ts and run-log-ingest-job.ts). The bytes are hashed and spooled to a
 * temporary file while the samples are written; only a log that parsed completely is kept, the raw
 * file in object storage and the samples as chunked channels, in one transaction with its audit event.
 * A refused or failed upload leaves the run as it was.
 */
export async function ingestLog(
  actor: SignedInUser,
  runId: string,
  upload: { name: string; chunks: AsyncIterable<Uint8Array>; mapping: unknown; onProgress?: (p: { bytes: number; rows: number }) => void; cycles?: CycleMode },
): Promise<IngestResult> {
  const mapping: ColumnMapping = columnMappingSchema.parse(upload.mapping);
  const run = await getRun(getDb(), runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!isRunOpen(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its log can no longer change.`);

  const spoolDir = path.join(process.cwd(), ".data", "uploads");
  await mkdir(spoolDir, { recursive: true });
  const spool = path.join(spoolDir, `${randomUUID()}.csv`);
  const key = `logs/${runId}/${randomUUID()}.csv`;
  let stored = false;
  const hash = createHash("sha256");
  let bytes = 0;
  const file = await open(spool, "w");
  async function* spooled(): AsyncIterable<Uint8Array> {
    for await (const chunk of upload.chunks) {
      hash.update(chunk);
      bytes += chunk.byteLength;
      await file.write(chunk);
      yield chunk;
    }
  }
  try {
    const result = await storeLogWhileReading({
      runId,
      mapping,
      chunks: spooled(),
      onProgress: upload.onProgress,
      ...(upload.cycles ? { cycles: upload.cycles } : {}),
      complete: async (tx, { parsed, runLogId }) => {
        await file.close();
        const sha256 = hash.digest("hex");
        await putObjectFromFile(key, { path: spool, sizeBytes: bytes, sha256 }, "text/csv");
        stored = true;
        const f = await insertStoredFile(tx, { storageKey: key, originalName: upload.name.slice(0, 200), contentType: "text/csv", sizeBytes: bytes, sha256, purpose: "run-log", uploadedBy: actor.id });
        await writeRunLog(tx, { actor, runId, runLogId, storedFileId: f.id, fileName: f.originalName, sha256, sizeBytes: bytes, mapping, parsed });
        return sha256;
      },
    });
    if (!result.ok) return result;
    const { parsed } = result;
    return { ok: true, runLogId: result.runLogId, rows: parsed.rows, bytes, sha256: result.value, columns: parsed.columns, warnings: parsed.warnings.map((w) => w.message) };
  } catch (error) {
    if (stored) await deleteObject(key).catch((e: unknown) => console.error(`could not remove orphaned ${key}`, e));
    throw error;
  } finally {
    await file.close().catch(() => undefined);
    await rm(spool, { force: true });
  }
}

/** The log's row, the earlier log no longer current, and the audit event: the end of every ingest, in its transaction. */
export async function writeRunLog(
  tx: Executor,
  l: { actor: SignedInUser; runId: string; runLogId: string; storedFileId: string; fileName: string; sha256: string; sizeBytes: number; mapping: ColumnMapping; parsed: ParsedLog },
): Promise<void> {
  await supersedeRunLogs(tx, l.runId);
  // With timestamps the log says when it started; elapsed-time logs are placed by the step records.
  const first = l.mapping.time.form === "timestamp" ? new Date(l.parsed.firstTime) : null;
  const loggedFrom = first && !Number.isNaN(first.getTime()) ? first : null;
  await insertRunLogRow(tx, { id: l.runLogId, runId: l.runId, storedFileId: l.storedFileId, mapping: l.mapping, sampleCount: l.parsed.rows, loggedFrom, uploadedBy: l.actor.id });
  await recordAuditEvent(tx, {
    actorId: l.actor.id,
    actorLabel: `${l.actor.displayName} <${l.actor.email}>`,
    action: "run.upload-log",
    entityType: "run",
    entityId: l.runId,
    after: { file: l.fileName, sha256: l.sha256, sizeBytes: l.sizeBytes, rows: l.parsed.rows },
  });
}
