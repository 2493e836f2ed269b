import "server-only";
import { sql } from "kysely";
import type { CycleResult } from "@/lib/analysis";
import type { Executor } from "./index";
import type { RunStatus } from "./schema";

/** A stored cycle's results (run_cycle_result, migration 0025). */
export type StoredCycleResult = Omit<CycleResult, "closed"> & { closed: boolean; updatedAt: Date };

export interface RunCycleStateRow {
  runLogId: string;
  state: unknown;
  sampleCount: number;
  lastSampleTimeS: number | null;
  samplesArrivedAt: Date;
  stopReachedCycle: number | null;
}

/** The accumulator's saved state; `forUpdate` holds the row until the caller's transaction ends (log parts queue behind it). */
export async function getRunCycleState(db: Executor, runId: string, opts: { forUpdate?: boolean } = {}): Promise<RunCycleStateRow | null> {
  let q = db.selectFrom("run_cycle_state").selectAll().where("run_id", "=", runId);
  if (opts.forUpdate) q = q.forUpdate();
  const r = await q.executeTakeFirst();
  if (!r) return null;
  return {
    runLogId: r.run_log_id,
    state: r.state,
    sampleCount: Number(r.sample_count),
    lastSampleTimeS: r.last_sample_time_s,
    samplesArrivedAt: r.samples_arrived_at,
    stopReachedCycle: r.stop_reached_cycle,
  };
}

/** A whole new log starts the run's cycles afresh: the cycles of the log it replaces go. */
export async function deleteRunCycles(db: Executor, runId: string): Promise<void> {
  await db.deleteFrom("run_cycle_result").where("run_id", "=", runId).execute();
  await db.deleteFrom("run_cycle_state").where("run_id", "=", runId).execute();
}

/** Writes cycles as reported; a cycle reported again (its discharge went on, or it closed) replaces its row. */
export async function upsertRunCycleResults(db: Executor, runId: string, runLogId: string, results: readonly CycleResult[]): Promise<void> {
  if (results.length === 0) return;
  const rows = results.map((r) => ({
    run_id: runId,
    cycle: r.cycle,
    run_log_id: runLogId,
    charge_ah: r.chargeAh,
    discharge_ah: r.dischargeAh,
    charge_wh: r.chargeWh,
    discharge_wh: r.dischargeWh,
    coulombic_efficiency: r.coulombicEfficiency,
    energy_efficiency: r.energyEfficiency,
    end_of_charge_v: r.endOfChargeV,
    end_of_discharge_v: r.endOfDischargeV,
    dc_resistance_ohm: r.dcResistanceOhm,
    first_time_s: r.firstTimeS,
    last_time_s: r.lastTimeS,
    closed: r.closed,
  }));
  // A few thousand rows at most per part; batches keep each statement's parameters under the protocol's limit.
  for (let at = 0; at < rows.length; at += 1000) {
    await db
      .insertInto("run_cycle_result")
      .values(rows.slice(at, at + 1000))
      .onConflict((oc) =>
        oc.columns(["run_id", "cycle"]).doUpdateSet((eb) => ({
          run_log_id: eb.ref("excluded.run_log_id"),
          charge_ah: eb.ref("excluded.charge_ah"),
          discharge_ah: eb.ref("excluded.discharge_ah"),
          charge_wh: eb.ref("excluded.charge_wh"),
          discharge_wh: eb.ref("excluded.discharge_wh"),
          coulombic_efficiency: eb.ref("excluded.coulombic_efficiency"),
          energy_efficiency: eb.ref("excluded.energy_efficiency"),
          end_of_charge_v: eb.ref("excluded.end_of_charge_v"),
          end_of_discharge_v: eb.ref("excluded.end_of_discharge_v"),
          dc_resistance_ohm: eb.ref("excluded.dc_resistance_ohm"),
          first_time_s: eb.ref("excluded.first_time_s"),
          last_time_s: eb.ref("excluded.last_time_s"),
          closed: eb.ref("excluded.closed"),
          updated_at: sql<Date>`now()`,
        })),
      )
      .execute();
  }
}

export async function saveRunCycleState(
  db: Executor,
  s: { runId: string; runLogId: string; state: unknown; sampleCount: number; lastSampleTimeS: number | null; stopReachedCycle: number | null },
): Promise<void> {
  const values = {
    run_log_id: s.runLogId,
    state: JSON.stringify(s.state),
    sample_count: s.sampleCount,
    last_sample_time_s: s.lastSampleTimeS,
    stop_reached_cycle: s.stopReachedCycle,
    samples_arrived_at: sql<Date>`now()`,
    updated_at: sql<Date>`now()`,
  };
  await db
    .insertInto("run_cycle_state")
    .values({ run_id: s.runId, ...values })
    .onConflict((oc) => oc.column("run_id").doUpdateSet(values))
    .execute();
}

export async function listRunCycleResults(db: Executor, runId: string): Promise<StoredCycleResult[]> {
  const rows = await db.selectFrom("run_cycle_result").selectAll().where("run_id", "=", runId).orderBy("cycle").execute();
  return rows.map((r) => ({
    cycle: r.cycle,
    chargeAh: r.charge_ah,
    dischargeAh: r.discharge_ah,
    chargeWh: r.charge_wh,
    dischargeWh: r.discharge_wh,
    coulombicEfficiency: r.coulombic_efficiency,
    energyEfficiency: r.energy_efficiency,
    endOfChargeV: r.end_of_charge_v,
    endOfDischargeV: r.end_of_discharge_v,
    dcResistanceOhm: r.dc_resistance_ohm,
    firstTimeS: r.first_time_s,
    lastTimeS: r.last_time_s,
    closed: r.closed,
    updatedAt: r.updated_at,
  }));
}

/** Runs in one of `statuses` whose samples last arrived before `before` and whose stop criterion has not been met. */
export async function listRunsWithoutSamplesSince(db: Executor, before: Date, statuses: readonly RunStatus[]): Promise<{ runId: string; runNumber: string; operatorEmail: string; samplesArrivedAt: Date; lastCycle: number | null }[]> {
  const rows = await db
    .selectFrom("run_cycle_state as s")
    .innerJoin("run as r", "r.id", "s.run_id")
    .innerJoin("app_user as o", "o.id", "r.operator_id")
    .select((eb) => [
      "r.id",
      "r.number",
      "o.email",
      "s.samples_arrived_at",
      eb.selectFrom("run_cycle_result as c").whereRef("c.run_id", "=", "r.id").select((e) => e.fn.max("c.cycle").as("n")).as("last_cycle"),
    ])
    .where("r.status", "in", [...statuses])
    .where("s.stop_reached_cycle", "is", null)
    .where("s.samples_arrived_at", "<", before)
    .orderBy("s.samples_arrived_at")
    .execute();
  return rows.map((r) => ({ runId: r.id, runNumber: r.number, operatorEmail: r.email, samplesArrivedAt: r.samples_arrived_at, lastCycle: r.last_cycle ?? null }));
}

/** The rated capacity of the run's cell, mAh, from its specification as it stands. */
export async function getRunRatedCapacityMAh(db: Executor, runId: string): Promise<number | null> {
  const r = await db
    .selectFrom("run as r")
    .innerJoin("specimen as s", "s.id", "r.specimen_id")
    .innerJoin("cell_specification as cs", "cs.id", "s.cell_specification_id")
    .select(sql<number | null>`(cs.data->>'ratedCapacityMah')::float8`.as("rated"))
    .where("r.id", "=", runId)
    .executeTakeFirst();
  return r?.rated ?? null;
}
