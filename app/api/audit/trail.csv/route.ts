import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { formatReadableAuditCsv } from "@/lib/audit-trail-csv";
import { auditTrailSearchSchema, toAuditFilter } from "@/lib/audit-trail-filter";
import { apiRoute } from "@/lib/auth/guards";

const EXPORT_LIMIT = 10_000;

/** The audit trail with the page's filters, as CSV, newest first (at most 10 000 entries per file). */
export const GET = apiRoute("/api/audit/trail.csv", "GET", async (req) => {
  const search = auditTrailSearchSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const events = await listAuditEvents(getDb(), { ...toAuditFilter(search), beforeId: undefined, limit: EXPORT_LIMIT });
  return new Response(formatReadableAuditCsv(events), {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="audit-trail.csv"` },
  });
});
