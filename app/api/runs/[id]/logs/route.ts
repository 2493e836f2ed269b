import { z } from "zod";
import { getDb } from "@/db";
import { listLogIngestJobs } from "@/db/log-ingest-jobs";
import { getRun } from "@/db/runs";
import { columnMappingSchema } from "@/lib/analysis/log-import";
import { readLimitedChunks } from "@/lib/api/limited-body";
import { refuseForeignUpload } from "@/lib/auth/foreign-origin";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { toLogJobStatus } from "@/lib/runs/log-ingest/log-job-status";
import { stageLogUpload } from "@/lib/runs/log-ingest/stage-log-upload";
import { isRunOpen } from "@/lib/runs/run-status";
import { LOG_MAX_BYTES } from "@/lib/runs/store-log-while-reading";

const querySchema = z.object({
  name: z.string().trim().min(1, "Name the file (?name=…).").max(200),
  mapping: z.string().transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: "custom", message: "The mapping is not JSON." });
      return z.NEVER;
    }
  }).pipe(columnMappingSchema),
  remember: z.enum(["0", "1"]).default("0"),
});

/**
 * Upload of a cycler log as the raw request body (`?name=…&mapping=<JSON>&remember=1`). The bytes go
 * to object storage as they arrive and a job is queued; the log is read by the worker (docs/decisions/007).
 * Answers 202 with where to follow the reading: GET on this same address.
 */
const upload = apiRoute("/api/runs/[id]/logs", "POST", async (req, { user, params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const url = new URL(req.url);
  const q = querySchema.parse({ name: url.searchParams.get("name") ?? undefined, mapping: url.searchParams.get("mapping") ?? undefined, remember: url.searchParams.get("remember") ?? undefined });
  const declared = Number(req.headers.get("content-length") ?? Number.NaN);
  if (declared > LOG_MAX_BYTES) throw new DomainError("too-large", tooLargeLog(declared));
  if (!Number.isSafeInteger(declared) || declared < 0) throw new DomainError("invalid", "Send the log file with its size (a Content-Length header), as a browser does.");
  const run = await getRun(getDb(), id);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!isRunOpen(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its log can no longer change.`);
  if (!req.body) throw new DomainError("invalid", "Send the log file as the request body.");
  const { jobId } = await stageLogUpload(user, id, {
    name: q.name,
    chunks: readLimitedChunks(req.body, LOG_MAX_BYTES, () => tooLargeLog()),
    sizeBytes: declared,
    mapping: q.mapping,
    remember: q.remember === "1",
  });
  const poll = `/api/runs/${id}/logs`;
  return Response.json({ jobId, poll }, { status: 202, headers: { location: poll, "cache-control": "no-store" } });
});

/** The run's latest log uploads and how far each has been read, newest first. */
export const GET = apiRoute("/api/runs/[id]/logs", "GET", async (_req, { params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const run = await getRun(getDb(), id);
  if (!run) throw new DomainError("not-found", "No such run.");
  const jobs = await listLogIngestJobs(getDb(), id);
  return Response.json({ uploads: jobs.map(toLogJobStatus) }, { headers: { "cache-control": "no-store" } });
});

function tooLargeLog(declared?: number): string {
  const size = declared === undefined ? "larger than that" : `${(declared / 1048576).toFixed(0)} MiB`;
  return `The file is ${size}; a data log may be at most ${LOG_MAX_BYTES / 1048576} MiB.`;
}

/** The proxy skips this route (its body would be buffered), so the proxy's origin check is made here first. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }): Promise<Response> {
  return (await refuseForeignUpload(req)) ?? upload(req, ctx);
}
