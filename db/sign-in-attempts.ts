import "server-only";
import type { Executor } from "./index";

export async function recordSignInAttempt(
  db: Executor,
  a: { email: string; address: string; succeeded: boolean },
): Promise<void> {
  await db.insertInto("sign_in_attempt").values(a).execute();
}

/** Failed attempts since `since`: for the account, from the address, and for the account from the address. */
export async function countRecentFailures(
  db: Executor,
  q: { email: string; address: string; since: Date },
): Promise<{ byEmail: number; byAddress: number; byPair: number }> {
  const row = await db
    .selectFrom("sign_in_attempt")
    .select((eb) => [
      eb.fn.countAll<string>().filterWhere("email", "=", q.email).as("by_email"),
      eb.fn.countAll<string>().filterWhere("address", "=", q.address).as("by_address"),
      eb.fn.countAll<string>().filterWhere((f) => f.and([f("email", "=", q.email), f("address", "=", q.address)])).as("by_pair"),
    ])
    .where("succeeded", "=", false)
    .where("at", ">", q.since)
    .where((eb) => eb.or([eb("email", "=", q.email), eb("address", "=", q.address)]))
    .executeTakeFirstOrThrow();
  return { byEmail: Number(row.by_email), byAddress: Number(row.by_address), byPair: Number(row.by_pair) };
}

export interface FailureGroup {
  email: string | null;
  address: string | null;
  failures: number;
  lastAt: Date;
}

/** Failures since `since` grouped by (account, address), by address and by account, at or above each threshold. */
export async function listFailureGroups(
  db: Executor,
  q: { since: Date; pair: number; address: number; account: number },
): Promise<{ pairs: FailureGroup[]; addresses: FailureGroup[]; accounts: FailureGroup[] }> {
  const base = db.selectFrom("sign_in_attempt").where("succeeded", "=", false).where("at", ">", q.since);
  const [pairs, addresses, accounts] = await Promise.all([
    base.select((eb) => ["email", "address", eb.fn.countAll<string>().as("n"), eb.fn.max("at").as("last")]).groupBy(["email", "address"]).having((eb) => eb.fn.countAll(), ">=", q.pair).orderBy("last", "desc").limit(200).execute(),
    base.select((eb) => ["address", eb.fn.countAll<string>().as("n"), eb.fn.max("at").as("last")]).groupBy("address").having((eb) => eb.fn.countAll(), ">=", q.address).orderBy("last", "desc").limit(200).execute(),
    base.select((eb) => ["email", eb.fn.countAll<string>().as("n"), eb.fn.max("at").as("last")]).groupBy("email").having((eb) => eb.fn.countAll(), ">=", q.account).orderBy("last", "desc").limit(200).execute(),
  ]);
  return {
    pairs: pairs.map((r) => ({ email: r.email, address: r.address, failures: Number(r.n), lastAt: r.last })),
    addresses: addresses.map((r) => ({ email: null, address: r.address, failures: Number(r.n), lastAt: r.last })),
    accounts: accounts.map((r) => ({ email: r.email, address: null, failures: Number(r.n), lastAt: r.last })),
  };
}

/** Forgets the failed attempts of an account, an address or both (an administrator clearing a limit). */
export async function clearFailures(db: Executor, q: { email?: string; address?: string }): Promise<number> {
  let del = db.deleteFrom("sign_in_attempt").where("succeeded", "=", false);
  if (q.email) del = del.where("email", "=", q.email);
  if (q.address) del = del.where("address", "=", q.address);
  const r = await del.executeTakeFirst();
  return Number(r.numDeletedRows);
}
