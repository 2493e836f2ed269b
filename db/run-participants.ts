import "server-only";
import type { Executor } from "./index";

export type RunActivity = "started" | "recorded" | "uploaded" | "submitted";

const ACTIVITY_WORDS: Record<RunActivity, string> = {
  started: "started it",
  recorded: "recorded its steps",
  uploaded: "uploaded its data log",
  submitted: "submitted it",
};

/** What one person did on a run, in words ("started it, recorded its steps"); empty if nothing. */
export async function describeRunParticipation(db: Executor, runId: string, userId: string): Promise<string | null> {
  const rows = await db
    .selectFrom("run_participant")
    .select("activity")
    .where("run_id", "=", runId)
    .where("user_id", "=", userId)
    .orderBy("first_at")
    .execute();
  return rows.length === 0 ? null : rows.map((r) => ACTIVITY_WORDS[r.activity]).join(", ");
}

/** The runs among `runIds` that `userId` took part in. */
export async function listRunsTakenPartIn(db: Executor, runIds: readonly string[], userId: string): Promise<Set<string>> {
  if (runIds.length === 0) return new Set();
  const rows = await db
    .selectFrom("run_participant")
    .select("run_id")
    .distinct()
    .where("run_id", "in", runIds)
    .where("user_id", "=", userId)
    .execute();
  return new Set(rows.map((r) => r.run_id));
}

/** The submitter is noted by the service (the database cannot tell who pressed "submit"). */
export async function noteRunSubmitter(db: Executor, runId: string, userId: string): Promise<void> {
  await db
    .insertInto("run_participant")
    .values({ run_id: runId, user_id: userId, activity: "submitted" })
    .onConflict((oc) => oc.doNothing())
    .execute();
}
