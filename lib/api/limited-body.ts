import { DomainError } from "@/lib/errors";

/**
 * Request bodies are counted as they arrive and reading stops at the limit, whatever the client
 * declared (a chunked body has no Content-Length). Nothing beyond `maxBytes` + one chunk is held.
 */
export async function* readLimitedChunks(body: ReadableStream<Uint8Array>, maxBytes: number, tooLarge: () => string): AsyncIterable<Uint8Array> {
  const reader = body.getReader();
  let total = 0;
  let finished = false;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) {
        finished = true;
        return;
      }
      total += value.byteLength;
      if (total > maxBytes) throw new DomainError("too-large", tooLarge());
      yield value;
    }
  } finally {
    // Stop the upload where it is: the rest is never read.
    if (!finished) await reader.cancel().catch(() => undefined);
    reader.releaseLock();
  }
}

/** Refuses at once when the declared length is over the limit; otherwise reads at most `maxBytes`. */
export async function readLimitedBody(req: Request, maxBytes: number, tooLarge: () => string): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (Number.isFinite(declared) && declared > maxBytes) throw new DomainError("too-large", tooLarge());
  if (!req.body) return new Uint8Array(0);
  const parts: Uint8Array[] = [];
  let total = 0;
  for await (const chunk of readLimitedChunks(req.body, maxBytes, tooLarge)) {
    parts.push(chunk);
    total += chunk.byteLength;
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const p of parts) {
    bytes.set(p, at);
    at += p.byteLength;
  }
  return bytes;
}

/** A multipart form read within the limit: the bytes are counted first, then parsed. */
export async function readLimitedForm(req: Request, maxBytes: number, tooLarge: () => string): Promise<FormData> {
  const bytes = await readLimitedBody(req, maxBytes, tooLarge);
  try {
    return await new Response(bytes, { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new DomainError("invalid", "The upload was not a complete form; choose the file and send it again.");
  }
}
