import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { MAX_POINTS, MIN_POINTS } from "@/lib/runs/plan-series-read";
import { readRunCapacitySeries, readRunTimeSeries } from "@/lib/runs/read-run-series";

const querySchema = z.object({
  step: z.string().trim().min(1).max(100).optional(),
  cycle: z.coerce.number<unknown>().int().min(1).default(1),
  points: z.coerce.number<unknown>().int().min(MIN_POINTS).max(MAX_POINTS).default(2000),
});

/**
 * A plot's data, thinned on the server: without `step`, V, I and T against time with the steps'
 * stretches; with `step` (and `cycle`), V against the capacity that step delivered. 404 without a log.
 */
export const GET = apiRoute("/api/runs/[id]/series", "GET", async (req, { params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const url = new URL(req.url);
  const q = querySchema.parse({
    step: url.searchParams.get("step") ?? undefined,
    cycle: url.searchParams.get("cycle") ?? undefined,
    points: url.searchParams.get("points") ?? undefined,
  });
  const series = q.step ? await readRunCapacitySeries(id, { stepId: q.step, cycle: q.cycle, points: q.points }) : await readRunTimeSeries(id, q.points);
  return Response.json(series, { headers: { "cache-control": "private, no-store" } });
});
