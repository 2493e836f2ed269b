import { z } from "zod";
import { getDb } from "@/db";
import { getLotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import { apiRoute } from "@/lib/auth/guards";
import { toSummaryJson } from "@/lib/lots/results/summary-json";
import { readLotResults } from "@/lib/lots/results/read-results";

/** A lot at a glance: its sampling plan, draw and decision, statistics per current and rate capability. */
export const GET = apiRoute("/api/lots/[id]/summary", "GET", async (_req, { params }) => {
  const lotId = z.uuid("Not a lot id.").parse(params.id);
  const [results, sampling] = await Promise.all([readLotResults(lotId), getLotSampling(getDb(), lotId)]);
  const { lot, specification } = results;
  return Response.json(
    {
      lot: {
        id: lot.id,
        identifier: lot.identifier,
        supplier: lot.supplier,
        customer: lot.customer,
        quantityReceived: lot.quantityReceived,
        receivedOn: lot.receivedOn,
        specification: { id: specification.id, maker: specification.maker, model: specification.model, designation: specification.designation },
      },
      plan: sampling?.plan ?? null,
      acceptanceProcedure: sampling?.acceptanceProcedure ?? null,
      draw: sampling?.draw ?? null,
      sampleCounts: sampling?.counts ?? null,
      decision: sampling?.decision ?? null,
      ...toSummaryJson(results),
    },
    { headers: { "cache-control": "private, no-store" } },
  );
});
