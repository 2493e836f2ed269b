import "server-only";
import { sql } from "kysely";
import type { ColumnMapping } from "@/lib/analysis/log-import";
import type { RunVerdict } from "@/lib/conformance";
import type { Executor } from "./index";

export type LogIngestState = "waiting" | "reading" | "stored" | "evaluated" | "refused" | "failed";

/** What became of a finished job, in words for the operator (never a code path or an id). */
export interface LogIngestOutcome {
  rows?: number;
  sha256?: string;
  warnings?: string[];
  /** The run's verdict when it could be evaluated. */
  verdict?: RunVerdict | null;
  /** Why the run could not be evaluated yet (the log is stored either way). */
  evaluationProblem?: string | null;
  /** Something the operator should know about an accepted part, e.g. a gap before it. */
  notice?: string;
  /** The part's number in the run's log, once accepted. */
  partNumber?: number;
  /** Why the log was refused or the job given up, with the line and column where there is one. */
  problem?: string;
  line?: number;
  column?: string;
}

export interface LogIngestJobView {
  id: string;
  runId: string;
  /** Null for a log part not (yet) accepted: its bytes are only staged (stagedKey). */
  storedFileId: string | null;
  fileName: string;
  sizeBytes: number;
  mapping: ColumnMapping;
  rememberMapping: boolean;
  /** Null for a part pushed by a machine. */
  requestedBy: string | null;
  /** Set when the job reads one part of a log sent in parts (0023). */
  part: { id: string; stagedKey: string; sha256: string; machine: { tokenId: string; label: string } | null } | null;
  state: LogIngestState;
  rowsRead: number;
  attempts: number;
  leaseUntil: Date | null;
  runLogId: string | null;
  outcome: LogIngestOutcome | null;
  createdAt: Date;
  updatedAt: Date;
  finishedAt: Date | null;
}

function jobQuery(db: Executor) {
  return db
    .selectFrom("log_ingest_job as j")
    .leftJoin("stored_file as f", "f.id", "j.stored_file_id")
    .select([
      "j.part_id",
      "j.file_name",
      "j.staged_key",
      "j.staged_sha256",
      "j.staged_size",
      "j.machine_token_id",
      "j.machine_label",
      "j.id",
      "j.run_id",
      "j.stored_file_id",
      "f.original_name",
      "f.size_bytes",
      "j.mapping",
      "j.remember_mapping",
      "j.requested_by",
      "j.state",
      "j.rows_read",
      "j.attempts",
      "j.lease_until",
      "j.run_log_id",
      "j.outcome",
      "j.created_at",
      "j.updated_at",
      "j.finished_at",
    ]);
}

type JobRow = Awaited<ReturnType<ReturnType<typeof jobQuery>["executeTakeFirstOrThrow"]>>;

function toView(r: JobRow): LogIngestJobView {
  return {
    id: r.id,
    runId: r.run_id,
    storedFileId: r.stored_file_id,
    fileName: r.original_name ?? r.file_name ?? "",
    sizeBytes: Number(r.size_bytes ?? r.staged_size ?? 0),
    mapping: r.mapping as ColumnMapping,
    rememberMapping: r.remember_mapping,
    requestedBy: r.requested_by,
    part:
      r.part_id && r.staged_key && r.staged_sha256
        ? { id: r.part_id, stagedKey: r.staged_key, sha256: r.staged_sha256, machine: r.machine_token_id && r.machine_label ? { tokenId: r.machine_token_id, label: r.machine_label } : null }
        : null,
    state: r.state,
    rowsRead: r.rows_read,
    attempts: r.attempts,
    leaseUntil: r.lease_until,
    runLogId: r.run_log_id,
    outcome: (r.outcome ?? null) as LogIngestOutcome | null,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    finishedAt: r.finished_at,
  };
}

