import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import {
  claimLogIngestJob,
  finishLogIngestJob,
  markLogIngestJobStored,
  releaseLogIngestJob,
  reportLogIngestProgress,
  type LogIngestJobView,
  type LogIngestOutcome,
} from "@/db/log-ingest-jobs";
import { getUser } from "@/db/users";
import type { LogColumns } from "@/lib/analysis";
import type { LogImportError } from "@/lib/analysis/log-import";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { evaluateStoredRun } from "../evaluate-stored-run";
import { runLogPartJob } from "../log-parts/read-log-part";
import { writeRunLog } from "../ingest-log";
import { rememberLogMapping } from "../remember-log-mapping";
import { storeLogWhileReading } from "../store-log-while-reading";

/** How long a claimed job stays a worker's without a sign of life; progress renews it. */
export const LEASE_SECONDS = 30;
/** Tries before a job that keeps failing (not a refused log: a fault) is given up. */
export const MAX_ATTEMPTS = 3;
/** Bytes handed to the parser at a time. */
const readSlice = 1 << 20;
/** At most one progress write per this many milliseconds. */
const progressEveryMs = 500;

export interface JobRunOptions {
  leaseSeconds?: number;
  /** Told after each chunk of samples is written; tests throw here to stand for a worker that dies. */
  onPartStored?: (part: { index: number; rows: number }) => void | Promise<void>;
}

export class LeaseLost extends Error {}

/** Claims the next due job and runs it. Returns the job's id, or null when none was due. */
export async function runNextLogIngestJob(opts: JobRunOptions = {}): Promise<string | null> {
  const leaseSeconds = opts.leaseSeconds ?? LEASE_SECONDS;
  const job = await claimLogIngestJob(getDb(), leaseSeconds);
  if (!job) return null;
  try {
    await runLogIngestJob(job, opts);
  } catch (error) {
    if (error instanceof LeaseLost) return job.id;
    console.error(`log ingest job ${job.id}, try ${job.attempts}:`, error);
    if (job.attempts >= MAX_ATTEMPTS) {
      await finishLogIngestJob(getDb(), job.id, {
        state: "failed",
        outcome: { problem: `The log could not be read after ${MAX_ATTEMPTS} tries because of a fault on the server; nothing of it was stored. Upload it again, and tell the administrator if it happens again.` },
      });
    } else {
      await releaseLogIngestJob(getDb(), job.id, 2 ** job.attempts);
    }
  }
  return job.id;
}

/**
 * One claimed job: read the staged file through its recorded hash, store the samples while parsing,
 * write the log in the same transaction as the job's link to it, then evaluate. A job whose log was
 * stored before its worker stopped goes straight to evaluation, so nothing is stored twice.
 */
export async function runLogIngestJob(job: LogIngestJobView, opts: JobRunOptions = {}): Promise<void> {
  if (job.part) return runLogPartJob(job, job.part, opts);
  const leaseSeconds = opts.leaseSeconds ?? LEASE_SECONDS;
  if (!job.storedFileId || !job.requestedBy) throw new Error("a whole-log job names its stored file and its requester");
  const storedFileId = job.storedFileId;
  const actor = await readRequester(job.requestedBy);
  let runLogId = job.runLogId;
  let rows = job.rowsRead;
  let columns: LogColumns | undefined;
  let warnings: string[] = [];
  let sha256: string | undefined;

  if (!runLogId) {
    let bytes: Uint8Array;
    try {
      ({ bytes } = await readVerifiedFile(storedFileId, actor, "reading an uploaded data log"));
    } catch (error) {
      if (!(error instanceof DomainError)) throw error;
      await refuse(job, actor, { message: error.message });
      return;
    }
    let lastReport = 0;
    const result = await storeLogWhileReading({
      runId: job.runId,
      mapping: job.mapping,
      chunks: slices(bytes),
      onPartStored: opts.onPartStored,
      onProgress: async (p) => {
        const now = Date.now();
        if (now - lastReport < progressEveryMs) return;
        lastReport = now;
        if (!(await reportLogIngestProgress(getDb(), job.id, job.attempts, p.rows, leaseSeconds))) throw new LeaseLost();
      },
      complete: async (tx, { parsed, runLogId: id }) => {
        const file = await readStagedFile(storedFileId);
        await writeRunLog(tx, { actor, runId: job.runId, runLogId: id, storedFileId, fileName: file.name, sha256: file.sha256, sizeBytes: file.sizeBytes, mapping: job.mapping, parsed });
        await markLogIngestJobStored(tx, job.id, { runLogId: id, rowsRead: parsed.rows });
        return file.sha256;
      },
    }).catch((error: unknown) => {
      if (error instanceof DomainError && error.code === "conflict") return { ok: false as const, error: { message: error.message } };
      throw error;
    });
    if (!result.ok) {
      await refuse(job, actor, result.error);
      return;
    }
    runLogId = result.runLogId;
    rows = result.parsed.rows;
    columns = result.parsed.columns;
    warnings = result.parsed.warnings.map((w) => w.message);
    sha256 = result.value;
    if (job.rememberMapping) await rememberLogMapping(actor, job.runId, job.mapping);
  }

  const outcome: LogIngestOutcome = { rows, warnings, ...(sha256 ? { sha256 } : {}) };
  try {
    outcome.verdict = (await evaluateStoredRun(actor, job.runId, columns ? { columns } : {})).verdict;
  } catch (error) {
    // The log is stored either way; an evaluation that cannot run yet (records missing) is said so.
    if (!(error instanceof DomainError)) console.error(error);
    outcome.evaluationProblem = error instanceof DomainError ? error.message : "The run could not be evaluated; the log is stored.";
  }
  await finishLogIngestJob(getDb(), job.id, { state: outcome.verdict ? "evaluated" : "stored", rowsRead: rows, runLogId, outcome });
}

/** A refused log: the job says why (with the line and column), the audit trail too; the run keeps its earlier log. */
async function refuse(job: LogIngestJobView, actor: SignedInUser, error: Pick<LogImportError, "message" | "line" | "column">): Promise<void> {
  await getDb()
    .transaction()
    .execute(async (tx) => {
      await finishLogIngestJob(tx, job.id, {
        state: "refused",
        outcome: { problem: error.message, ...(error.line === undefined ? {} : { line: error.line }), ...(error.column === undefined ? {} : { column: error.column }) },
      });
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: `${actor.displayName} <${actor.email}>`,
        action: "run.refuse-log",
        entityType: "run",
        entityId: job.runId,
        detail: { file: job.fileName, reason: error.message },
      });
    });
}

export async function readRequester(id: string): Promise<SignedInUser> {
  const user = await getUser(getDb(), id);
  if (!user) throw new Error("the job's requester is missing");
  return { id: user.id, email: user.email, displayName: user.displayName, role: user.role };
}

async function readStagedFile(storedFileId: string): Promise<{ name: string; sha256: string; sizeBytes: number }> {
  const f = await getDb().selectFrom("stored_file").select(["original_name", "sha256", "size_bytes"]).where("id", "=", storedFileId).executeTakeFirstOrThrow();
  return { name: f.original_name, sha256: f.sha256, sizeBytes: Number(f.size_bytes) };
}

export function* slices(bytes: Uint8Array): Iterable<Uint8Array> {
  for (let at = 0; at < bytes.length; at += readSlice) yield bytes.subarray(at, at + readSlice);
}
