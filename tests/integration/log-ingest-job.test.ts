import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { claimLogIngestJob, getLogIngestJob } from "@/db/log-ingest-jobs";
import { CHUNK_SAMPLES, getCurrentRunLog, readRunLogColumns } from "@/db/run-logs";
import { formatLogCsv } from "@/lib/analysis";
import { columnMappingSchema, parseLog } from "@/lib/analysis/log-import";
import { runLogIngestJob, runNextLogIngestJob } from "@/lib/runs/log-ingest/run-log-ingest-job";
import { stageLogUpload } from "@/lib/runs/log-ingest/stage-log-upload";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { getObjectBytes } from "@/lib/storage";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING, chunksOf, releaseRatedCapacityProcedure } from "./fixtures";

const TODAY = "2026-12-01";
const MAPPING = columnMappingSchema.parse(ELAPSED_LOG_MAPPING);

/** A run with its steps recorded and a log long enough for two stored chunks (> 65 536 samples). */
async function setUpRun(tag: string) {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-${tag}`, data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, `T-JOB-${tag}`);
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: `CH-${tag}`, serial: "S-1", accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-${tag}`, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, TODAY);
  const built = buildRatedCapacityRun({ sampleIntervalS: 0.5 });
  for (const record of built.input.stepRecords) await recordStep(operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  return { operator, runId: run.id, csv: csv.value, rows: built.log.columns.length };
}

async function stage(l: { operator: Awaited<ReturnType<typeof makeUser>>; runId: string }, name: string, csv: string) {
  return stageLogUpload(l.operator, l.runId, { name, chunks: chunksOf(csv), sizeBytes: Buffer.byteLength(csv), mapping: MAPPING, remember: false });
}

async function countChunks(runId: string): Promise<{ chunks: number; samples: number }> {
  const r = await getDb()
    .selectFrom("run_log_chunk as c")
    .innerJoin("run_log as l", "l.id", "c.run_log_id")
    .select([sql<number>`count(*)::int`.as("chunks"), sql<number>`coalesce(sum(c.sample_count), 0)::int`.as("samples")])
    .where("l.run_id", "=", runId)
    .executeTakeFirstOrThrow();
  return r;
}

