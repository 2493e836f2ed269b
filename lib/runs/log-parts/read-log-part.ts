import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { finishLogIngestJob, markLogIngestJobStored, reportLogIngestProgress, type LogIngestJobView, type LogIngestOutcome } from "@/db/log-ingest-jobs";
import { addSamplesToRunLog, getLastPartNumber, getPartedLogTip, insertRunLogPart, type PartedLogTip } from "@/db/run-log-parts";
import { insertRunLogRow, supersedeRunLogs } from "@/db/run-logs";
import { insertStoredFile } from "@/db/stored-files";
import { CHUNK_SAMPLES } from "@/db/run-logs";
import type { LogImportError } from "@/lib/analysis/log-import";
import { toCanonicalJson } from "@/lib/certificates/canonical-json";
import { DomainError } from "@/lib/errors";
import { deleteObject, readObjectOrNull, sha256Hex } from "@/lib/storage";
import { evaluateStoredRun } from "../evaluate-stored-run";
import { LEASE_SECONDS, LeaseLost, readRequester, slices, type JobRunOptions } from "../log-ingest/run-log-ingest-job";
import { storeLogWhileReading } from "../store-log-while-reading";
import { checkNextPart, describeDuration, readPartStart } from "./part-sequence";
import { senderAuditActor, type LogPartSender } from "./part-sender";

const progressEveryMs = 500;

/**
 * One part of a run's log, claimed by the worker like a whole upload: the staged bytes are read back and
 * compared with the SHA-256 taken when they arrived, parsed and written as further chunks of the run's log
 * (time shifted onto the log's first sample), and checked against the part before it under the run's lock.
 * In that one transaction the part's stored-file row, its part row, the log's new sample count, the job's
 * link and the audit event are written. A part that does not fit is refused: the transaction writes
 * nothing, the staged object is removed, and the refusal is recorded on the job and in the audit trail.
 */
export async function runLogPartJob(job: LogIngestJobView, part: NonNullable<LogIngestJobView["part"]>, opts: JobRunOptions = {}): Promise<void> {
  const leaseSeconds = opts.leaseSeconds ?? LEASE_SECONDS;
  const sender: LogPartSender = part.machine
    ? { kind: "machine", ...part.machine }
    : { kind: "user", user: await readRequester(job.requestedBy ?? "") };
  let outcome: LogIngestOutcome;

  if (!job.runLogId) {
    const bytes = await readObjectOrNull(part.stagedKey);
    if (!bytes || sha256Hex(bytes) !== part.sha256) {
      await refusePart(job, sender, { message: `The staged copy of ${job.fileName} is ${bytes ? "not the file that was sent (its SHA-256 differs)" : "missing from the file store"}; nothing of it was stored. Send the part again.` });
      return;
    }
    const tip = await getPartedLogTip(getDb(), job.runId);
    const runLogId = tip?.runLogId ?? crypto.randomUUID();
    const firstChunk = tip ? tip.last.firstChunk + tip.last.chunkCount : 0;
    let lastReport = 0;
    const result = await storeLogWhileReading({
      runId: job.runId,
      mapping: job.mapping,
      chunks: slices(bytes),
      append: { runLogId, firstChunk, shiftTime: (firstTime) => (tip ? readPartStart(firstTime, job.mapping) - tip.originS : 0) },
      // The first part starts the run's cycles afresh; each later one continues them.
      cycles: tip ? { kind: "part", timeOffsetS: 0 } : { kind: "whole-log" },
      onPartStored: opts.onPartStored,
      onProgress: async (p) => {
        const now = Date.now();
        if (now - lastReport < progressEveryMs) return;
        lastReport = now;
        if (!(await reportLogIngestProgress(getDb(), job.id, job.attempts, p.rows, leaseSeconds))) throw new LeaseLost();
      },
      complete: async (tx, { parsed }) => acceptPart(tx, { job, part, sender, tip, runLogId, firstChunk, parsed }),
    }).catch((error: unknown) => {
      if (error instanceof DomainError && error.code === "conflict") return { ok: false as const, error: { message: error.message } as LogImportError };
      throw error;
    });
    if (!result.ok) {
      await refusePart(job, sender, result.error);
      return;
    }
    outcome = result.value;
  } else {
    outcome = { ...(job.outcome ?? {}), rows: job.rowsRead };
  }

  try {
    outcome.verdict = (await evaluateStoredRun(sender.kind === "user" ? sender.user : { machineLabel: sender.label }, job.runId)).verdict;
  } catch (error) {
    if (!(error instanceof DomainError)) console.error(error);
    outcome.evaluationProblem = error instanceof DomainError ? error.message : "The run could not be evaluated; the part is stored.";
  }
  const stored = await getDb().selectFrom("log_ingest_job").select("run_log_id").where("id", "=", job.id).executeTakeFirstOrThrow();
  await finishLogIngestJob(getDb(), job.id, { state: outcome.verdict ? "evaluated" : "stored", rowsRead: outcome.rows ?? job.rowsRead, runLogId: stored.run_log_id ?? undefined, outcome });
}

