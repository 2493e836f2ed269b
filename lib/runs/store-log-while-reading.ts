import "server-only";
import { randomUUID } from "node:crypto";
import type { Transaction } from "kysely";
import { getDb } from "@/db";
import { CHUNK_SAMPLES, insertRunLogChunk } from "@/db/run-logs";
import { getRun } from "@/db/runs";
import type { Database } from "@/db/schema";
import type { LogColumns } from "@/lib/analysis";
import { createLogParser, type ColumnMapping, type LogImportError, type ParsedLog } from "@/lib/analysis/log-import";
import { DomainError } from "@/lib/errors";
import { isRunOpen } from "./run-status";
import { createWriteBehind } from "./write-behind";

/** Largest data log accepted: a 2-million-row log is ≈ 70 MB. */
export const LOG_MAX_BYTES = 200 * 1024 * 1024;

/** Chunks parsed but not yet written, at most; beyond that the parser waits for the database. */
const maxPartsQueued = 2;

export type StoreWhileReadingResult<T> = { ok: true; parsed: ParsedLog; runLogId: string; value: T } | { ok: false; error: LogImportError };

class LogRefused extends Error {
  constructor(readonly refusal: LogImportError) {
    super(refusal.message);
  }
}

/**
 * Reads a log and writes its samples as it goes, chunk by chunk, inside one transaction: the database
 * stores a chunk while the parser reads the next (docs/decisions/007). When the whole log has been read,
 * `complete` writes the log's own row and whatever else belongs with it, still in that transaction. A
 * refused log, a failure or a process that dies mid-way commits nothing, so a retry starts clean and no
 * sample is ever stored twice. The run row is locked only at the end, so the operator is not kept waiting.
 */
export async function storeLogWhileReading<T>({
  runId,
  mapping,
  chunks,
  onProgress,
  onPartStored,
  complete,
}: {
  runId: string;
  mapping: ColumnMapping;
  chunks: AsyncIterable<Uint8Array> | Iterable<Uint8Array>;
  onProgress?: (p: { bytes: number; rows: number }) => void | Promise<void>;
  /** Told after each chunk of samples is written (tests use it to stop a worker half-way). */
  onPartStored?: (part: { index: number; rows: number }) => void | Promise<void>;
  complete: (tx: Transaction<Database>, done: { parsed: ParsedLog; runLogId: string }) => Promise<T>;
}): Promise<StoreWhileReadingResult<T>> {
  const runLogId = randomUUID();
  try {
    return await getDb()
      .transaction()
      .execute(async (tx) => {
        let nextPart = 0;
        let progress = { bytes: 0, rows: 0 };
        const writer = createWriteBehind<{ index: number; columns: LogColumns }>(async ({ index, columns }) => {
          await insertRunLogChunk(tx, runLogId, index, columns);
          await onPartStored?.({ index, rows: columns.length });
        }, maxPartsQueued);
        const parser = createLogParser(mapping, {
          maxBytes: LOG_MAX_BYTES,
          rowsPerPart: CHUNK_SAMPLES,
          onRows: ({ columns }) => writer.add({ index: nextPart++, columns }),
          onProgress: (p) => {
            progress = p;
          },
        });
        for await (const chunk of chunks) {
          const refused = parser.push(chunk);
          if (refused) throw new LogRefused(refused);
          await writer.keepUp();
          await onProgress?.(progress);
        }
        const parsed = parser.finish();
        if (!parsed.ok) throw new LogRefused(parsed.error);
        await writer.finish();
        await onProgress?.({ bytes: parsed.bytes, rows: parsed.rows });
        const run = await getRun(tx, runId, { forUpdate: true });
        if (!run || !isRunOpen(run.status)) throw new DomainError("conflict", "The run changed while the log was being read; nothing was stored.");
        const value = await complete(tx, { parsed, runLogId });
        return { ok: true as const, parsed, runLogId, value };
      });
  } catch (error) {
    if (error instanceof LogRefused) return { ok: false, error: error.refusal };
    throw error;
  }
}
