import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { formatResultsCsv, listExportedResults, toFileName } from "@/lib/lots/results/export-results";
import { readLotResults } from "@/lib/lots/results/read-results";

/** The lot's reviewed discharge results, one line each: the numbers behind its statistics. */
export const GET = apiRoute("/api/lots/[id]/results.csv", "GET", async (_req, { params }) => {
  const { lot, specification, results } = await readLotResults(z.uuid("Not a lot id.").parse(params.id));
  return new Response(formatResultsCsv(listExportedResults(results, specification.data)), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${toFileName(lot.identifier)}-results.csv"`,
      "cache-control": "private, no-store",
    },
  });
});
