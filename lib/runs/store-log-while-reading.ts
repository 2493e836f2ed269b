import "server-only";
import { randomUUID } from "node:crypto";
import { once } from "node:events";
import { finished } from "node:stream/promises";
import { Kysely, PostgresDialect } from "kysely";
import type pg from "pg";
import { from as copyFrom } from "pg-copy-streams";
import { COPY_BINARY_HEADER, COPY_BINARY_TRAILER, encodeCopyRow, float64Bytes } from "@/db/copy-binary";
import type { Executor } from "@/db";
import { getPool } from "@/db/pool";
import { CHUNK_SAMPLES } from "@/db/run-logs";
import { getRun } from "@/db/runs";
import type { Database } from "@/db/schema";
import type { LogColumns } from "@/lib/analysis";
import { createLogParser, type ColumnMapping, type LogImportError, type ParsedLog } from "@/lib/analysis/log-import";
import { DomainError } from "@/lib/errors";
import { openRunCycles, storeRunCycles, type CycleMode } from "./cycle-results";
import { isRunOpen } from "./run-status";

/** Largest data log accepted: a 2-million-row log is ≈ 70 MB. */
export const LOG_MAX_BYTES = 200 * 1024 * 1024;

export type StoreWhileReadingResult<T> = { ok: true; parsed: ParsedLog; runLogId: string; value: T } | { ok: false; error: LogImportError };

class LogRefused extends Error {
  constructor(readonly refusal: LogImportError) {
    super(refusal.message);
  }
}

/** Bytes sent ahead of the database at most (≈ 4 chunks of 4 channels); beyond that the parser waits. */
const COPY_QUEUE_BYTES = 8 * 2 ** 20;
const COPY_CHUNKS = "copy run_log_chunk (run_log_id, chunk, sample_count, time_s, voltage_v, current_a, temperature_c) from stdin (format binary)";

/**
 * Reads a log and writes its samples as it goes, inside one transaction: each 65 536-sample chunk goes
 * into one binary COPY stream as soon as the parser has it (docs/decisions/007), so the database stores
 * while the parser reads and no value is hex-encoded on the way. When the whole log has been read,
 * `complete` writes the log's own row and whatever else belongs with it, still in that transaction. A
 * refused log, a failure or a process that dies mid-way commits nothing, so a retry starts clean and no
 * sample is ever stored twice. The run row is locked only at the end, so the operator is not kept waiting.
 * The samples also go through the run's per-cycle accumulator as they are read (lib/runs/cycle-results.ts),
 * and its cycles and state are written in the same transaction: a whole log starts the cycles afresh, a
 * part continues them (`cycles`).
 */
