import { z } from "zod";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";

/** The caller names the log it saw, so a page left open never re-evaluates a different log unknowingly. */
const bodySchema = z.strictObject({
  runLogId: z.uuid("Not a log id.").nullable(),
  /** Judge the records against another released version of the same procedure (marked as such). */
  againstVersionId: z.uuid("Not a procedure version id.").optional(),
});

/** Evaluates the run again from what is stored (operator or reviewer: ROUTE_ACCESS admits either). */
export const POST = apiRoute("/api/runs/[id]/evaluations", "POST", async (req, { user, params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const body = bodySchema.parse(await req.json().catch(() => null));
  const log = await getCurrentRunLog(getDb(), id);
  if ((log?.id ?? null) !== body.runLogId) throw new DomainError("conflict", "The run's data log changed since this page was loaded; reload it first.");
  const evaluation = await evaluateStoredRun(user, id, { againstVersionId: body.againstVersionId });
  return Response.json({ verdict: evaluation.verdict, evaluatedAgainst: evaluation.evaluatedAgainst }, { status: 201 });
});
