import "server-only";
import { headers } from "next/headers";

/**
 * The client address as the server saw it. Behind a proxy the first x-forwarded-for entry is the
 * client; `next start` fills that header from the socket itself when no proxy set it.
 */
export async function getRequestAddress(): Promise<string> {
  const h = await headers();
  const forwarded = h.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || h.get("x-real-ip") || "unknown";
}

/** The path the proxy saw, so a sign-in redirect can bring the person back to it. */
export async function getRequestPath(): Promise<string | null> {
  return (await headers()).get("x-cellwright-path");
}
