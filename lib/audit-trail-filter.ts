import { z } from "zod";

// The audit trail's filters as they travel in a URL: the page and its CSV export read the same ones.

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/)
  .optional()
  .catch(undefined);

export const auditTrailSearchSchema = z.object({
  action: z.string().max(60).optional().catch(undefined),
  person: z.string().max(200).optional().catch(undefined),
  kind: z.string().max(40).optional().catch(undefined),
  record: z.string().trim().max(100).optional().catch(undefined),
  from: day,
  to: day,
  before: z.string().regex(/^\d+$/).optional().catch(undefined),
});

export type AuditTrailSearch = z.infer<typeof auditTrailSearchSchema>;

/** The search as filters for db/audit: dates are whole UTC days, "to" included. */
export function toAuditFilter(search: AuditTrailSearch) {
  const to = search.to ? new Date(`${search.to}T00:00:00.000Z`) : undefined;
  if (to) to.setUTCDate(to.getUTCDate() + 1);
  return {
    action: search.action || undefined,
    actorId: search.person || undefined,
    entityType: search.kind || undefined,
    recordName: search.record || undefined,
    from: search.from ? new Date(`${search.from}T00:00:00.000Z`) : undefined,
    to,
    beforeId: search.before,
  };
}

/** The search as URL parameters, without the empty ones (for "older entries" and the export link). */
export function toAuditSearchParams(search: AuditTrailSearch, extra: Record<string, string> = {}): URLSearchParams {
  const entries = Object.entries({ ...search, before: undefined, ...extra }).filter((e): e is [string, string] => typeof e[1] === "string" && e[1] !== "");
  return new URLSearchParams(entries);
}
