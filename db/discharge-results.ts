import "server-only";
import { sql } from "kysely";
import type { ResolvedStep } from "@/protocols";
import type { Executor } from "./index";
import type { RunStatus } from "./schema";

/** One discharge of a reviewed run: the figures the accepting reviewer signed for. */
export interface DischargeResultRow {
  runId: string;
  runNumber: string;
  runStatus: RunStatus;
  specimenId: string;
  specimenIdentifier: string;
  /** The cell's tray position in its lot, when recorded. */
  lotPosition: number | null;
  lotId: string | null;
  lotIdentifier: string | null;
  cellSpecificationId: string;
  /** Maker and model, e.g. "Korvel Energy KV-21N48". */
  specificationName: string;
  /** The cell specification's rated capacity and maximum continuous discharge current, as they stand now. */
  rating: { ratedCapacityMah: number; maxContinuousDischargeCurrentA: number };
  procedureCode: string;
  stepId: string;
  cycle: number;
  stepLabel: string;
  /** Mean |I| over the discharge, A. */
  currentA: number;
  capacityAh: number;
  energyWh: number;
  meanVoltageV: number;
  /** A finding on the step marks it as run beyond the cell's rating. */
  beyondRating: boolean;
  evaluationId: string;
  evaluatedAt: Date;
}

export interface DischargeResultFilter {
  lotId?: string;
  cellSpecificationId?: string;
  specimenId?: string;
  /** Run numbers (R-00012): the discharges chosen for an overlay. */
  runNumbers?: readonly string[];
}

interface Row {
  run_id: string;
  run_number: string;
  run_status: RunStatus;
  specimen_id: string;
  specimen_identifier: string;
  lot_position: number | null;
  lot_id: string | null;
  lot_identifier: string | null;
  cell_specification_id: string;
  specification_name: string;
  rated_capacity_mah: number;
  max_discharge_current_a: number;
  procedure_code: string;
  step_id: string;
  cycle: number;
  step_label: string;
  current_a: number;
  capacity_ah: number;
  energy_wh: number;
  mean_voltage_v: number;
  beyond_rating: boolean;
  evaluation_id: string;
  evaluated_at: Date;
}

function buildConditions(filter: DischargeResultFilter) {
  const conditions = [sql`r.status in ('accepted', 'certified')`];
  if (filter.lotId !== undefined) conditions.push(sql`s.lot_id = ${filter.lotId}`);
  if (filter.cellSpecificationId !== undefined) conditions.push(sql`s.cell_specification_id = ${filter.cellSpecificationId}`);
  if (filter.specimenId !== undefined) conditions.push(sql`s.id = ${filter.specimenId}`);
  if (filter.runNumbers !== undefined) conditions.push(sql`r.number = any(${sql.val([...filter.runNumbers])}::text[])`);
  return sql.join(conditions, sql` and `);
}

/**
 * Every constant-current discharge of the reviewed runs (accepted or certified) that match the filter,
 * read from the evaluation the accepting reviewer signed for (the latest 'accepted' review, as
 * db/evidence.ts getReviewedEvaluation reads it). The steps are unpacked from the stored JSON in
 * SQL, so only the figures cross the wire. Which of them count as capacity results is a domain
 * decision: lib/lots/results/list-discharge-results.ts makes it. Ordered by lot position, specimen,
 * run, step.
 */
