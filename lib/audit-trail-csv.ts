import Papa from "papaparse";
import type { AuditEventView } from "@/db/audit";
import { describeAuditAction, describeAuditRecord, summariseAuditChange } from "@/lib/audit-labels";

/**
 * The audit trail as people read it on screen, as CSV (a spreadsheet opens it): one event a row, what
 * changed as "field: was → now" lines. The evidence bundle keeps its own CSV with the stored JSON.
 */
export function formatReadableAuditCsv(events: readonly AuditEventView[]): string {
  return Papa.unparse({
    fields: ["When (UTC)", "Who", "What happened", "Record", "What changed (was → now)", "From"],
    data: events.map((e) => [
      e.at.toISOString().replace("T", " ").slice(0, 19),
      e.actorLabel,
      describeAuditAction(e.action),
      describeAuditRecord(e.entityType, e.entityLabel),
      summariseAuditChange(e.before, e.after, e.detail).join("\n"),
      e.address ?? "",
    ]),
  });
}
