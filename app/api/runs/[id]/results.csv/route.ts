import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { formatResultsCsv, listResultRows } from "@/lib/runs/list-result-rows";
import { readRunResults } from "@/lib/runs/read-run-results";

/** The results of the latest evaluation, one line per step and cycle. */
export const GET = apiRoute("/api/runs/[id]/results.csv", "GET", async (_req, { params }) => {
  const { run, evaluation } = await readRunResults(z.uuid("Not a run id.").parse(params.id));
  return new Response(formatResultsCsv(listResultRows(evaluation)), {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${run.number}-results.csv"` },
  });
});