export async function storeLogWhileReading<T>({
  runId,
  mapping,
  chunks,
  onProgress,
  onPartStored,
  complete,
  append,
  cycles: cycleMode = { kind: "whole-log" },
}: {
  runId: string;
  /**
   * A log part: its chunks continue an existing log (or start one) from `firstChunk` under `runLogId`, with
   * each time shifted by `shiftTime(first time cell)` so that all parts read as one stream from the log's first sample.
   */
  append?: { runLogId: string; firstChunk: number; shiftTime: (firstTime: string) => number };
  /** How these samples meet the run's cycles; a part already shifted by `append` continues them with offset 0. */
  cycles?: CycleMode;
  mapping: ColumnMapping;
  chunks: AsyncIterable<Uint8Array> | Iterable<Uint8Array>;
  onProgress?: (p: { bytes: number; rows: number }) => void | Promise<void>;
  /** Told after each chunk of samples is sent (tests use it to stop a worker half-way). */
  onPartStored?: (part: { index: number; rows: number }) => void | Promise<void>;
  complete: (tx: Executor, done: { parsed: ParsedLog; runLogId: string }) => Promise<T>;
}): Promise<StoreWhileReadingResult<T>> {
  const runLogId = append?.runLogId ?? randomUUID();
  const client = await getPool().connect();
  let broken = false;
  try {
    await client.query("begin");
    const tx = onConnection(client);
    // Before the COPY starts: the connection answers nothing else while it runs.
    const cycles = await openRunCycles(tx, runId, cycleMode);
    let cycleProblem: string | null = null;
    const copy = client.query(copyFrom(COPY_CHUNKS, { highWaterMark: COPY_QUEUE_BYTES }));
    const copied = finished(copy);
    copied.catch(() => undefined);
    copy.write(COPY_BINARY_HEADER);
    let nextPart = append?.firstChunk ?? 0;
    let shiftS: number | null = null;
    const sent: { index: number; rows: number }[] = [];
    let progress = { bytes: 0, rows: 0 };
    const parser = createLogParser(mapping, {
      maxBytes: LOG_MAX_BYTES,
      rowsPerPart: CHUNK_SAMPLES,
      onRows: ({ columns }) => {
        const index = nextPart++;
        let written = columns;
        if (append) {
          shiftS ??= append.shiftTime(parser.firstTime);
          // A copy: the last rows handed out share their memory with the parsed log the caller still reads.
          if (Number.isFinite(shiftS) && shiftS !== 0) written = { ...columns, timeS: columns.timeS.map((t) => t + (shiftS as number)) };
        }
        for (const b of encodeChunk(runLogId, index, written)) copy.write(b);
        sent.push({ index, rows: columns.length });
        if (cycleProblem === null) {
          const added = cycles.accumulator.push(written, cycles.timeOffsetS);
          if (!added.ok) cycleProblem = added.error.message;
        }
      },
      onProgress: (p) => {
        progress = p;
      },
    });
    try {
      for await (const chunk of chunks) {
        const refused = parser.push(chunk);
        if (refused) throw new LogRefused(refused);
        if (cycleProblem !== null) throw new LogRefused(cycleRefusal(cycleProblem));
        if (copy.errored) throw copy.errored;
        for (const part of sent.splice(0)) await onPartStored?.(part);
        // The parser waits while the database is behind; otherwise it goes on reading.
        if (copy.writableNeedDrain) await Promise.race([once(copy, "drain"), copied]);
        await onProgress?.(progress);
      }
      const parsed = parser.finish();
      if (!parsed.ok) throw new LogRefused(parsed.error);
      if (cycleProblem !== null) throw new LogRefused(cycleRefusal(cycleProblem));
      for (const part of sent.splice(0)) await onPartStored?.(part);
      copy.end(COPY_BINARY_TRAILER);
      await copied;
      await onProgress?.({ bytes: parsed.bytes, rows: parsed.rows });
      const run = await getRun(tx, runId, { forUpdate: true });
      if (!run || !isRunOpen(run.status)) throw new DomainError("conflict", "The run changed while the log was being read; nothing was stored.");
      const value = await complete(tx, { parsed, runLogId });
      await storeRunCycles(tx, { run, runLogId, cycles });
      await client.query("commit");
      return { ok: true, parsed, runLogId, value };
    } catch (error) {
      // A COPY still open is ended by the rollback: the server answers it with an error, which is expected here.
      if (!copy.writableEnded) copy.destroy(new Error("log reading stopped"));
      await copied.catch(() => undefined);
      throw error;
    }
  } catch (error) {
    await client.query("rollback").catch(() => {
      broken = true;
    });
    if (error instanceof LogRefused) return { ok: false, error: error.refusal };
    throw error;
  } finally {
    client.release(broken);
  }
}

/** The samples do not continue the run's time line (a part before the end of the last): refused, nothing stored. */
function cycleRefusal(problem: string): LogImportError {
  return { code: "time-backwards", message: `These samples do not continue the run's earlier log: ${problem.charAt(0).toLowerCase()}${problem.slice(1)} Nothing of this log was stored.` };
}

function encodeChunk(runLogId: string, index: number, c: LogColumns): Buffer[] {
  return encodeCopyRow([
    { uuid: runLogId },
    { int4: index },
    { int4: c.length },
    { bytea: float64Bytes(c.timeS) },
    { bytea: float64Bytes(c.voltageV) },
    { bytea: float64Bytes(c.currentA) },
    c.temperatureC ? { bytea: float64Bytes(c.temperatureC) } : null,
  ]);
}

/** Kysely on one checked-out connection whose transaction this module opened itself. */
function onConnection(client: pg.PoolClient): Kysely<Database> {
  return new Kysely<Database>({
    dialect: new PostgresDialect({
      pool: { connect: async () => ({ query: client.query.bind(client) as never, release: () => undefined }), end: async () => undefined },
    }),
  });
}
