import "server-only";
import { createHash } from "node:crypto";
import type { Executor } from "./index";

export async function insertSession(db: Executor, s: { id: string; userId: string; expiresAt: Date; address?: string; client?: string }): Promise<void> {
  await db
    .insertInto("user_session")
    .values({ id: s.id, user_id: s.userId, expires_at: s.expiresAt, address: s.address?.slice(0, 100) ?? null, client: s.client?.slice(0, 200) ?? null })
    .execute();
}

export async function deleteSession(db: Executor, id: string): Promise<void> {
  await db.deleteFrom("user_session").where("id", "=", id).execute();
}

/** Ends every session of a user at once (deactivation, role change). Returns how many ended. */
export async function deleteUserSessions(db: Executor, userId: string): Promise<number> {
  const r = await db.deleteFrom("user_session").where("user_id", "=", userId).executeTakeFirst();
  return Number(r.numDeletedRows);
}

export async function countUserSessions(db: Executor, userId: string): Promise<number> {
  const row = await db
    .selectFrom("user_session")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("user_id", "=", userId)
    .where("expires_at", ">", new Date())
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** What a page may show of a session: never its id, only a short hash of it to tell them apart. */
export interface SessionView {
  handle: string;
  createdAt: Date;
  expiresAt: Date;
  address: string | null;
  client: string | null;
}

export function sessionHandle(sessionId: string): string {
  return createHash("sha256").update(sessionId).digest("hex").slice(0, 12);
}

export async function listUserSessions(db: Executor, userId: string): Promise<SessionView[]> {
  const rows = await db
    .selectFrom("user_session")
    .select(["id", "created_at", "expires_at", "address", "client"])
    .where("user_id", "=", userId)
    .where("expires_at", ">", new Date())
    .orderBy("created_at", "desc")
    .execute();
  return rows.map((r) => ({ handle: sessionHandle(r.id), createdAt: r.created_at, expiresAt: r.expires_at, address: r.address, client: r.client }));
}

/** Ends every session of a user but one (changing one's own password keeps the session in use). */
export async function deleteOtherSessions(db: Executor, userId: string, keepId: string): Promise<number> {
  const r = await db.deleteFrom("user_session").where("user_id", "=", userId).where("id", "<>", keepId).executeTakeFirst();
  return Number(r.numDeletedRows);
}
