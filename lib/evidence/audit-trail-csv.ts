import Papa from "papaparse";
import type { AuditEventView } from "@/db/audit";

const COLUMNS = ["at (UTC)", "who", "action", "record", "record id", "before", "after", "detail", "address"] as const;

/** The audit trail as CSV for an assessor: one event a row, JSON parts kept as JSON text. */
export function formatAuditTrailCsv(events: readonly AuditEventView[]): string {
  const json = (v: unknown) => (v === null || v === undefined ? "" : JSON.stringify(v));
  return Papa.unparse({
    fields: [...COLUMNS],
    data: events.map((e) => [
      e.at.toISOString(),
      e.actorLabel,
      e.action,
      e.entityLabel ?? e.entityType ?? "",
      e.entityId ?? "",
      json(e.before),
      json(e.after),
      json(e.detail),
      e.address ?? "",
    ]),
  });
}
