import "server-only";
import { sql } from "kysely";
import { currentAuditContext } from "./audit-context";
import type { Executor } from "./index";

export interface AuditEntry {
  actorId: string | null;
  /** Who did it, as a person reads it: "Dana Ilves <dana@…>", or "anonymous" for failed sign-ins. */
  actorLabel: string;
  /** `area.verb`, e.g. `auth.sign-in`, `user.deactivate`. */
  action: string;
  entityType?: string;
  entityId?: string;
  before?: unknown;
  after?: unknown;
  detail?: unknown;
  address?: string | null;
}

/**
 * Appends to the audit trail. Call it with the same transaction as the change it records. Without an
 * address of its own, the event takes the one of the server action it runs in (db/audit-context.ts).
 */
export async function recordAuditEvent(db: Executor, entry: AuditEntry): Promise<void> {
  await db
    .insertInto("audit_event")
    .values({
      actor_id: entry.actorId,
      actor_label: entry.actorLabel,
      action: entry.action,
      entity_type: entry.entityType ?? null,
      entity_id: entry.entityId ?? null,
      before: toJson(entry.before),
      after: toJson(entry.after),
      detail: toJson(entry.detail),
      address: entry.address ?? currentAuditContext()?.address ?? null,
    })
    .execute();
}

function toJson(value: unknown): string | null {
  return value === undefined ? null : JSON.stringify(value);
}

export interface AuditEventView {
  id: string;
  at: Date;
  actorLabel: string;
  action: string;
  entityType: string | null;
  entityId: string | null;
  /** A readable name for the record where one is known (a user's name). */
  entityLabel: string | null;
  before: unknown;
  after: unknown;
  detail: unknown;
  address: string | null;
}

export async function listAuditEvents(
  db: Executor,
  filter: {
    action?: string;
    entityType?: string;
    entityId?: string;
    limit?: number;
    beforeId?: string;
    /** Who acted (app_user id). */
    actorId?: string;
    /** Part of the record's readable name ("R-00012", "TPL-RC20"), any case. */
    recordName?: string;
    /** From this instant (inclusive) to that one (exclusive). */
    from?: Date;
    to?: Date;
  },
): Promise<AuditEventView[]> {
  const entityLabel = sql<string | null>`coalesce(subject.display_name, spec.maker || ' ' || spec.model, proc.code || ' version ' || pv.number, run.number, ins.identifier, lot.identifier, sp.identifier, cert.number)`;
  let q = db
    .selectFrom("audit_event")
    .leftJoin("app_user as subject", (j) =>
      j.onRef("subject.id", "=", "audit_event.entity_id").on("audit_event.entity_type", "=", "user"),
    )
    .leftJoin("cell_specification as spec", (j) =>
      j.on(sql`spec.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "cell-specification"),
    )
    .leftJoin("procedure_version as pv", (j) =>
      j.on(sql`pv.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "procedure-version"),
    )
    .leftJoin("procedure as proc", "proc.id", "pv.procedure_id")
    .leftJoin("run as run", (j) => j.on(sql`run.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "run"))
    .leftJoin("instrument as ins", (j) => j.on(sql`ins.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "instrument"))
    .leftJoin("lot as lot", (j) => j.on(sql`lot.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "lot"))
    .leftJoin("specimen as sp", (j) => j.on(sql`sp.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "specimen"))
    .leftJoin("certificate as cert", (j) => j.on(sql`cert.id::text`, "=", sql.ref("audit_event.entity_id")).on("audit_event.entity_type", "=", "certificate"))
    .select([
      "audit_event.id",
      "audit_event.at",
      "audit_event.actor_label",
      "audit_event.action",
      "audit_event.entity_type",
      "audit_event.entity_id",
      "audit_event.before",
      "audit_event.after",
      "audit_event.detail",
      "audit_event.address",
      entityLabel.as("entity_label"),
    ])
    .orderBy("audit_event.id", "desc")
    .limit(filter.limit ?? 100);
  if (filter.action) q = q.where("audit_event.action", "like", `${filter.action}%`);
  if (filter.entityType) q = q.where("audit_event.entity_type", "=", filter.entityType);
  if (filter.entityId) q = q.where("audit_event.entity_id", "=", filter.entityId);
  if (filter.beforeId) q = q.where("audit_event.id", "<", filter.beforeId);
  if (filter.actorId) q = q.where("audit_event.actor_id", "=", filter.actorId);
  if (filter.recordName) q = q.where(sql<boolean>`${entityLabel} ilike ${`%${filter.recordName.replace(/[\\%_]/g, (c) => `\\${c}`)}%`}`);
  if (filter.from) q = q.where("audit_event.at", ">=", filter.from);
  if (filter.to) q = q.where("audit_event.at", "<", filter.to);
  const rows = await q.execute();
  return rows.map((r) => ({
    id: String(r.id),
    at: r.at,
    actorLabel: r.actor_label,
    action: r.action,
    entityType: r.entity_type,
    entityId: r.entity_id,
    entityLabel: r.entity_label,
    before: r.before,
    after: r.after,
    detail: r.detail,
    address: r.address,
  }));
}

/** Everyone who appears in the trail as having acted, by name: the "person" filter's choices. */
export async function listAuditActors(db: Executor): Promise<{ id: string; label: string }[]> {
  const rows = await db
    .selectFrom("audit_event")
    .innerJoin("app_user as u", "u.id", "audit_event.actor_id")
    .select(["u.id", "u.display_name", "u.email"])
    .distinct()
    .orderBy("u.display_name")
    .execute();
  return rows.map((r) => ({ id: r.id, label: `${r.display_name} <${r.email}>` }));
}
