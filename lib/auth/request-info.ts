import "server-only";
import { headers } from "next/headers";

/** The path the proxy saw, so a sign-in redirect can bring the person back to it. */
export async function getRequestPath(): Promise<string | null> {
  return (await headers()).get("x-cellwright-path");
}

/**
 * Where a request came from, as the proxy's headers give it: read once, carried into the audit trail.
 * Behind a proxy the first x-forwarded-for entry is the client; `next start` fills that header from
 * the socket itself when no proxy set it (scripts/client-address.mjs settles it).
 */
export async function readRequestOrigin(): Promise<{ address: string; client?: string }> {
  const h = await headers();
  const forwarded = h.get("x-forwarded-for")?.split(",")[0]?.trim();
  return { address: forwarded || h.get("x-real-ip") || "unknown", client: h.get("user-agent") ?? undefined };
}
