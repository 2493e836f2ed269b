import "server-only";
import type { LogColumns } from "@/lib/analysis";
import type { ColumnMapping } from "@/lib/analysis/log-import";
import type { Executor } from "./index";

/** Samples per stored chunk (docs/decisions/004). */
export const CHUNK_SAMPLES = 65_536;

export interface RunLogView {
  id: string;
  runId: string;
  fileId: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  mapping: ColumnMapping;
  sampleCount: number;
  /** When the first sample was taken, if the log has timestamps. */
  loggedFrom: Date | null;
  current: boolean;
  /** Built from parts appended over time (run_log_part); its file is then the first part's. */
  inParts: boolean;
  uploadedAt: Date;
}

function bytes(a: Float64Array): Buffer {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}

/** The previous current log of the run stays stored (evidence), no longer current. */
export async function supersedeRunLogs(db: Executor, runId: string): Promise<void> {
  await db.updateTable("run_log").set({ current: false }).where("run_id", "=", runId).where("current", "=", true).execute();
}

export async function insertRunLog(
  db: Executor,
  l: { runId: string; storedFileId: string; mapping: ColumnMapping; columns: LogColumns; loggedFrom: Date | null; uploadedBy: string },
): Promise<string> {
  const id = await insertRunLogRow(db, { ...l, sampleCount: l.columns.length });
  const c = l.columns;
  for (let from = 0, chunk = 0; from < c.length; from += CHUNK_SAMPLES, chunk++) {
    await insertRunLogChunk(db, id, chunk, sliceColumns(c, from, Math.min(from + CHUNK_SAMPLES, c.length)));
  }
  return id;
}

/** The log's own row; its chunks may already be written in the same transaction (the reference is checked at commit, 0022). */
export async function insertRunLogRow(
  db: Executor,
  l: { id?: string; runId: string; storedFileId: string; mapping: ColumnMapping; sampleCount: number; loggedFrom: Date | null; uploadedBy: string | null; inParts?: boolean },
): Promise<string> {
  const { id } = await db
    .insertInto("run_log")
    .values({
      ...(l.id ? { id: l.id } : {}),
      run_id: l.runId,
      stored_file_id: l.storedFileId,
      mapping: JSON.stringify(l.mapping),
      sample_count: l.sampleCount,
      logged_from: l.loggedFrom,
      uploaded_by: l.uploadedBy,
      ...(l.inParts ? { in_parts: true } : {}),
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return id;
}

/** One chunk of at most CHUNK_SAMPLES samples; (log, chunk) is the key, so a chunk is never stored twice. */
export async function insertRunLogChunk(db: Executor, runLogId: string, chunk: number, c: LogColumns): Promise<void> {
  if (c.length > CHUNK_SAMPLES) throw new RangeError(`A chunk holds at most ${CHUNK_SAMPLES} samples.`);
  await db
    .insertInto("run_log_chunk")
    .values({
      run_log_id: runLogId,
      chunk,
      sample_count: c.length,
      time_s: bytes(c.timeS),
      voltage_v: bytes(c.voltageV),
      current_a: bytes(c.currentA),
      temperature_c: c.temperatureC ? bytes(c.temperatureC) : null,
    })
    .execute();
}

function sliceColumns(c: LogColumns, from: number, to: number): LogColumns {
  return {
    timeS: c.timeS.subarray(from, to),
    voltageV: c.voltageV.subarray(from, to),
    currentA: c.currentA.subarray(from, to),
    ...(c.temperatureC ? { temperatureC: c.temperatureC.subarray(from, to) } : {}),
    length: to - from,
  };
}

export async function getCurrentRunLog(db: Executor, runId: string): Promise<RunLogView | null> {
  const r = await db
    .selectFrom("run_log as l")
    .innerJoin("stored_file as f", "f.id", "l.stored_file_id")
    .select(["l.id", "l.run_id", "f.id as file_id", "f.original_name", "f.sha256", "f.size_bytes", "l.mapping", "l.sample_count", "l.logged_from", "l.current", "l.in_parts", "l.uploaded_at"])
    .where("l.run_id", "=", runId)
    .where("l.current", "=", true)
    .executeTakeFirst();
  if (!r) return null;
  return {
    id: r.id,
    runId: r.run_id,
    fileId: r.file_id,
    fileName: r.original_name,
    sha256: r.sha256,
    sizeBytes: Number(r.size_bytes),
    mapping: r.mapping as ColumnMapping,
    sampleCount: r.sample_count,
    loggedFrom: r.logged_from,
    current: r.current,
    inParts: r.in_parts,
    uploadedAt: r.uploaded_at,
  };
}

/** Reads a stored log back into typed-array columns, chunk by chunk. */
export async function readRunLogColumns(db: Executor, runLogId: string): Promise<LogColumns> {
  const rows = await db
    .selectFrom("run_log_chunk")
    .select(["sample_count", "time_s", "voltage_v", "current_a", "temperature_c"])
    .where("run_log_id", "=", runLogId)
    .orderBy("chunk")
    .execute();
  const n = rows.reduce((s, r) => s + r.sample_count, 0);
  const out: LogColumns = { timeS: new Float64Array(n), voltageV: new Float64Array(n), currentA: new Float64Array(n), length: n };
  const hasTemperature = rows.length > 0 && rows.every((r) => r.temperature_c !== null);
  if (hasTemperature) out.temperatureC = new Float64Array(n);
  let at = 0;
  const copy = (target: Float64Array, b: Buffer) => target.set(new Float64Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength)), at);
  for (const r of rows) {
    copy(out.timeS, r.time_s);
    copy(out.voltageV, r.voltage_v);
    copy(out.currentA, r.current_a);
    if (out.temperatureC && r.temperature_c) copy(out.temperatureC, r.temperature_c);
    at += r.sample_count;
  }
  return out;
}
