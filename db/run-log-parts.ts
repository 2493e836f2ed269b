import "server-only";
import { sql } from "kysely";
import type { ColumnMapping } from "@/lib/analysis/log-import";
import type { Executor } from "./index";

/** One accepted part of a run's log, as the log page, the certificate and the evidence bundle list it. */
export interface RunLogPartView {
  id: string;
  runLogId: string;
  number: number;
  fileId: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  header: string[];
  firstChunk: number;
  chunkCount: number;
  sampleCount: number;
  firstTimeS: number;
  lastTimeS: number;
  startsAt: Date | null;
  endsAt: Date | null;
  gapBeforeS: number | null;
  uploadedByName: string | null;
  machineLabel: string | null;
  receivedAt: Date;
}

function partQuery(db: Executor) {
  return db
    .selectFrom("run_log_part as p")
    .innerJoin("stored_file as f", "f.id", "p.stored_file_id")
    .leftJoin("app_user as u", "u.id", "p.uploaded_by")
    .select([
      "p.id",
      "p.run_log_id",
      "p.part_number",
      "f.id as file_id",
      "f.original_name",
      "p.sha256",
      "f.size_bytes",
      "p.header",
      "p.first_chunk",
      "p.chunk_count",
      "p.sample_count",
      "p.first_time_s",
      "p.last_time_s",
      "p.starts_at",
      "p.ends_at",
      "p.gap_before_s",
      "u.display_name",
      "p.machine_label",
      "p.received_at",
    ]);
}

type PartRow = Awaited<ReturnType<ReturnType<typeof partQuery>["executeTakeFirstOrThrow"]>>;

function toView(r: PartRow): RunLogPartView {
  return {
    id: r.id,
    runLogId: r.run_log_id,
    number: r.part_number,
    fileId: r.file_id,
    fileName: r.original_name,
    sha256: r.sha256,
    sizeBytes: Number(r.size_bytes),
    header: r.header as string[],
    firstChunk: r.first_chunk,
    chunkCount: r.chunk_count,
    sampleCount: r.sample_count,
    firstTimeS: r.first_time_s,
    lastTimeS: r.last_time_s,
    startsAt: r.starts_at,
    endsAt: r.ends_at,
    gapBeforeS: r.gap_before_s,
    uploadedByName: r.display_name,
    machineLabel: r.machine_label,
    receivedAt: r.received_at,
  };
}

/** Every accepted part of the run, in order. */
export async function listRunLogParts(db: Executor, runId: string): Promise<RunLogPartView[]> {
  return (await partQuery(db).where("p.run_id", "=", runId).orderBy("p.part_number").execute()).map(toView);
}

/** The parts the given log is made of, in order. */
export async function listPartsOfLog(db: Executor, runLogId: string): Promise<RunLogPartView[]> {
  return (await partQuery(db).where("p.run_log_id", "=", runLogId).orderBy("p.part_number").execute()).map(toView);
}

/** Where the next part of a run goes: the current log if it is built from parts, its first and last part. */
export interface PartedLogTip {
  runLogId: string;
  mapping: ColumnMapping;
  /** The log's first sample in the run's time base: every part's times are stored from it. */
  originS: number;
  last: RunLogPartView;
}

export async function getPartedLogTip(db: Executor, runId: string): Promise<PartedLogTip | null> {
  const log = await db.selectFrom("run_log").select(["id", "mapping"]).where("run_id", "=", runId).where("current", "=", true).where("in_parts", "=", true).executeTakeFirst();
  if (!log) return null;
  const parts = await listPartsOfLog(db, log.id);
  const first = parts[0];
  const last = parts.at(-1);
  if (!first || !last) return null;
  return { runLogId: log.id, mapping: log.mapping as ColumnMapping, originS: first.firstTimeS, last };
}

/** The highest part number the run has used so far (0 before its first part). */
export async function getLastPartNumber(db: Executor, runId: string): Promise<number> {
  const r = await db.selectFrom("run_log_part").select(sql<number>`coalesce(max(part_number), 0)::int`.as("n")).where("run_id", "=", runId).executeTakeFirstOrThrow();
  return r.n;
}

/** An accepted part of the run with these bytes, if any. */
export async function findRunLogPartBySha256(db: Executor, runId: string, sha256: string): Promise<string | null> {
  const r = await db.selectFrom("run_log_part").select("id").where("run_id", "=", runId).where("sha256", "=", sha256).executeTakeFirst();
  return r?.id ?? null;
}

/** A part with these bytes still queued (waiting or being read), if any. */
export async function findQueuedPartBySha256(db: Executor, runId: string, sha256: string): Promise<string | null> {
  const r = await db
    .selectFrom("log_ingest_job")
    .select("part_id")
    .where("run_id", "=", runId)
    .where("staged_sha256", "=", sha256)
    .where("part_id", "is not", null)
    .where("finished_at", "is", null)
    .executeTakeFirst();
  return r?.part_id ?? null;
}

export async function insertRunLogPart(
  db: Executor,
  p: {
    id: string;
    runId: string;
    runLogId: string;
    number: number;
    storedFileId: string;
    sha256: string;
    header: string[];
    firstChunk: number;
    chunkCount: number;
    sampleCount: number;
    firstTimeS: number;
    lastTimeS: number;
    startsAt: Date | null;
    endsAt: Date | null;
    gapBeforeS: number | null;
    uploadedBy: string | null;
    machine: { tokenId: string; label: string } | null;
  },
): Promise<void> {
  await db
    .insertInto("run_log_part")
    .values({
      id: p.id,
      run_id: p.runId,
      run_log_id: p.runLogId,
      part_number: p.number,
      stored_file_id: p.storedFileId,
      sha256: p.sha256,
      header: JSON.stringify(p.header),
      first_chunk: p.firstChunk,
      chunk_count: p.chunkCount,
      sample_count: p.sampleCount,
      first_time_s: p.firstTimeS,
      last_time_s: p.lastTimeS,
      starts_at: p.startsAt,
      ends_at: p.endsAt,
      gap_before_s: p.gapBeforeS,
      uploaded_by: p.uploadedBy,
      machine_token_id: p.machine?.tokenId ?? null,
      machine_label: p.machine?.label ?? null,
    })
    .execute();
}

/** The log grows by a part's samples. */
export async function addSamplesToRunLog(db: Executor, runLogId: string, samples: number): Promise<void> {
  await db.updateTable("run_log").set({ sample_count: sql<number>`sample_count + ${samples}` }).where("id", "=", runLogId).execute();
}
