import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { listResultRows } from "@/lib/runs/list-result-rows";
import { readRunResults } from "@/lib/runs/read-run-results";

/** The latest evaluation as data: verdict, findings, and the results in report units. */
export const GET = apiRoute("/api/runs/[id]/results.json", "GET", async (_req, { params }) => {
  const { run, stored, evaluation } = await readRunResults(z.uuid("Not a run id.").parse(params.id));
  const body = {
    run: { id: run.id, number: run.number, procedure: run.procedure, specimen: run.specimen.identifier },
    evaluatedAt: stored.evaluatedAt,
    runLogId: stored.runLogId,
    verdict: evaluation.verdict,
    conformity: evaluation.conformity,
    results: listResultRows(evaluation),
    ...(evaluation.retention && { retention: evaluation.retention }),
    // Every cycle of an endurance block (the page and the certificate show a summary).
    ...(evaluation.endurance && { endurance: evaluation.endurance }),
    findings: [...evaluation.runFindings, ...evaluation.steps.flatMap((s) => s.findings)],
  };
  return new Response(JSON.stringify(body, null, 2), {
    headers: { "content-type": "application/json; charset=utf-8", "content-disposition": `attachment; filename="${run.number}-results.json"` },
  });
});
