import "server-only";
import type { Executor } from "./index";

export async function insertSession(db: Executor, s: { id: string; userId: string; expiresAt: Date }): Promise<void> {
  await db.insertInto("user_session").values({ id: s.id, user_id: s.userId, expires_at: s.expiresAt }).execute();
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
