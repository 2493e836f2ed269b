import "server-only";
import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { insertLogPartJob } from "@/db/log-ingest-jobs";
import { findQueuedPartBySha256, findRunLogPartBySha256, getPartedLogTip } from "@/db/run-log-parts";
import { getRun } from "@/db/runs";
import type { ColumnMapping } from "@/lib/analysis/log-import";
import { DomainError } from "@/lib/errors";
import { deleteObject, putObjectFromChunks } from "@/lib/storage";
import { LOG_INGEST_CHANNEL } from "../log-ingest/stage-log-upload";
import { getRememberedLogMapping } from "../remember-log-mapping";
import { isRunOpen } from "../run-status";
import { senderAuditActor, type LogPartSender } from "./part-sender";

export type { LogPartSender } from "./part-sender";

export type AppendLogPartResult = { outcome: "queued"; partId: string; jobId: string } | { outcome: "already-stored"; partId: string };

/**
 * Receives one part of a run's log: the bytes go to object storage (hashed on the way) and a job is queued
 * for the log worker, which checks how the part fits after the earlier ones and appends it (read-log-part.ts).
 * A part with the same SHA-256 as one the run already has, or has queued, is answered "already stored" and
 * nothing is kept a second time, so a sender that lost its connection can simply send again. Refusals
 * (closed run, empty part, no mapping known) are DomainErrors in plain words, audited, with nothing stored.
 */
export async function appendLogPart(
  sender: LogPartSender,
  runId: string,
  part: { name: string; chunks: AsyncIterable<Uint8Array>; sizeBytes: number; mapping?: ColumnMapping },
): Promise<AppendLogPartResult> {
  const run = await getRun(getDb(), runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  const name = part.name.trim().slice(0, 200) || "log part";
  if (!isRunOpen(run.status)) {
    await auditRefusal(sender, runId, name, `Run ${run.number} is ${run.status.replace("_", " ")}; no more log parts can be added to it.`);
  }
  if (part.sizeBytes === 0) await auditRefusal(sender, runId, name, `${name} is empty (0 bytes); a log part must hold samples.`);
  const mapping = part.mapping ?? (await getPartedLogTip(getDb(), runId))?.mapping ?? (await getRememberedLogMapping(runId))?.mapping;
  if (!mapping) await auditRefusal(sender, runId, name, "No column mapping is known for this run yet: send its first part from the run's log page, where the columns are chosen.");

  const key = `logs/${runId}/parts/${randomUUID()}.csv`;
  let stored = false;
  try {
    const object = await putObjectFromChunks(key, part.chunks, part.sizeBytes, "text/csv");
    stored = true;
    const answer = await getDb()
      .transaction()
      .execute(async (tx): Promise<AppendLogPartResult> => {
        const current = await getRun(tx, runId, { forUpdate: true });
        if (!current || !isRunOpen(current.status)) throw new DomainError("conflict", "The run was closed while the part was arriving; nothing was stored.");
        const existing = (await findRunLogPartBySha256(tx, runId, object.sha256)) ?? (await findQueuedPartBySha256(tx, runId, object.sha256));
        if (existing) return { outcome: "already-stored", partId: existing };
        const partId = randomUUID();
        const jobId = await insertLogPartJob(tx, {
          runId,
          partId,
          fileName: name,
          stagedKey: key,
          sha256: object.sha256,
          sizeBytes: object.sizeBytes,
          mapping: mapping as ColumnMapping,
          mappingGiven: part.mapping !== undefined,
          requestedBy: sender.kind === "user" ? sender.user.id : null,
          machine: sender.kind === "machine" ? { tokenId: sender.tokenId, label: sender.label } : null,
        });
        await recordAuditEvent(tx, {
          ...senderAuditActor(sender),
          action: "run.receive-log-part",
          entityType: "run",
          entityId: runId,
          after: { file: name, sha256: object.sha256, sizeBytes: object.sizeBytes },
        });
        await sql`select pg_notify(${LOG_INGEST_CHANNEL}, '')`.execute(tx);
        return { outcome: "queued", partId, jobId };
      });
    // A part sent again is not kept twice: its second copy goes.
    if (answer.outcome === "already-stored") await removeStaged(key);
    return answer;
  } catch (error) {
    if (stored) await removeStaged(key);
    throw error;
  }
}

async function removeStaged(key: string): Promise<void> {
  await deleteObject(key).catch((e: unknown) => console.error(`could not remove the staged part ${key}`, e));
}

/** A part refused before anything was stored: the audit trail keeps why, and the sender is told in the same words. */
async function auditRefusal(sender: LogPartSender, runId: string, file: string, reason: string): Promise<never> {
  await recordAuditEvent(getDb(), { ...senderAuditActor(sender), action: "run.refuse-log-part", entityType: "run", entityId: runId, detail: { file, reason } });
  throw new DomainError(reason.startsWith("Run ") ? "conflict" : "invalid", reason);
}