export async function listReviewedDischarges(db: Executor, filter: DischargeResultFilter = {}): Promise<DischargeResultRow[]> {
  if (filter.runNumbers?.length === 0) return [];
  const result = await sql<Row>`
    with reviewed as (
      select distinct on (rr.run_id) rr.run_id, rr.run_evaluation_id
      from run_review rr
      where rr.decision = 'accepted' and rr.run_evaluation_id is not null
      order by rr.run_id, rr.created_at desc, rr.id desc
    )
    select r.id as run_id, r.number as run_number, r.status as run_status,
      s.id as specimen_id, s.identifier as specimen_identifier, s.lot_position, l.id as lot_id, l.identifier as lot_identifier,
      s.cell_specification_id, cs.maker || ' ' || cs.model as specification_name,
      (cs.data->>'ratedCapacityMah')::float8 as rated_capacity_mah,
      (cs.data->>'maxContinuousDischargeCurrentA')::float8 as max_discharge_current_a,
      p.code as procedure_code,
      st->>'stepId' as step_id, (st->>'cycle')::int as cycle, st->>'label' as step_label,
      (st->'results'->'constantCurrent'->>'meanA')::float8 as current_a,
      (st->'results'->>'capacityAh')::float8 as capacity_ah,
      (st->'results'->>'energyWh')::float8 as energy_wh,
      (st->'results'->>'meanVoltageV')::float8 as mean_voltage_v,
      exists (select 1 from jsonb_array_elements(st->'findings') f where f->>'beyondRating' = 'true') as beyond_rating,
      e.id as evaluation_id, e.evaluated_at
    from run r
    join reviewed rv on rv.run_id = r.id
    join run_evaluation e on e.id = rv.run_evaluation_id
    join specimen s on s.id = r.specimen_id
    join cell_specification cs on cs.id = s.cell_specification_id
    left join lot l on l.id = s.lot_id
    join procedure_version v on v.id = r.procedure_version_id
    join procedure p on p.id = v.procedure_id
    cross join lateral jsonb_array_elements(e.evaluation->'steps') st
    where ${buildConditions(filter)}
      and st->>'kind' = 'discharge'
      and jsonb_typeof(st->'results'->'constantCurrent') = 'object'
      and jsonb_typeof(st->'results'->'meanVoltageV') = 'number'
    order by l.identifier nulls last, s.lot_position nulls last, s.identifier, r.number, (st->'results'->>'startS')::float8`.execute(db);
  return result.rows.map((r) => ({
    runId: r.run_id,
    runNumber: r.run_number,
    runStatus: r.run_status,
    specimenId: r.specimen_id,
    specimenIdentifier: r.specimen_identifier,
    lotPosition: r.lot_position,
    lotId: r.lot_id,
    lotIdentifier: r.lot_identifier,
    cellSpecificationId: r.cell_specification_id,
    specificationName: r.specification_name,
    rating: { ratedCapacityMah: r.rated_capacity_mah, maxContinuousDischargeCurrentA: r.max_discharge_current_a },
    procedureCode: r.procedure_code,
    stepId: r.step_id,
    cycle: r.cycle,
    stepLabel: r.step_label,
    currentA: r.current_a,
    capacityAh: r.capacity_ah,
    energyWh: r.energy_wh,
    meanVoltageV: r.mean_voltage_v,
    beyondRating: r.beyond_rating,
    evaluationId: r.evaluation_id,
    evaluatedAt: r.evaluated_at,
  }));
}

/** The resolved steps each run was planned with (run.resolution, written only by lib/runs). */
export async function listResolvedSteps(db: Executor, runIds: readonly string[]): Promise<Map<string, ResolvedStep[]>> {
  if (runIds.length === 0) return new Map();
  const rows = await db
    .selectFrom("run")
    .select(["id", sql<ResolvedStep[]>`resolution->'steps'`.as("steps")])
    .where("id", "in", runIds)
    .execute();
  return new Map(rows.map((r) => [r.id, r.steps]));
}

/** Where a discharge lies in its run's stored log, from the reviewed evaluation: for plotting it. */
export interface DischargeLogStretch {
  runLogId: string;
  from: number;
  to: number;
}

/** The stretch of the log the reviewed evaluation placed this discharge on; null when it placed none. */
export async function getReviewedDischargeStretch(
  db: Executor,
  q: { evaluationId: string; stepId: string; cycle: number },
): Promise<DischargeLogStretch | null> {
  const row = await sql<{ run_log_id: string | null; from_index: number | null; to_index: number | null }>`
    select e.run_log_id, (st->'logPhase'->>'from')::int as from_index, (st->'logPhase'->>'to')::int as to_index
    from run_evaluation e
    cross join lateral jsonb_array_elements(e.evaluation->'steps') st
    where e.id = ${q.evaluationId} and st->>'stepId' = ${q.stepId} and (st->>'cycle')::int = ${q.cycle}
    limit 1`.execute(db);
  const r = row.rows[0];
  if (!r || r.run_log_id === null || r.from_index === null || r.to_index === null) return null;
  return { runLogId: r.run_log_id, from: r.from_index, to: r.to_index };
}
