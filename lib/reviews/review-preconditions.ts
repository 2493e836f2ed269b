import "server-only";
import type { Executor } from "@/db";
import { describeRunParticipation } from "@/db/run-participants";
import { getRun, type RunView } from "@/db/runs";
import { can } from "@/lib/auth/permissions";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/**
 * What every review decision needs: an engineer, a run that is waiting for review, and a reviewer who
 * took no part in it: started, recorded, uploaded or submitted (docs/design.md §2; the database refuses that too). `forUpdate` locks the run, so two
 * reviewers deciding at once are taken one after the other.
 */
export async function loadRunForReview(tx: Executor, actor: SignedInUser, runId: string, opts: { forUpdate?: boolean } = {}): Promise<RunView> {
  if (!can(actor.role, "run.review")) throw new DomainError("forbidden", "Only an engineer reviews runs.");
  const run = await getRun(tx, runId, opts);
  if (!run) throw new DomainError("not-found", "No such run.");
  const tookPart = await describeRunParticipation(tx, runId, actor.id);
  if (tookPart) {
    throw new DomainError("forbidden", `You took part in run ${run.number} (you ${tookPart}), so you cannot review it: another engineer must. Nothing was changed.`);
  }
  if (run.status !== "submitted") {
    throw new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}; only a run submitted for review can be returned or accepted. Nothing was changed.`);
  }
  return run;
}

export function actorLabel(actor: SignedInUser): string {
  return `${actor.displayName} <${actor.email}>`;
}
