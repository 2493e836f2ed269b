import "server-only";
import type { Executor } from "./index";
import { readPage, type Page } from "./paginate";
import type { RunStatus } from "./schema";

// What waits for whom: the home page's queues, a page at a time, the longest-waiting first.

export interface ReleaseQueueEntry {
  procedureId: string;
  number: number;
  code: string;
  title: string;
  submittedBy: string;
  submittedAt: Date | null;
}

/** Procedure versions in review that this engineer may release: not written or submitted by them. */
export async function listProceduresAwaitingRelease(
  db: Executor,
  userId: string,
  request: { page: number; pageSize: number },
): Promise<Page<ReleaseQueueEntry>> {
  const query = db
    .selectFrom("procedure_version as v")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .leftJoin("app_user as s", "s.id", "v.submitted_by")
    .select(["v.procedure_id", "v.number", "p.code", "v.title", "s.display_name", "v.submitted_at"])
    .where("v.status", "=", "in_review")
    .where("v.author_id", "<>", userId)
    .where((eb) => eb.or([eb("v.submitted_by", "is", null), eb("v.submitted_by", "<>", userId)]))
    .orderBy("v.submitted_at")
    .orderBy("v.id");
  return readPage(db, query, request, (r) => ({
    procedureId: r.procedure_id,
    number: r.number,
    code: r.code,
    title: r.title,
    submittedBy: r.display_name ?? "—",
    submittedAt: r.submitted_at,
  }));
}

export interface RunQueueEntry {
  runId: string;
  runNumber: string;
  status: RunStatus;
  specimen: string;
  procedure: string;
  operatorName: string;
  /** When the run last changed: submitted, returned, or its latest record. */
  changedAt: Date;
}

/**
 * Runs in some states, oldest change first: an operator's own (operatorId), or those someone other than
 * their operator may act on (notOperatedBy, e.g. accepted runs waiting for a certificate).
 */
export async function listRunsInStates(
  db: Executor,
  filter: { statuses: readonly RunStatus[]; operatorId?: string; notOperatedBy?: string },
  request: { page: number; pageSize: number },
): Promise<Page<RunQueueEntry>> {
  let q = db
    .selectFrom("run as r")
    .innerJoin("specimen as s", "s.id", "r.specimen_id")
    .innerJoin("procedure_version as v", "v.id", "r.procedure_version_id")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .innerJoin("app_user as o", "o.id", "r.operator_id")
    .select(["r.id", "r.number", "r.status", "r.updated_at", "s.identifier", "p.code", "v.number as version_number", "v.title", "o.display_name"])
    .orderBy("r.updated_at")
    .orderBy("r.number")
    .where("r.status", "in", [...filter.statuses]);
  if (filter.operatorId) q = q.where("r.operator_id", "=", filter.operatorId);
  if (filter.notOperatedBy) q = q.where("r.operator_id", "<>", filter.notOperatedBy);
  return readPage(db, q, request, (r) => ({
    runId: r.id,
    runNumber: r.number,
    status: r.status,
    specimen: r.identifier,
    procedure: `${r.code} version ${r.version_number} (${r.title})`,
    operatorName: r.display_name,
    changedAt: r.updated_at,
  }));
}