async function acceptPart(
  tx: Executor,
  a: {
    job: LogIngestJobView;
    part: NonNullable<LogIngestJobView["part"]>;
    sender: LogPartSender;
    tip: PartedLogTip | null;
    runLogId: string;
    firstChunk: number;
    parsed: import("@/lib/analysis/log-import").ParsedLog;
  },
): Promise<LogIngestOutcome> {
  const { job, part, sender, parsed } = a;
  // The run is locked: no other part of it can be accepted meanwhile. Its log must still end where it did.
  const tip = await getPartedLogTip(tx, job.runId);
  if ((tip?.last.id ?? null) !== (a.tip?.last.id ?? null)) throw new Error("another part of this run was accepted while this one was read");
  const firstS = readPartStart(parsed.firstTime, job.mapping);
  const lastS = firstS + (parsed.columns.timeS[parsed.columns.length - 1] ?? 0);
  const previous = tip ? { number: tip.last.number, firstS: tip.last.firstTimeS, lastS: tip.last.lastTimeS, samples: tip.last.sampleCount, header: tip.last.header } : null;
  if (tip && toCanonicalJson(tip.mapping) !== toCanonicalJson(job.mapping)) {
    throw new DomainError("conflict", "This part's columns were mapped differently from the earlier parts (another time, voltage or current column, unit or separator). Send it with the earlier parts' mapping.");
  }
  const fit = checkNextPart(previous, { firstS, lastS, samples: parsed.rows, header: parsed.header }, job.mapping.time.form);
  if (!fit.ok) throw new DomainError("conflict", fit.problem);

  const number = (await getLastPartNumber(tx, job.runId)) + 1;
  const uploadedBy = sender.kind === "user" ? sender.user.id : null;
  const file = await insertStoredFile(tx, {
    storageKey: part.stagedKey,
    originalName: job.fileName.slice(0, 200),
    contentType: "text/csv",
    sizeBytes: job.sizeBytes,
    sha256: part.sha256,
    purpose: "run-log",
    uploadedBy,
  });
  const stamped = job.mapping.time.form === "timestamp";
  if (!tip) {
    // The first part of a log: it becomes the run's current log (an earlier whole upload stays stored, no longer current).
    await supersedeRunLogs(tx, job.runId);
    await insertRunLogRow(tx, {
      id: a.runLogId,
      runId: job.runId,
      storedFileId: file.id,
      mapping: job.mapping,
      sampleCount: parsed.rows,
      loggedFrom: stamped && Number.isFinite(firstS) ? new Date(firstS * 1000) : null,
      uploadedBy,
      inParts: true,
    });
  } else {
    await addSamplesToRunLog(tx, tip.runLogId, parsed.rows);
  }
  await insertRunLogPart(tx, {
    id: part.id,
    runId: job.runId,
    runLogId: a.runLogId,
    number,
    storedFileId: file.id,
    sha256: part.sha256,
    header: parsed.header,
    firstChunk: a.firstChunk,
    chunkCount: Math.ceil(parsed.rows / CHUNK_SAMPLES),
    sampleCount: parsed.rows,
    firstTimeS: firstS,
    lastTimeS: lastS,
    startsAt: stamped ? new Date(firstS * 1000) : null,
    endsAt: stamped ? new Date(lastS * 1000) : null,
    gapBeforeS: fit.gapS,
    uploadedBy,
    machine: sender.kind === "machine" ? { tokenId: sender.tokenId, label: sender.label } : null,
  });
  await markLogIngestJobStored(tx, job.id, { runLogId: a.runLogId, rowsRead: parsed.rows, storedFileId: file.id });
  const notice = fit.gapS === null ? undefined : `Gap of ${describeDuration(fit.gapS)} between part ${number - 1} and part ${number}: no samples were logged in that time.`;
  await recordAuditEvent(tx, {
    ...senderAuditActor(sender),
    action: "run.append-log-part",
    entityType: "run",
    entityId: job.runId,
    after: { part: number, file: job.fileName, sha256: part.sha256, sizeBytes: job.sizeBytes, rows: parsed.rows, ...(fit.gapS === null ? {} : { gapSeconds: fit.gapS }) },
  });
  return { rows: parsed.rows, sha256: part.sha256, partNumber: number, warnings: parsed.warnings.map((w) => w.message), ...(notice ? { notice } : {}) };
}

/** A refused part: nothing of it is kept but the job's record of why and the audit event; its staged object is removed. */
async function refusePart(job: LogIngestJobView, sender: LogPartSender, error: Pick<LogImportError, "message" | "line" | "column">): Promise<void> {
  await getDb()
    .transaction()
    .execute(async (tx) => {
      await finishLogIngestJob(tx, job.id, {
        state: "refused",
        outcome: { problem: error.message, ...(error.line === undefined ? {} : { line: error.line }), ...(error.column === undefined ? {} : { column: error.column }) },
      });
      await recordAuditEvent(tx, {
        ...senderAuditActor(sender),
        action: "run.refuse-log-part",
        entityType: "run",
        entityId: job.runId,
        detail: { file: job.fileName, sha256: job.part?.sha256, reason: error.message },
      });
    });
  if (job.part) await deleteObject(job.part.stagedKey).catch((e: unknown) => console.error(`could not remove the refused part's staged object`, e));
}

