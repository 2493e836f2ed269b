import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { listExportedResults, toFileName } from "@/lib/lots/results/export-results";
import { readLotResults } from "@/lib/lots/results/read-results";
import { toSummaryJson } from "@/lib/lots/results/summary-json";

/** The lot's reviewed discharge results with the statistics and rate table made from them, as data. */
export const GET = apiRoute("/api/lots/[id]/results.json", "GET", async (_req, { params }) => {
  const lotResults = await readLotResults(z.uuid("Not a lot id.").parse(params.id));
  const { lot, specification, results } = lotResults;
  const body = {
    lot: { id: lot.id, identifier: lot.identifier, specification: `${specification.maker} ${specification.model}` },
    results: listExportedResults(results, specification.data),
    ...toSummaryJson(lotResults),
  };
  return new Response(JSON.stringify(body, null, 2), {
    headers: {
      "content-type": "application/json; charset=utf-8",
      "content-disposition": `attachment; filename="${toFileName(lot.identifier)}-results.json"`,
      "cache-control": "private, no-store",
    },
  });
});
