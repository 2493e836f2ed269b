import "server-only";
import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { insertLogIngestJob } from "@/db/log-ingest-jobs";
import { getRun } from "@/db/runs";
import { insertStoredFile } from "@/db/stored-files";
import type { ColumnMapping } from "@/lib/analysis/log-import";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { deleteObject, putObjectFromChunks } from "@/lib/storage";
import { isRunOpen } from "../run-status";

/** The PostgreSQL notification channel workers listen on. */
export const LOG_INGEST_CHANNEL = "log_ingest_job";

/**
 * The upload request's whole part of reading a log: the bytes go straight into object storage (hashed
 * on the way), then the file's record, the job and the audit event are written in one transaction.
 * The worker reads the file back through its recorded hash (run-log-ingest-job.ts). Nothing of a
 * failed upload is kept: the object is removed again if the transaction does not commit.
 */
export async function stageLogUpload(
  actor: SignedInUser,
  runId: string,
  upload: { name: string; chunks: AsyncIterable<Uint8Array>; sizeBytes: number; mapping: ColumnMapping; remember: boolean },
): Promise<{ jobId: string }> {
  const run = await getRun(getDb(), runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!isRunOpen(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its log can no longer change.`);
  if (upload.sizeBytes === 0) throw new DomainError("invalid", "The file is empty (0 bytes).");

  const key = `logs/${runId}/${randomUUID()}.csv`;
  let stored = false;
  try {
    const object = await putObjectFromChunks(key, upload.chunks, upload.sizeBytes, "text/csv");
    stored = true;
    const jobId = await getDb()
      .transaction()
      .execute(async (tx) => {
        const current = await getRun(tx, runId, { forUpdate: true });
        if (!current || !isRunOpen(current.status)) throw new DomainError("conflict", "The run changed while the log was uploading; nothing was stored.");
        const file = await insertStoredFile(tx, {
          storageKey: key,
          originalName: upload.name.slice(0, 200),
          contentType: "text/csv",
          sizeBytes: object.sizeBytes,
          sha256: object.sha256,
          purpose: "run-log",
          uploadedBy: actor.id,
        });
        const id = await insertLogIngestJob(tx, { runId, storedFileId: file.id, mapping: upload.mapping, rememberMapping: upload.remember, requestedBy: actor.id });
        await recordAuditEvent(tx, {
          actorId: actor.id,
          actorLabel: `${actor.displayName} <${actor.email}>`,
          action: "run.receive-log",
          entityType: "run",
          entityId: runId,
          after: { file: file.originalName, sha256: object.sha256, sizeBytes: object.sizeBytes },
        });
        // Delivered when the transaction commits: a waiting worker starts at once instead of at its next look.
        await sql`select pg_notify(${LOG_INGEST_CHANNEL}, '')`.execute(tx);
        return id;
      });
    return { jobId };
  } catch (error) {
    if (stored) await deleteObject(key).catch((e: unknown) => console.error(`could not remove orphaned ${key}`, e));
    throw error;
  }
}
