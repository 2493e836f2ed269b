import "server-only";
import { NodePostgresAdapter } from "@lucia-auth/adapter-postgresql";
import { Lucia, TimeSpan, generateIdFromEntropySize } from "lucia";
import { getPool } from "@/db/pool";
import type { Role } from "@/db/schema";
import { SESSION_COOKIE, SESSION_LIFETIME_MS } from "./session-cookie";

// All session-library code stays in lib/auth/: the library is no longer developed and may be swapped.

/** A working day plus margin; an active user's session is extended while in use. */
export const SESSION_LIFETIME = new TimeSpan(SESSION_LIFETIME_MS / 3_600_000, "h");
export { SESSION_COOKIE };

function createLucia() {
  return new Lucia(new NodePostgresAdapter(getPool(), { user: "app_user", session: "user_session" }), {
    sessionExpiresIn: SESSION_LIFETIME,
    sessionCookie: {
      name: SESSION_COOKIE,
      // The cookie ends with the session (Max-Age = the session's lifetime); the proxy slides both.
      expires: true,
      attributes: {
        // httpOnly is always set by the library; secure follows the deployment.
        secure: process.env.NODE_ENV === "production" && process.env.COOKIE_SECURE !== "false",
        sameSite: "lax",
      },
    },
    getUserAttributes: (a) => ({ email: a.email, displayName: a.display_name, role: a.role, active: a.active }),
  });
}

const globalForLucia = globalThis as unknown as { cellwrightLucia?: ReturnType<typeof createLucia> };

export function getLucia() {
  globalForLucia.cellwrightLucia ??= createLucia();
  return globalForLucia.cellwrightLucia;
}

export function newSessionId(): string {
  return generateIdFromEntropySize(25);
}

export function newUserId(): string {
  return generateIdFromEntropySize(10);
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: { email: string; display_name: string; role: Role; active: boolean };
  }
}
