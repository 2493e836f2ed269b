import type { LogIngestJobView, LogIngestOutcome, LogIngestState } from "@/db/log-ingest-jobs";

/** What the log page and GET /api/runs/[id]/logs show of an upload: read from the database, so it survives a closed tab or a restart. */
export interface LogJobStatus {
  /** For polling only; never shown. */
  id: string;
  fileName: string;
  sizeBytes: number;
  state: LogIngestState;
  rowsRead: number;
  /** Tries so far: more than one means a worker stopped and another took the job up again. */
  attempts: number;
  sentAt: string;
  finishedAt: string | null;
  outcome: LogIngestOutcome | null;
}

export function toLogJobStatus(job: LogIngestJobView): LogJobStatus {
  return {
    id: job.id,
    fileName: job.fileName,
    sizeBytes: job.sizeBytes,
    state: job.state,
    rowsRead: job.rowsRead,
    attempts: job.attempts,
    sentAt: job.createdAt.toISOString(),
    finishedAt: job.finishedAt?.toISOString() ?? null,
    outcome: job.outcome,
  };
}

export function isLogJobOpen(state: LogIngestState): boolean {
  return state === "waiting" || state === "reading";
}
