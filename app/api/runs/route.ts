import { z } from "zod";
import { getDb } from "@/db";
import { listRuns } from "@/db/runs";
import { apiRoute } from "@/lib/auth/guards";

const filterSchema = z.object({
  status: z.enum(["planned", "in_progress", "submitted", "returned", "accepted", "certified", "abandoned"]).optional(),
  specimen: z.uuid("Not a specimen id.").optional(),
});

export const GET = apiRoute("/api/runs", "GET", async (req) => {
  const url = new URL(req.url);
  const filter = filterSchema.parse({ status: url.searchParams.get("status") ?? undefined, specimen: url.searchParams.get("specimen") ?? undefined });
  const runs = await listRuns(getDb(), { status: filter.status, specimenId: filter.specimen });
  return Response.json({
    runs: runs.map((r) => ({
      id: r.id,
      number: r.number,
      status: r.status,
      procedure: r.procedure,
      specimen: { id: r.specimen.id, identifier: r.specimen.identifier },
      operator: r.operator,
      createdAt: r.createdAt,
      startedAt: r.startedAt,
      submittedAt: r.submittedAt,
    })),
  });
});
