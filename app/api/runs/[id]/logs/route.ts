import { z } from "zod";
import { getDb } from "@/db";
import { getRun } from "@/db/runs";
import { columnMappingSchema } from "@/lib/analysis/log-import";
import { readLimitedChunks } from "@/lib/api/limited-body";
import { refuseForeignUpload } from "@/lib/auth/foreign-origin";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog, LOG_MAX_BYTES } from "@/lib/runs/ingest-log";
import { rememberLogMapping } from "@/lib/runs/remember-log-mapping";
import { isRunOpen } from "@/lib/runs/run-status";
import { encodeUploadMessage, throttleProgress, type UploadMessage } from "@/lib/runs/upload-progress";

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
 * Upload of a cycler log as the raw request body (`?name=…&mapping=<JSON>&remember=1`), read as it
 * arrives. The answer is NDJSON (lib/runs/upload-progress): parse progress, then "stored" with the
 * verdict, or "refused" with the line and column, after which nothing of the upload is kept.
 */
const upload = apiRoute("/api/runs/[id]/logs", "POST", async (req, { user, params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const url = new URL(req.url);
  const q = querySchema.parse({ name: url.searchParams.get("name") ?? undefined, mapping: url.searchParams.get("mapping") ?? undefined, remember: url.searchParams.get("remember") ?? undefined });
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > LOG_MAX_BYTES) throw new DomainError("too-large", tooLargeLog(declared));
  const run = await getRun(getDb(), id);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!isRunOpen(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its log can no longer change.`);
  if (!req.body) throw new DomainError("invalid", "Send the log file as the request body.");
  const body = req.body;

  const encoder = new TextEncoder();
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (m: UploadMessage) => controller.enqueue(encoder.encode(encodeUploadMessage(m)));
      try {
        const progress = throttleProgress<{ bytes: number; rows: number }>((p) => send({ type: "progress", ...p }), 200, Date.now);
        const result = await ingestLog(user, id, { name: q.name, chunks: readLimitedChunks(body, LOG_MAX_BYTES, () => tooLargeLog()), mapping: q.mapping, onProgress: progress });
        if (!result.ok) {
          send({ type: "refused", error: result.error });
          return;
        }
        if (q.remember === "1") await rememberLogMapping(user, id, q.mapping);
        let verdict = null;
        let evaluationProblem = null;
        try {
          verdict = (await evaluateStoredRun(user, id, { columns: result.columns })).verdict;
        } catch (error) {
          // The log is stored either way; an evaluation that cannot run yet (records missing) is said so.
          evaluationProblem = error instanceof DomainError ? error.message : "The run could not be evaluated; the log is stored.";
          if (!(error instanceof DomainError)) console.error(error);
        }
        send({ type: "stored", runLogId: result.runLogId, rows: result.rows, bytes: result.bytes, sha256: result.sha256, warnings: result.warnings, verdict, evaluationProblem });
      } catch (error) {
        if (!(error instanceof DomainError)) console.error(error);
        send({ type: "failed", message: error instanceof DomainError ? error.message : "Something went wrong on the server; nothing was stored." });
      } finally {
        controller.close();
      }
    },
  });
  return new Response(stream, { headers: { "content-type": "application/x-ndjson; charset=utf-8", "cache-control": "no-store", "x-accel-buffering": "no" } });
});

function tooLargeLog(declared?: number): string {
  const size = declared === undefined ? "larger than that" : `${(declared / 1048576).toFixed(0)} MiB`;
  return `The file is ${size}; a data log may be at most ${LOG_MAX_BYTES / 1048576} MiB.`;
}

/** The proxy skips this route (its body would be buffered), so the proxy's origin check is made here first. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }): Promise<Response> {
  return (await refuseForeignUpload(req)) ?? upload(req, ctx);
}
