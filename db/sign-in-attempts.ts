import "server-only";
import type { Executor } from "./index";

export async function recordSignInAttempt(
  db: Executor,
  a: { email: string; address: string; succeeded: boolean },
): Promise<void> {
  await db.insertInto("sign_in_attempt").values(a).execute();
}

/** Failed attempts since `since`, counted per account and per address. */
export async function countRecentFailures(
  db: Executor,
  q: { email: string; address: string; since: Date },
): Promise<{ byEmail: number; byAddress: number }> {
  const row = await db
    .selectFrom("sign_in_attempt")
    .select((eb) => [
      eb.fn.countAll<string>().filterWhere("email", "=", q.email).as("by_email"),
      eb.fn.countAll<string>().filterWhere("address", "=", q.address).as("by_address"),
    ])
    .where("succeeded", "=", false)
    .where("at", ">", q.since)
    .where((eb) => eb.or([eb("email", "=", q.email), eb("address", "=", q.address)]))
    .executeTakeFirstOrThrow();
  return { byEmail: Number(row.by_email), byAddress: Number(row.by_address) };
}
