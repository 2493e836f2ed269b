import { z } from "zod";
import { readLimitedChunks } from "@/lib/api/limited-body";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { pushLogPart } from "@/lib/machine-tokens/push-log-part";
import { appendLogPart } from "@/lib/runs/log-parts/append-log-part";
import { LOG_MAX_BYTES } from "@/lib/runs/store-log-while-reading";

const querySchema = z.object({
  run: z.string().regex(/^R-\d{5,}$/, "Name the run by its number, e.g. ?run=R-00012."),
  name: z
    .string()
    .trim()
    .min(1, "Name the file (?name=…).")
    .max(200, "Use a file name of at most 200 characters.")
    .regex(/^[\w .,()+-]+$/, "Use a file name of letters, digits, spaces and . , ( ) + - _ only."),
});

/**
 * One log part pushed by a cycler PC (`npm run push-log`, docs/push-log.md): the raw file as the body,
 * `Authorization: Bearer <token>` of the run's cycler channel, no cookie, no Origin. The proxy leaves this
 * route out (it would refuse a write without an Origin, and buffer the body): the token is the proof of
 * who sends, and it opens no other route (apiRoute reads it only where ROUTE_ACCESS says "machine-token").
 * Answers 202 with the part queued for reading, or 200 when the same bytes were stored before.
 */
export const POST = apiRoute("/api/channel/log-parts", "POST", async (req, { user: machine }) => {
  const url = new URL(req.url);
  const q = querySchema.parse({ run: url.searchParams.get("run") ?? "", name: url.searchParams.get("name") ?? "" });
  const declared = Number(req.headers.get("content-length") ?? Number.NaN);
  if (declared > LOG_MAX_BYTES) throw new DomainError("too-large", `The part is ${(declared / 1048576).toFixed(0)} MiB; a part may be at most ${LOG_MAX_BYTES / 1048576} MiB.`);
  if (!Number.isSafeInteger(declared) || declared < 0) throw new DomainError("invalid", "Send the part with its size (a Content-Length header).");
  const chunks = req.body ? readLimitedChunks(req.body, LOG_MAX_BYTES, () => `A part may be at most ${LOG_MAX_BYTES / 1048576} MiB.`) : emptyBody();
  const outcome = await pushLogPart(machine, q.run, { name: q.name, chunks, sizeBytes: declared }, appendLogPart);
  const body = outcome.outcome === "queued" ? { outcome: "queued", partId: outcome.partId, jobId: outcome.jobId, run: outcome.run } : { outcome: "already-stored", partId: outcome.partId, run: outcome.run };
  return Response.json(body, { status: outcome.outcome === "queued" ? 202 : 200, headers: { "cache-control": "no-store" } });
});

async function* emptyBody(): AsyncIterable<Uint8Array> {}
