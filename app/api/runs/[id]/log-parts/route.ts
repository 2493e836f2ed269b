import { z } from "zod";
import { columnMappingSchema } from "@/lib/analysis/log-import";
import { readLimitedChunks } from "@/lib/api/limited-body";
import { refuseForeignUpload } from "@/lib/auth/foreign-origin";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { appendLogPart } from "@/lib/runs/log-parts/append-log-part";
import { LOG_MAX_BYTES } from "@/lib/runs/store-log-while-reading";

const querySchema = z.object({
  name: z.string().trim().min(1, "Name the file (?name=…).").max(200),
  mapping: z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: "custom", message: "The mapping is not JSON." });
        return z.NEVER;
      }
    })
    .pipe(columnMappingSchema)
    .optional(),
});

/**
 * One more part of the run's log as the raw request body (`?name=…`, and `&mapping=<JSON>` for the first part
 * or to read the columns afresh; otherwise the earlier parts' mapping is used). Answers 202 with the part and
 * where to follow its reading, or 200 when the run already has these exact bytes.
 */
const upload = apiRoute("/api/runs/[id]/log-parts", "POST", async (req, { user, params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const url = new URL(req.url);
  const q = querySchema.parse({ name: url.searchParams.get("name") ?? undefined, mapping: url.searchParams.get("mapping") ?? undefined });
  const declared = Number(req.headers.get("content-length") ?? Number.NaN);
  if (declared > LOG_MAX_BYTES) throw new DomainError("too-large", `The part is ${(declared / 1048576).toFixed(0)} MiB; a log part may be at most ${LOG_MAX_BYTES / 1048576} MiB.`);
  if (!Number.isSafeInteger(declared) || declared < 0) throw new DomainError("invalid", "Send the log part with its size (a Content-Length header), as a browser does.");
  const body = req.body ?? new ReadableStream<Uint8Array>({ start: (c) => c.close() });
  const answer = await appendLogPart({ kind: "user", user }, id, {
    name: q.name,
    chunks: readLimitedChunks(body, LOG_MAX_BYTES, () => `A log part may be at most ${LOG_MAX_BYTES / 1048576} MiB.`),
    sizeBytes: declared,
    ...(q.mapping ? { mapping: q.mapping } : {}),
  });
  const poll = `/api/runs/${id}/logs`;
  if (answer.outcome === "already-stored") {
    return Response.json({ outcome: answer.outcome, partId: answer.partId, message: "Already have it: this run holds a part with exactly these bytes; nothing was stored again." }, { status: 200, headers: { "cache-control": "no-store" } });
  }
  return Response.json({ ...answer, poll }, { status: 202, headers: { location: poll, "cache-control": "no-store" } });
});

/** The proxy skips this route (its body would be buffered), so the proxy's origin check is made here first. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }): Promise<Response> {
  return (await refuseForeignUpload(req)) ?? upload(req, ctx);
}