export async function insertLogIngestJob(
  db: Executor,
  j: { runId: string; storedFileId: string; mapping: ColumnMapping; rememberMapping: boolean; requestedBy: string },
): Promise<string> {
  const { id } = await db
    .insertInto("log_ingest_job")
    .values({ run_id: j.runId, stored_file_id: j.storedFileId, mapping: JSON.stringify(j.mapping), remember_mapping: j.rememberMapping, requested_by: j.requestedBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return id;
}

export async function getLogIngestJob(db: Executor, id: string): Promise<LogIngestJobView | null> {
  const r = await jobQuery(db).where("j.id", "=", id).executeTakeFirst();
  return r ? toView(r) : null;
}

/** A log part's job: its bytes are staged under `stagedKey`; the stored-file row is written only when the part is accepted. */
export async function insertLogPartJob(
  db: Executor,
  j: {
    runId: string;
    partId: string;
    fileName: string;
    stagedKey: string;
    sha256: string;
    sizeBytes: number;
    mapping: ColumnMapping;
    mappingGiven: boolean;
    requestedBy: string | null;
    machine: { tokenId: string; label: string } | null;
  },
): Promise<string> {
  const { id } = await db
    .insertInto("log_ingest_job")
    .values({
      run_id: j.runId,
      stored_file_id: null,
      mapping: JSON.stringify(j.mapping),
      requested_by: j.requestedBy,
      part_id: j.partId,
      file_name: j.fileName,
      staged_key: j.stagedKey,
      staged_sha256: j.sha256,
      staged_size: j.sizeBytes,
      mapping_given: j.mappingGiven,
      machine_token_id: j.machine?.tokenId ?? null,
      machine_label: j.machine?.label ?? null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return id;
}

/** The run's latest uploads, newest first. */
export async function listLogIngestJobs(db: Executor, runId: string, limit = 5): Promise<LogIngestJobView[]> {
  const rows = await jobQuery(db).where("j.run_id", "=", runId).orderBy("j.created_at", "desc").limit(limit).execute();
  return rows.map(toView);
}

/**
 * Takes the oldest job that is waiting, or whose worker stopped renewing its lease (it crashed or
 * lost its connection), and leases it for `leaseSeconds`. SKIP LOCKED lets several workers claim side by side.
 */
export async function claimLogIngestJob(db: Executor, leaseSeconds: number): Promise<LogIngestJobView | null> {
  const claimed = await sql<{ id: string }>`
    update log_ingest_job set state = 'reading', attempts = attempts + 1,
      rows_read = case when run_log_id is null then 0 else rows_read end,
      lease_until = now() + make_interval(secs => ${leaseSeconds}), updated_at = now()
    where id = (
      select id from log_ingest_job j
      where finished_at is null and (state = 'waiting' or lease_until < now())
        -- A run's uploads are read one at a time, in the order they came: a part is checked against the one before it.
        and not exists (select 1 from log_ingest_job e where e.run_id = j.run_id and e.finished_at is null and (e.created_at, e.id) < (j.created_at, j.id))
      order by created_at
      for update skip locked
      limit 1
    )
    returning id`.execute(db);
  const id = claimed.rows[0]?.id;
  return id ? getLogIngestJob(db, id) : null;
}

/** Progress, and proof of life: the lease is renewed with it. False when the job is no longer this worker's. */
export async function reportLogIngestProgress(db: Executor, id: string, attempt: number, rowsRead: number, leaseSeconds: number): Promise<boolean> {
  const r = await db
    .updateTable("log_ingest_job")
    .set({ rows_read: rowsRead, lease_until: sql<Date>`now() + make_interval(secs => ${leaseSeconds})`, updated_at: sql<Date>`now()` })
    .where("id", "=", id)
    .where("attempts", "=", attempt)
    .where("finished_at", "is", null)
    .executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}

export async function finishLogIngestJob(
  db: Executor,
  id: string,
  f: { state: "stored" | "evaluated" | "refused" | "failed"; rowsRead?: number; runLogId?: string; outcome: LogIngestOutcome },
): Promise<void> {
  await db
    .updateTable("log_ingest_job")
    .set({
      state: f.state,
      ...(f.rowsRead === undefined ? {} : { rows_read: f.rowsRead }),
      run_log_id: f.runLogId ?? null,
      outcome: JSON.stringify(f.outcome),
      lease_until: null,
      updated_at: sql<Date>`now()`,
      finished_at: sql<Date>`now()`,
    })
    .where("id", "=", id)
    .where("finished_at", "is", null)
    .execute();
}

/** Inside the transaction that stores the log: the job names its log, so a retry never stores it twice. */
export async function markLogIngestJobStored(db: Executor, id: string, f: { runLogId: string; rowsRead: number; storedFileId?: string }): Promise<void> {
  await db
    .updateTable("log_ingest_job")
    .set({ run_log_id: f.runLogId, rows_read: f.rowsRead, ...(f.storedFileId ? { stored_file_id: f.storedFileId } : {}), updated_at: sql<Date>`now()` })
    .where("id", "=", id)
    .execute();
}

/** After a failure that may pass (the database or the file store was unreachable): try again after a pause. */
export async function releaseLogIngestJob(db: Executor, id: string, retryInSeconds: number): Promise<void> {
  await db
    .updateTable("log_ingest_job")
    .set({ lease_until: sql<Date>`now() + make_interval(secs => ${retryInSeconds})`, updated_at: sql<Date>`now()` })
    .where("id", "=", id)
    .where("finished_at", "is", null)
    .execute();
}
