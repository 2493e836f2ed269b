import "server-only";
import type { CellRating, StepRecord } from "@/lib/conformance";
import type { ProcedureResolution } from "@/protocols";
import type { SortDirection } from "@/lib/lists/list-params";
import type { Executor } from "./index";
import { readPage, type Page } from "./paginate";
import type { RunStatus } from "./schema";

export type { RunStatus };

/** What a list of runs shows: no procedure JSON (resolution, rating, source), which lists never read. */
export type RunSummary = Omit<RunView, "resolution" | "cellRating" | "procedureSource">;

export interface RunView {
  id: string;
  number: string;
  status: RunStatus;
  procedureVersionId: string;
  procedure: { id: string; code: string; title: string; number: number };
  specimen: { id: string; identifier: string; cellSpecificationId: string };
  operator: { id: string; name: string };
  resolution: ProcedureResolution;
  cellRating: CellRating;
  procedureSource: { standard: string; clause: string };
  createdAt: Date;
  startedAt: Date | null;
  submittedAt: Date | null;
  /** Set when the run was abandoned: who, when and why. */
  abandoned: { at: Date; by: string; reason: string } | null;
}

function runSummaryQuery(db: Executor) {
  return db
    .selectFrom("run as r")
    .innerJoin("procedure_version as v", "v.id", "r.procedure_version_id")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .innerJoin("specimen as s", "s.id", "r.specimen_id")
    .innerJoin("app_user as o", "o.id", "r.operator_id")
    .leftJoin("app_user as ab", "ab.id", "r.abandoned_by")
    .select([
      "r.abandoned_at",
      "r.abandon_reason",
      "ab.display_name as abandoned_by_name",
      "r.id",
      "r.number",
      "r.status",
      "r.procedure_version_id",
      "p.id as procedure_id",
      "p.code",
      "v.title",
      "v.number as version_number",
      "s.id as specimen_id",
      "s.identifier as specimen_identifier",
      "s.cell_specification_id",
      "o.id as operator_id",
      "o.display_name as operator_name",
      "r.created_at",
      "r.started_at",
      "r.submitted_at",
    ]);
}

