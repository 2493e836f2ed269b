import { apiRoute } from "@/lib/auth/guards";
import { chosenDischargesSchema } from "@/lib/lots/results/compare-selection";
import { formatResultsCsv, listExportedResults } from "@/lib/lots/results/export-results";
import { findChosenDischarges } from "@/lib/lots/results/read-overlay-series";

/** The numbers of the chosen discharges (`d`, repeated), one line each, in the order chosen. */
export const GET = apiRoute("/api/compare/results.csv", "GET", async (req) => {
  const keys = chosenDischargesSchema.parse(new URL(req.url).searchParams.getAll("d"));
  const { found } = keys.length === 0 ? { found: [] } : await findChosenDischarges(keys);
  // Each row carries its own cell's rating: the chosen discharges may be of several specifications.
  const rows = found.flatMap(({ row }) => listExportedResults([row], row.rating));
  return new Response(formatResultsCsv(rows), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": 'attachment; filename="compared-discharges.csv"',
      "cache-control": "private, no-store",
    },
  });
});
