import { z } from "zod";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { apiRoute } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { DomainError } from "@/lib/errors";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";

/** The caller names the log it saw, so a page left open never re-evaluates a different log unknowingly. */
const bodySchema = z.strictObject({
  runLogId: z.uuid("Not a log id.").nullable(),
  /** Judge the records against another released version of the same procedure (marked as such). */
  againstVersionId: z.uuid("Not a procedure version id.").optional(),
});

/** Evaluates the run again from what is stored (operator or reviewer). */
export const POST = apiRoute<{ id: string }>("run.read", async (req, { user, params }) => {
  if (!can(user.role, "run.operate") && !can(user.role, "run.review")) throw new DomainError("forbidden", "Only the operator or a reviewer may evaluate a run.");
  const id = z.uuid("Not a run id.").parse(params.id);
  const body = bodySchema.parse(await req.json().catch(() => null));
  const log = await getCurrentRunLog(getDb(), id);
  if ((log?.id ?? null) !== body.runLogId) throw new DomainError("conflict", "The run's data log changed since this page was loaded; reload it first.");
  const evaluation = await evaluateStoredRun(user, id, { againstVersionId: body.againstVersionId });
  return Response.json({ verdict: evaluation.verdict, evaluatedAgainst: evaluation.evaluatedAgainst }, { status: 201 });
});
