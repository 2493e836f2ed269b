import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { claimLogIngestJob } from "@/db/log-ingest-jobs";
import { getRunCycleState, listRunCycleResults } from "@/db/run-cycles";
import { getRun } from "@/db/runs";
import { formatLogCsv, type LogColumns } from "@/lib/analysis";
import { columnMappingSchema } from "@/lib/analysis/log-import";
import { openRunCycles, storeRunCycles } from "@/lib/runs/cycle-results";
import { ingestLog } from "@/lib/runs/ingest-log";
import { runLogIngestJob } from "@/lib/runs/log-ingest/run-log-ingest-job";
import { stageLogUpload } from "@/lib/runs/log-ingest/stage-log-upload";
import { noticeStalledRuns } from "@/lib/runs/notice-stalled-runs";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { enduranceLogPlan, expectedEnduranceCycle, generateEnduranceLog, type EnduranceLogPlan } from "@/scenarios/endurance-log";
import { inventedCell } from "@/scenarios/invented-cells";
import { ELAPSED_LOG_MAPPING, chunksOf, makeUser, releaseRatedCapacityProcedure } from "./fixtures";

const MAPPING = columnMappingSchema.parse(ELAPSED_LOG_MAPPING);
/** 12 cycles sampled every 10 s (≈ 1 450 samples a cycle), a pulse in cycle 6 and 12, 1 % of rated lost per cycle. */
const PLAN: EnduranceLogPlan = { ...enduranceLogPlan, cycles: 12, sampleIntervalS: 10, fadePerCycle: 0.01, pulseEveryCycles: 6 };

function joinChunks(plan: EnduranceLogPlan): LogColumns {
  const parts = [...generateEnduranceLog(plan, 50_000)];
  const n = parts.reduce((a, p) => a + p.length, 0);
  const out = { timeS: new Float64Array(n), voltageV: new Float64Array(n), currentA: new Float64Array(n), length: n };
  let at = 0;
  for (const p of parts) {
    out.timeS.set(p.timeS.subarray(0, p.length), at);
    out.voltageV.set(p.voltageV.subarray(0, p.length), at);
    out.currentA.set(p.currentA.subarray(0, p.length), at);
    at += p.length;
  }
  return out;
}

function csvOf(columns: LogColumns): string {
  const csv = formatLogCsv(columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  return csv.value;
}

function slice(c: LogColumns, from: number, to: number): LogColumns {
  // Each part's clock starts at 0, as a cycler's new file does; the part's offset puts it back on the run's time line.
  const t0 = c.timeS[from] as number;
  return { timeS: c.timeS.slice(from, to).map((t) => t - t0), voltageV: c.voltageV.slice(from, to), currentA: c.currentA.slice(from, to), length: to - from };
}

async function setUpRun(tag: string) {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-CY-${tag}`, data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, `T-CY-${tag}`);
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: `CH-CY-${tag}`, serial: "S-1", accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-CY-${tag}`, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, "2026-12-01");
  return { operator, engineer, runId: run.id };
}

