import { z } from "zod";
import { getDb } from "@/db";
import { listRunsPage } from "@/db/runs";
import { apiRoute } from "@/lib/auth/guards";
import { API_PAGE_SIZE, parsePageNumber } from "@/lib/lists/list-params";

const filterSchema = z.object({
  status: z.enum(["planned", "in_progress", "submitted", "returned", "accepted", "certified", "abandoned"]).optional(),
  specimen: z.uuid("Not a specimen id.").optional(),
});

/** Runs, the newest planned first, a page at a time (`page`, `pageCount`, `total`); ?status=&specimen=&page=N. */
export const GET = apiRoute("/api/runs", "GET", async (req) => {
  const url = new URL(req.url);
  const filter = filterSchema.parse({ status: url.searchParams.get("status") ?? undefined, specimen: url.searchParams.get("specimen") ?? undefined });
  const page = parsePageNumber({ page: url.searchParams.get("page") ?? undefined });
  const runs = await listRunsPage(getDb(), { status: filter.status, specimenId: filter.specimen }, { page, pageSize: API_PAGE_SIZE, sort: "planned", direction: "desc" });
  return Response.json({
    page: runs.page,
    pageCount: runs.pageCount,
    total: runs.total,
    runs: runs.rows.map((r) => ({
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
