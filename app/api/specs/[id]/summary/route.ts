import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { readSpecificationResults } from "@/lib/lots/results/read-results";
import { toSummaryJson } from "@/lib/lots/results/summary-json";

/** A cell specification's reviewed results: statistics per current and each datasheet claim beside them. */
export const GET = apiRoute("/api/specs/[id]/summary", "GET", async (_req, { params }) => {
  const results = await readSpecificationResults(z.uuid("Not a cell specification id.").parse(params.id));
  const { specification, comparison } = results;
  return Response.json(
    {
      specification: { id: specification.id, maker: specification.maker, model: specification.model, designation: specification.designation },
      ...toSummaryJson(results),
      datasheetComparison: comparison.ok ? comparison.value : { problem: comparison.error.message },
    },
    { headers: { "cache-control": "private, no-store" } },
  );
});
