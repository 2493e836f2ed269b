import { z } from "zod";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { readCycleTrend } from "@/lib/runs/read-cycle-trend";

/** The run's results per cycle and its retention trend; the run page polls it while log parts arrive. */
export const GET = apiRoute("/api/runs/[id]/cycles", "GET", async (_req, { params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const trend = await readCycleTrend(id);
  if (!trend) throw new DomainError("not-found", "No such run.");
  return Response.json(trend, { headers: { "cache-control": "private, no-store" } });
});
