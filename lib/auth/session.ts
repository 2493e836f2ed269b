import "server-only";
import { cookies } from "next/headers";
import { cache } from "react";
import type { Executor } from "@/db";
import { deleteSession, insertSession } from "@/db/sessions";
import { getLucia, newSessionId, SESSION_LIFETIME } from "./lucia";
import type { SignedInUser } from "./signed-in-user";

export interface CurrentSession {
  user: SignedInUser;
  sessionId: string;
}

/**
 * The caller's session from the cookie, validated against the database once per request.
 * An expired, deleted (deactivated user) or forged session id yields null.
 */
export const getCurrentSession = cache(async (): Promise<CurrentSession | null> => {
  // Reading the cookie first also marks every caller as dynamic, so nothing is prerendered at build.
  const jar = await cookies();
  const lucia = getLucia();
  const sessionId = jar.get(lucia.sessionCookieName)?.value ?? null;
  if (!sessionId) return null;
  const { session, user } = await lucia.validateSession(sessionId);
  // Cookies can only be written from actions and route handlers; elsewhere this throws and is ignored.
  try {
    if (session?.fresh) {
      const c = lucia.createSessionCookie(session.id);
      jar.set(c.name, c.value, c.attributes);
    }
    if (!session) {
      const c = lucia.createBlankSessionCookie();
      jar.set(c.name, c.value, c.attributes);
    }
  } catch {
    // rendering a server component: the cookie is refreshed on the next action
  }
  if (!session || !user || !user.active) return null;
  return {
    sessionId: session.id,
    user: { id: user.id, email: user.email, displayName: user.displayName, role: user.role },
  };
});

/** Creates a session row inside the caller's transaction, so it commits with its audit event. */
export async function createSession(db: Executor, userId: string, seenFrom: { address?: string; client?: string } = {}): Promise<string> {
  const id = newSessionId();
  await insertSession(db, { id, userId, expiresAt: new Date(Date.now() + SESSION_LIFETIME.milliseconds()), ...seenFrom });
  return id;
}

export async function setSessionCookie(sessionId: string): Promise<void> {
  const c = getLucia().createSessionCookie(sessionId);
  (await cookies()).set(c.name, c.value, c.attributes);
}

export async function clearSessionCookie(): Promise<void> {
  const c = getLucia().createBlankSessionCookie();
  (await cookies()).set(c.name, c.value, c.attributes);
}

export async function endSession(db: Executor, sessionId: string): Promise<void> {
  await deleteSession(db, sessionId);
}

