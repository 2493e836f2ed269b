/** What became of one attempt to send a part. */
export type SendAnswer =
  | { kind: "stored"; partId: string; alreadyStored: boolean }
  /** Worth trying again later: the network, the server busy or restarting, the rate limit. */
  | { kind: "retry"; message: string; waitMs?: number }
  /** The server refused and says why: sending again would be refused again. */
  | { kind: "refused"; status: number; message: string };

export interface PartToSend {
  base: string;
  run: string;
  token: string;
  name: string;
  bytes: Uint8Array<ArrayBuffer>;
}

/** The address a part is pushed to. */
export function partUrl(base: string, run: string, name: string): string {
  const url = new URL("/api/channel/log-parts", base);
  url.searchParams.set("run", run);
  url.searchParams.set("name", name);
  return url.toString();
}

/** One POST of one part with the channel's token; no cookie, no Origin. Never throws. */
export async function sendPart(p: PartToSend, fetcher: typeof fetch = fetch, timeoutMs = 120_000): Promise<SendAnswer> {
  let res: Response;
  try {
    res = await fetcher(partUrl(p.base, p.run, p.name), {
      method: "POST",
      headers: { authorization: `Bearer ${p.token}`, "content-type": "text/csv", "content-length": String(p.bytes.byteLength) },
      body: p.bytes,
      signal: AbortSignal.timeout(timeoutMs),
    });
  } catch (error) {
    return { kind: "retry", message: `the server could not be reached (${describeNetworkError(error)})` };
  }
  const body = (await res.json().catch(() => null)) as { outcome?: string; partId?: string; error?: { message?: string } } | null;
  if (res.ok && body && (body.outcome === "queued" || body.outcome === "already-stored") && typeof body.partId === "string") {
    return { kind: "stored", partId: body.partId, alreadyStored: body.outcome === "already-stored" };
  }
  const message = body?.error?.message ?? `the server answered ${res.status} ${res.statusText}`.trim();
  if (res.status === 429) {
    const seconds = Number(res.headers.get("retry-after"));
    return { kind: "retry", message, ...(Number.isFinite(seconds) && seconds > 0 && { waitMs: seconds * 1000 }) };
  }
  if (res.status >= 500 || res.status === 408 || (res.ok && !body)) return { kind: "retry", message };
  return { kind: "refused", status: res.status, message };
}

function describeNetworkError(error: unknown): string {
  const cause = (error as { cause?: { code?: string } })?.cause?.code;
  if (cause) return cause;
  if (error instanceof Error && error.name === "TimeoutError") return "no answer in time";
  return error instanceof Error ? error.message : String(error);
}