function runQuery(db: Executor) {
  return runSummaryQuery(db).select(["r.resolution", "r.cell_rating", "r.procedure_source"]);
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof runSummaryQuery>["executeTakeFirstOrThrow"]>>;
type Row = Awaited<ReturnType<ReturnType<typeof runQuery>["executeTakeFirstOrThrow"]>>;

function toSummary(r: SummaryRow): RunSummary {
  return {
    id: r.id,
    number: r.number,
    status: r.status,
    procedureVersionId: r.procedure_version_id,
    procedure: { id: r.procedure_id, code: r.code, title: r.title, number: r.version_number },
    specimen: { id: r.specimen_id, identifier: r.specimen_identifier, cellSpecificationId: r.cell_specification_id },
    operator: { id: r.operator_id, name: r.operator_name },
    createdAt: r.created_at,
    startedAt: r.started_at,
    submittedAt: r.submitted_at,
    abandoned: r.abandoned_at && r.abandon_reason ? { at: r.abandoned_at, by: r.abandoned_by_name ?? "unknown", reason: r.abandon_reason } : null,
  };
}

function toView(r: Row): RunView {
  return {
    ...toSummary(r),
    // Written only by lib/runs from a checked resolution.
    resolution: r.resolution as ProcedureResolution,
    cellRating: r.cell_rating as CellRating,
    procedureSource: r.procedure_source as { standard: string; clause: string },
  };
}

export async function markRunAbandoned(db: Executor, id: string, by: string, reason: string): Promise<void> {
  const now = new Date();
  await db.updateTable("run").set({ status: "abandoned", abandoned_at: now, abandoned_by: by, abandon_reason: reason, updated_at: now }).where("id", "=", id).execute();
}

export async function getRun(db: Executor, id: string, opts: { forUpdate?: boolean } = {}): Promise<RunView | null> {
  if (opts.forUpdate) await db.selectFrom("run").select("id").where("id", "=", id).forUpdate().execute();
  const r = await runQuery(db).where("r.id", "=", id).executeTakeFirst();
  return r ? toView(r) : null;
}

/** A run's header (numbers, names, status) without the procedure JSON. */
export async function getRunSummary(db: Executor, id: string): Promise<RunSummary | null> {
  const r = await runSummaryQuery(db).where("r.id", "=", id).executeTakeFirst();
  return r ? toSummary(r) : null;
}

/** The columns the run list sorts by, and the column each stands for. */
export const RUN_SORTS = ["number", "procedure", "specimen", "operator", "status", "planned"] as const;
export type RunSort = (typeof RUN_SORTS)[number];
const RUN_SORT_COLUMNS = {
  number: "r.number",
  procedure: "p.code",
  specimen: "s.identifier",
  operator: "o.display_name",
  status: "r.status",
  planned: "r.created_at",
} as const satisfies Record<RunSort, string>;

/** One page of the run list, sorted in SQL; ties fall back to the newest first, then the id. */
export async function listRunsPage(
  db: Executor,
  filter: { status?: RunStatus; operatorId?: string; specimenId?: string },
  list: { page: number; pageSize: number; sort: RunSort; direction: SortDirection },
): Promise<Page<RunSummary>> {
  let q = runSummaryQuery(db).orderBy(RUN_SORT_COLUMNS[list.sort], list.direction).orderBy("r.created_at", "desc").orderBy("r.id");
  if (filter.operatorId) q = q.where("r.operator_id", "=", filter.operatorId);
  if (filter.status) q = q.where("r.status", "=", filter.status);
  if (filter.specimenId) q = q.where("r.specimen_id", "=", filter.specimenId);
  return readPage(db, q, list, toSummary);
}

export async function insertRun(
  db: Executor,
  r: { procedureVersionId: string; specimenId: string; operatorId: string; resolution: ProcedureResolution; cellRating: CellRating; procedureSource: { standard: string; clause: string } },
): Promise<{ id: string; number: string }> {
  return db
    .insertInto("run")
    .values({
      procedure_version_id: r.procedureVersionId,
      specimen_id: r.specimenId,
      operator_id: r.operatorId,
      resolution: JSON.stringify(r.resolution),
      cell_rating: JSON.stringify(r.cellRating),
      procedure_source: JSON.stringify(r.procedureSource),
    })
    .returning(["id", "number"])
    .executeTakeFirstOrThrow();
}

export async function insertRunInstruments(db: Executor, runId: string, instrumentIds: readonly string[]): Promise<void> {
  if (instrumentIds.length === 0) return;
  await db.insertInto("run_instrument").values(instrumentIds.map((instrument_id) => ({ run_id: runId, instrument_id }))).execute();
}

export async function listRunInstrumentIds(db: Executor, runId: string): Promise<string[]> {
  return (await db.selectFrom("run_instrument").select("instrument_id").where("run_id", "=", runId).execute()).map((r) => r.instrument_id);
}

export async function setRunStatus(db: Executor, id: string, status: RunStatus, stamp?: "started_at" | "submitted_at"): Promise<void> {
  const now = new Date();
  await db
    .updateTable("run")
    .set({ status, updated_at: now, ...(stamp === "started_at" && { started_at: now }), ...(stamp === "submitted_at" && { submitted_at: now }) })
    .where("id", "=", id)
    .execute();
}

export async function listStepRecords(db: Executor, runId: string): Promise<(StepRecord & { recordedBy: string; updatedAt: Date })[]> {
  const rows = await db
    .selectFrom("step_record")
    .select(["record", "recorded_by", "updated_at"])
    .where("run_id", "=", runId)
    .orderBy("updated_at")
    .execute();
  // Written only by lib/runs after stepRecordSchema checked it.
  return rows.map((r) => ({ ...(r.record as StepRecord), recordedBy: r.recorded_by, updatedAt: r.updated_at }));
}

export async function getStepRecord(db: Executor, runId: string, stepId: string, cycle: number): Promise<StepRecord | null> {
  const r = await db
    .selectFrom("step_record")
    .select("record")
    .where("run_id", "=", runId)
    .where("step_id", "=", stepId)
    .where("cycle", "=", cycle)
    .executeTakeFirst();
  return r ? (r.record as StepRecord) : null;
}

export async function upsertStepRecord(db: Executor, runId: string, record: StepRecord, recordedBy: string): Promise<void> {
  const values = { record: JSON.stringify(record), completed: record.completed, recorded_by: recordedBy, updated_at: new Date() };
  await db
    .insertInto("step_record")
    .values({ run_id: runId, step_id: record.stepId, cycle: record.cycle, ...values })
    .onConflict((oc) => oc.columns(["run_id", "step_id", "cycle"]).doUpdateSet(values))
    .execute();
}

/** A run's id and state by its number ("R-00012"): what a cycler names a run by. */
export async function findRunByNumber(db: Executor, number: string): Promise<{ id: string; number: string; status: RunStatus } | null> {
  const r = await db.selectFrom("run").select(["id", "number", "status"]).where("number", "=", number).executeTakeFirst();
  return r ?? null;
}
