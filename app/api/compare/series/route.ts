import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { chosenDischargesSchema } from "@/lib/lots/results/compare-selection";
import { readOverlaySeries } from "@/lib/lots/results/read-overlay-series";
import { MAX_POINTS, MIN_POINTS } from "@/lib/runs/plan-series-read";

const pointsMessage = `points is a whole number from ${MIN_POINTS} to ${MAX_POINTS}.`;
const pointsSchema = z.coerce.number<unknown>().int(pointsMessage).min(MIN_POINTS, pointsMessage).max(MAX_POINTS, pointsMessage).default(1000);

/**
 * V against Q of each chosen reviewed discharge (`d`, repeated: R-00014.discharge.1), thinned on the
 * server to about `points` each. No `d`: no curves.
 */
export const GET = apiRoute("/api/compare/series", "GET", async (req) => {
  const url = new URL(req.url);
  const keys = chosenDischargesSchema.parse(url.searchParams.getAll("d"));
  const points = pointsSchema.parse(url.searchParams.get("points") ?? undefined);
  const view = keys.length === 0 ? { series: [], missing: [] } : await readOverlaySeries(keys, points);
  return Response.json(view, { headers: { "cache-control": "private, no-store" } });
});
