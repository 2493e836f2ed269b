import { randomBytes } from "node:crypto";
import { test as base, expect, type BrowserContext } from "@playwright/test";
import pg from "pg";
import type { Role } from "../../db/schema";
import { DEMO_USERS } from "@/scenarios/demo-lab";

export const SESSION_COOKIE = "cellwright_session";

export function demoUser(role: Role) {
  const u = DEMO_USERS.find((x) => x.role === role);
  if (!u) throw new Error(`no demo user for ${role}`);
  return u;
}

/**
 * Opens a session for a demo user straight in the test database and hands its cookie to the
 * browser: only the sign-in spec goes through the form, every other spec starts signed in.
 */
export async function openSession(email: string): Promise<string> {
  const client = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  await client.connect();
  try {
    const id = randomBytes(20).toString("hex");
    const r = await client.query(
      `insert into user_session (id, user_id, expires_at)
       select $1, id, now() + interval '2 hours' from app_user where email = $2 returning id`,
      [id, email],
    );
    if (r.rowCount !== 1) throw new Error(`no user ${email} in the e2e database`);
    return id;
  } finally {
    await client.end();
  }
}

export async function signInAs(context: BrowserContext, baseURL: string, role: Role): Promise<void> {
  await signInAsUser(context, baseURL, demoUser(role).email);
}

export async function signInAsUser(context: BrowserContext, baseURL: string, email: string): Promise<void> {
  const sessionId = await openSession(email);
  await context.addCookies([{ name: SESSION_COOKIE, value: sessionId, url: baseURL, httpOnly: true, sameSite: "Lax" }]);
}

export const test = base;
export { expect };