describe("per-cycle results stored with the samples", () => {
  it("stores each cycle's results in the transaction that stores the samples, with the hand-worked values", async () => {
    const l = await setUpRun("A");
    const log = joinChunks(PLAN);
    const result = await ingestLog(l.operator, l.runId, { name: "endurance.csv", chunks: chunksOf(csvOf(log)), mapping: MAPPING });
    expect(result.ok).toBe(true);

    const cycles = await listRunCycleResults(getDb(), l.runId);
    expect(cycles.map((c) => c.cycle)).toEqual(Array.from({ length: 12 }, (_, k) => k + 1));
    for (const c of cycles) {
      const expected = expectedEnduranceCycle(PLAN, c.cycle);
      // The CSV writes 6 decimals: capacities agree to well under a µAh.
      expect(c.dischargeAh).toBeCloseTo(expected.dischargeAh, 6);
      expect(c.chargeAh).toBeCloseTo(expected.chargeAh, 6);
      expect(c.coulombicEfficiency).toBeCloseTo(expected.dischargeAh / expected.chargeAh, 6);
      expect(c.endOfDischargeV).toBeCloseTo(PLAN.dischargeToV, 6);
    }
    expect(cycles[5]?.dcResistanceOhm).toBeCloseTo(PLAN.resistanceOhm, 6);
    expect(cycles[0]?.dcResistanceOhm).toBeNull();
    expect(cycles.slice(0, 11).every((c) => c.closed)).toBe(true);
    expect(cycles[11]?.closed).toBe(false);

    // Same transaction: the cycle rows, the state and the samples carry one transaction id.
    const xids = await sql<{ xid: string }>`
      select distinct xmin::text as xid from run_cycle_result where run_id = ${l.runId}
      union select distinct c.xmin::text from run_log_chunk c join run_log g on g.id = c.run_log_id where g.run_id = ${l.runId}
      union select xmin::text from run_cycle_state where run_id = ${l.runId}`.execute(getDb());
    expect(xids.rows).toHaveLength(1);
    const state = await getRunCycleState(getDb(), l.runId);
    expect(state?.sampleCount).toBe(log.length);
  });

  it("gives the same cycles from three parts as from one piece, and a new whole log replaces them", async () => {
    const whole = await setUpRun("B");
    const parted = await setUpRun("C");
    const log = joinChunks(PLAN);
    await ingestLog(whole.operator, whole.runId, { name: "whole.csv", chunks: chunksOf(csvOf(log)), mapping: MAPPING });
    const cuts = [0, 5000, 11_111, log.length];
    for (let k = 0; k < 3; k++) {
      const part = slice(log, cuts[k] as number, cuts[k + 1] as number);
      const r = await ingestLog(parted.operator, parted.runId, {
        name: `part-${k + 1}.csv`,
        chunks: chunksOf(csvOf(part)),
        mapping: MAPPING,
        cycles: k === 0 ? { kind: "whole-log" } : { kind: "part", timeOffsetS: log.timeS[cuts[k] as number] as number },
      });
      expect(r.ok).toBe(true);
    }
    const strip = (rows: Awaited<ReturnType<typeof listRunCycleResults>>) => rows.map((r) => ({ ...r, updatedAt: null }));
    const a = strip(await listRunCycleResults(getDb(), whole.runId));
    const b = strip(await listRunCycleResults(getDb(), parted.runId));
    expect(b).toHaveLength(12);
    b.forEach((row, k) => {
      for (const [key, value] of Object.entries(row)) {
        const other = (a[k] as Record<string, unknown>)[key];
        if (typeof value === "number") expect(value).toBeCloseTo(other as number, 9);
        else expect(value).toEqual(other);
      }
    });

    // A part that goes back in time is refused and changes nothing.
    const before = await getRunCycleState(getDb(), parted.runId);
    const back = await ingestLog(parted.operator, parted.runId, { name: "again.csv", chunks: chunksOf(csvOf(slice(log, 0, 500))), mapping: MAPPING, cycles: { kind: "part", timeOffsetS: 0 } });
    expect(back.ok ? null : back.error.message).toMatch(/do not continue the run's earlier log/);
    expect(await getRunCycleState(getDb(), parted.runId)).toEqual(before);

    // A whole log again starts the cycles afresh: the first 5 000 samples hold three cycles with their discharge ended.
    const short = slice(log, 0, cuts[1] as number);
    await ingestLog(parted.operator, parted.runId, { name: "short.csv", chunks: chunksOf(csvOf(short)), mapping: MAPPING });
    expect((await listRunCycleResults(getDb(), parted.runId)).map((c) => c.cycle)).toEqual([1, 2, 3]);
    expect((await getRunCycleState(getDb(), parted.runId))?.sampleCount).toBe(5000);
  });

  it("leaves neither samples nor cycles behind when the worker dies half-way", async () => {
    const l = await setUpRun("D");
    const csv = csvOf(joinChunks({ ...PLAN, sampleIntervalS: 1, cycles: 8 }));
    const { jobId } = await stageLogUpload(l.operator, l.runId, { name: "dies.csv", chunks: chunksOf(csv), sizeBytes: Buffer.byteLength(csv), mapping: MAPPING, remember: false });
    const job = await claimLogIngestJob(getDb(), 30);
    expect(job?.id).toBe(jobId);
    await expect(
      runLogIngestJob(job!, {
        onPartStored: (p) => {
          if (p.index === 1) throw new Error("the worker stops here");
        },
      }),
    ).rejects.toThrow("the worker stops here");
    expect(await listRunCycleResults(getDb(), l.runId)).toEqual([]);
    expect(await getRunCycleState(getDb(), l.runId)).toBeNull();
  });

  it("queues the stop-criterion notice once, at the first checked cycle below the stop share", async () => {
    const l = await setUpRun("E");
    const log = joinChunks(PLAN);
    // Rated 3 000 mAh; cycle k delivers 98 − (k − 1) % of rated: below 92 % first at cycle 8, checked every 2 cycles.
    const limits = { ratedCapacityMAh: 3000, stop: { stopBelowPercentOfRated: 92, checkEveryCycles: 2, maxCycles: null }, acceptAtLeastPercentOfRated: null };
    await ingestLog(l.operator, l.runId, { name: "first.csv", chunks: chunksOf(csvOf(slice(log, 0, 5000))), mapping: MAPPING });
    const runLogId = (await getRunCycleState(getDb(), l.runId))!.runLogId;
    const feed = async (from: number, to: number) =>
      getDb()
        .transaction()
        .execute(async (tx) => {
          const run = (await getRun(tx, l.runId))!;
          const cycles = await openRunCycles(tx, l.runId, { kind: "part", timeOffsetS: log.timeS[from] as number });
          expect(cycles.accumulator.push(slice(log, from, to), cycles.timeOffsetS).ok).toBe(true);
          return storeRunCycles(tx, { run, runLogId, cycles, limits });
        });
    expect((await feed(5000, 9000)).stop).toBeNull();
    const met = await feed(9000, 14_000);
    expect(met.stop).toMatchObject({ cycle: 8, kind: "below-share" });
    expect((await feed(14_000, log.length)).stop).toBeNull();
    const mail = await getDb().selectFrom("mail_message").select(["kind", "subject", "recipients", "body"]).where("entity_id", "=", l.runId).where("kind", "=", "endurance-stop-reached").execute();
    expect(mail).toHaveLength(1);
    expect(mail[0]?.subject).toMatch(/stop criterion met at cycle 8/);
    expect(mail[0]?.body).toMatch(/92 %/);
    expect(mail[0]?.recipients).toEqual(expect.arrayContaining([l.operator.email, l.engineer.email]));
    expect((await getRunCycleState(getDb(), l.runId))?.stopReachedCycle).toBe(8);
  });

  it("queues a notice once per silence when no samples arrived for the set hours", async () => {
    const l = await setUpRun("F");
    await ingestLog(l.operator, l.runId, { name: "first.csv", chunks: chunksOf(csvOf(slice(joinChunks(PLAN), 0, 3000))), mapping: MAPPING });
    const arrived = (await getRunCycleState(getDb(), l.runId))!.samplesArrivedAt;
    const stalledMail = () => getDb().selectFrom("mail_message").select(["subject", "body"]).where("entity_id", "=", l.runId).where("kind", "=", "run-stalled").execute();

    expect(await noticeStalledRuns(new Date(arrived.getTime() + 5 * 3600_000), 6)).not.toContain(l.runId);
    expect(await stalledMail()).toHaveLength(0);
    expect(await noticeStalledRuns(new Date(arrived.getTime() + 7 * 3600_000), 6)).toContain(l.runId);
    expect(await noticeStalledRuns(new Date(arrived.getTime() + 9 * 3600_000), 6)).not.toContain(l.runId);
    const mail = await stalledMail();
    expect(mail).toHaveLength(1);
    expect(mail[0]?.subject).toMatch(/no log data for 6 hours/);
    // An abandoned run is no longer watched.
    await getDb().updateTable("run").set({ status: "abandoned", abandoned_at: new Date(), abandoned_by: l.operator.id, abandon_reason: "cell removed" }).where("id", "=", l.runId).execute();
    await getDb().updateTable("run_cycle_state").set({ samples_arrived_at: new Date(arrived.getTime() - 1000) }).where("run_id", "=", l.runId).execute();
    expect(await noticeStalledRuns(new Date(arrived.getTime() + 20 * 3600_000), 6)).not.toContain(l.runId);
  });
});
