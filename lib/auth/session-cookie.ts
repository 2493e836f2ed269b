import { getDb } from "@/db";

/** The session cookie's name and attributes; lib/auth/lucia.ts uses the same. */
export const SESSION_COOKIE = "cellwright_session";
export const SESSION_LIFETIME_MS = 12 * 3_600_000;

export function sessionCookieAttributes(expires: Date) {
  return {
    httpOnly: true,
    // secure follows the deployment: a plain-http demo on loopback still works.
    secure: process.env.NODE_ENV === "production" && process.env.COOKIE_SECURE !== "false",
    sameSite: "lax" as const,
    path: "/",
    expires,
  };
}

/**
 * The session's expiry as the cookie must carry it (issue 11 row 10: the cookie outlived the session).
 * Sliding like the session library: a session past half its lifetime is extended to a full one. Null
 * when the session is unknown or over, so the cookie is removed. Runs in the proxy, once per request.
 */
export async function slideSession(sessionId: string, now = new Date()): Promise<Date | null> {
  const row = await getDb().selectFrom("user_session").select("expires_at").where("id", "=", sessionId).executeTakeFirst();
  if (!row || row.expires_at.getTime() <= now.getTime()) return null;
  if (row.expires_at.getTime() - now.getTime() >= SESSION_LIFETIME_MS / 2) return row.expires_at;
  const expiresAt = new Date(now.getTime() + SESSION_LIFETIME_MS);
  await getDb().updateTable("user_session").set({ expires_at: expiresAt }).where("id", "=", sessionId).execute();
  return expiresAt;
}