describe("reading an uploaded log as a job", () => {
  it("stages the file with its job and audit event, then a worker reads, stores and evaluates it", async () => {
    const l = await setUpRun("A");
    expect(l.rows).toBeGreaterThan(CHUNK_SAMPLES);
    const { jobId } = await stage(l, "channel-1.csv", l.csv);

    const waiting = await getLogIngestJob(getDb(), jobId);
    expect(waiting).toMatchObject({ state: "waiting", rowsRead: 0, attempts: 0, runLogId: null });
    // The staged bytes are the uploaded bytes, and their recorded hash is theirs.
    const staged = await getDb().selectFrom("stored_file").select(["storage_key", "sha256", "size_bytes"]).where("id", "=", waiting!.storedFileId).executeTakeFirstOrThrow();
    const bytes = await getObjectBytes(staged.storage_key);
    expect(Buffer.from(bytes).equals(Buffer.from(l.csv))).toBe(true);
    const audit = await listAuditEvents(getDb(), { entityId: l.runId });
    expect(audit.map((e) => e.action)).toContain("run.receive-log");
    expect(await getCurrentRunLog(getDb(), l.runId)).toBeNull();

    expect(await runNextLogIngestJob()).toBe(jobId);
    const done = await getLogIngestJob(getDb(), jobId);
    expect(done).toMatchObject({ state: "evaluated", rowsRead: l.rows, attempts: 1 });
    expect(done?.outcome?.verdict).toMatchObject({ procedureFollowed: "yes" });
    expect(done?.finishedAt).toBeInstanceOf(Date);

    const log = await getCurrentRunLog(getDb(), l.runId);
    expect(log).toMatchObject({ sampleCount: l.rows, sha256: staged.sha256, fileName: "channel-1.csv" });
    expect(await countChunks(l.runId)).toEqual({ chunks: Math.ceil(l.rows / CHUNK_SAMPLES), samples: l.rows });
    // The samples written while parsing are the samples of the file, in order.
    const columns = await readRunLogColumns(getDb(), log!.id);
    // (read in one go, without writing: the same bytes, so chunks handed out early equal the final columns).
    const whole = parseLog({ mapping: MAPPING, chunks: [Buffer.from(l.csv)], options: { maxBytes: 1 << 30 } });
    if (!whole.ok) throw new Error(whole.error.message);
    for (const key of ["timeS", "voltageV", "currentA"] as const) {
      expect(Buffer.from(columns[key].buffer, columns[key].byteOffset, columns[key].byteLength).equals(Buffer.from(whole.columns[key].buffer, whole.columns[key].byteOffset, whole.columns[key].byteLength))).toBe(true);
    }
    expect(await runNextLogIngestJob()).toBeNull();
  });

  it("a worker that dies half-way leaves nothing; the job is read again after its lease and no sample is stored twice", async () => {
    const l = await setUpRun("B");
    const { jobId } = await stage(l, "channel-2.csv", l.csv);
    const claimed = await claimLogIngestJob(getDb(), 30);
    expect(claimed?.id).toBe(jobId);
    // The worker stops after writing its first chunk: its transaction never commits.
    const crash = new Error("worker killed");
    await expect(
      runLogIngestJob(claimed!, {
        onPartStored: ({ index }) => {
          if (index === 0) throw crash;
        },
      }),
    ).rejects.toThrow("worker killed");
    expect(await countChunks(l.runId)).toEqual({ chunks: 0, samples: 0 });
    expect(await getCurrentRunLog(getDb(), l.runId)).toBeNull();
    // Still leased: no other worker takes it yet.
    expect(await runNextLogIngestJob()).toBeNull();
    expect((await getLogIngestJob(getDb(), jobId))?.state).toBe("reading");

    await getDb().updateTable("log_ingest_job").set({ lease_until: sql<Date>`now() - interval '1 second'` }).where("id", "=", jobId).execute();
    expect(await runNextLogIngestJob()).toBe(jobId);
    expect(await getLogIngestJob(getDb(), jobId)).toMatchObject({ state: "evaluated", attempts: 2, rowsRead: l.rows });
    expect(await countChunks(l.runId)).toEqual({ chunks: Math.ceil(l.rows / CHUNK_SAMPLES), samples: l.rows });
    expect(await getDb().selectFrom("run_log").select("id").where("run_id", "=", l.runId).execute()).toHaveLength(1);
  });

  it("a refused log says where in plain words and leaves the run, its stored log and its records as they were", async () => {
    const l = await setUpRun("C");
    await stage(l, "good.csv", l.csv);
    await runNextLogIngestJob();
    const before = await getCurrentRunLog(getDb(), l.runId);
    const chunksBefore = await countChunks(l.runId);
    const recordsBefore = await getDb().selectFrom("step_record").selectAll().where("run_id", "=", l.runId).orderBy("step_id").execute();

    // Time going backwards on line 70 001: past the first stored chunk, so samples were written before the refusal.
    const lines = l.csv.split("\n");
    [lines[69_999], lines[70_000]] = [lines[70_000]!, lines[69_999]!];
    const { jobId } = await stage(l, "bad.csv", lines.join("\n"));
    await runNextLogIngestJob();
    const refused = await getLogIngestJob(getDb(), jobId);
    expect(refused?.state).toBe("refused");
    expect(refused?.outcome?.line).toBe(70_001);
    expect(refused?.outcome?.problem).toMatch(/^Line 70001.*earlier/i);
    expect(refused?.outcome?.problem).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-/);

    expect(await getCurrentRunLog(getDb(), l.runId)).toEqual(before);
    expect(await countChunks(l.runId)).toEqual(chunksBefore);
    expect(await getDb().selectFrom("step_record").selectAll().where("run_id", "=", l.runId).orderBy("step_id").execute()).toEqual(recordsBefore);
    const audit = await listAuditEvents(getDb(), { entityId: l.runId });
    expect(audit.map((e) => e.action)).toContain("run.refuse-log");
  });

  it("the app's role can neither delete a job nor change one that is finished", async () => {
    const l = await setUpRun("D");
    const { jobId } = await stage(l, "channel-4.csv", l.csv);
    await runNextLogIngestJob();
    await expect(getDb().deleteFrom("log_ingest_job").where("id", "=", jobId).execute()).rejects.toThrow(/permission denied/);
    await expect(getDb().updateTable("log_ingest_job").set({ state: "waiting", finished_at: null }).where("id", "=", jobId).execute()).rejects.toThrow(/no longer changes/);
  });
});
