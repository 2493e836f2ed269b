import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { getLogIngestJob } from "@/db/log-ingest-jobs";
import { listRunLogParts } from "@/db/run-log-parts";
import { getCurrentRunLog, readRunLogColumns } from "@/db/run-logs";
import { columnMappingSchema, parseLog } from "@/lib/analysis/log-import";
import { readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { abandonRun } from "@/lib/runs/abandon-run";
import { runNextLogIngestJob } from "@/lib/runs/log-ingest/run-log-ingest-job";
import { appendLogPart, type LogPartSender } from "@/lib/runs/log-parts/append-log-part";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { listObjectKeys } from "@/lib/storage";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { ELAPSED_LOG_MAPPING, chunksOf, makeUser, releaseRatedCapacityProcedure } from "./fixtures";

const TODAY = "2026-12-01";
const MAPPING = columnMappingSchema.parse(ELAPSED_LOG_MAPPING);
const HEADER = "Time (s),Voltage (V),Current (A)\n";

async function setUpRun(tag: string, recordSteps: boolean) {
  const engineer = await makeUser("engineer", `Eli Engineer ${tag}`);
  const second = await makeUser("engineer", `Sol Second ${tag}`);
  const operator = await makeUser("operator", `Oda Operator ${tag}`);
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-P${tag}`, data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, `T-PART-${tag}`);
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: `CH-P${tag}`, serial: "S-1", accuracy: "{}", calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-P${tag}`, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(operator, { procedureVersionId: versionId, specimenId: specimen, instrumentIds: [channel] }, TODAY);
  const built = buildRatedCapacityRun({ sampleIntervalS: 0.5 });
  if (recordSteps) for (const record of built.input.stepRecords) await recordStep(operator, run.id, record);
  return { operator, runId: run.id, built };
}

/** Rows [from, to) of a log as CSV lines, time as the cycler's elapsed seconds (it keeps counting across parts). */
function rowsCsv(c: { timeS: Float64Array; voltageV: Float64Array; currentA: Float64Array }, from: number, to: number, shiftS = 0): string {
  let out = "";
  for (let k = from; k < to; k++) out += `${((c.timeS[k] as number) + shiftS).toFixed(1)},${(c.voltageV[k] as number).toFixed(4)},${(c.currentA[k] as number).toFixed(4)}\n`;
  return out;
}

async function send(sender: LogPartSender, runId: string, name: string, csv: string, withMapping = true) {
  return appendLogPart(sender, runId, { name, chunks: chunksOf(csv), sizeBytes: Buffer.byteLength(csv), ...(withMapping ? { mapping: MAPPING } : {}) });
}

async function counts(runId: string) {
  const db = getDb();
  const [files, parts, chunks] = await Promise.all([
    db.selectFrom("stored_file").select(sql<number>`count(*)::int`.as("n")).where("storage_key", "like", `logs/${runId}/%`).executeTakeFirstOrThrow(),
    db.selectFrom("run_log_part").select(sql<number>`count(*)::int`.as("n")).where("run_id", "=", runId).executeTakeFirstOrThrow(),
    db.selectFrom("run_log_chunk as c").innerJoin("run_log as l", "l.id", "c.run_log_id").select(sql<number>`count(*)::int`.as("n")).where("l.run_id", "=", runId).executeTakeFirstOrThrow(),
  ]);
  const objects = await listObjectKeys(`logs/${runId}/`);
  return { files: files.n, parts: parts.n, chunks: chunks.n, objects: objects.length };
}

describe("a run's log in parts", () => {
  it("appends three parts into one ordered sample stream that the evaluation reads, refuses an overlapping part without a trace, and answers a repeat as already stored", async () => {
    const l = await setUpRun("A", true);
    const { columns } = l.built.log;
    const n = columns.length;
    const cuts = [0, Math.floor(n / 3), Math.floor((2 * n) / 3), n];
    const sender: LogPartSender = { kind: "user", user: l.operator };
    const sent: string[] = [];
    for (let p = 0; p < 3; p++) {
      const csv = HEADER + rowsCsv(columns, cuts[p] as number, cuts[p + 1] as number);
      sent.push(csv);
      // The first part names the columns; later parts use the earlier parts' mapping.
      const answer = await send(sender, l.runId, `channel-1-part-${p + 1}.csv`, csv, p === 0);
      expect(answer.outcome).toBe("queued");
      expect(await runNextLogIngestJob()).not.toBeNull();
      if (answer.outcome === "queued") expect(await getLogIngestJob(getDb(), answer.jobId)).toMatchObject({ state: expect.stringMatching(/stored|evaluated/), outcome: { partNumber: p + 1 } });
    }
    const lastJob = await getDb().selectFrom("log_ingest_job").select(["outcome", "state"]).where("run_id", "=", l.runId).orderBy("created_at", "desc").executeTakeFirstOrThrow();
    expect(lastJob.state).toBe("evaluated");
    expect((lastJob.outcome as { verdict: { procedureFollowed: string } }).verdict.procedureFollowed).toBe("yes");

    const parts = await listRunLogParts(getDb(), l.runId);
    expect(parts.map((p) => [p.number, p.sampleCount, p.gapBeforeS])).toEqual([
      [1, cuts[1], null],
      [2, (cuts[2] as number) - (cuts[1] as number), null],
      [3, n - (cuts[2] as number), null],
    ]);
    expect(parts[1]?.firstTimeS).toBe(Number((columns.timeS[cuts[1] as number] as number).toFixed(1)));
    // Each part's stored file, read back through its recorded hash, is the bytes that were sent.
    for (const [i, part] of parts.entries()) {
      const { bytes } = await readVerifiedFile(part.fileId);
      expect(Buffer.from(bytes).equals(Buffer.from(sent[i] as string))).toBe(true);
    }
    // One log, one stream: the same samples as the whole file read in one go, in order.
    const log = await getCurrentRunLog(getDb(), l.runId);
    expect(log?.sampleCount).toBe(n);
    const stream = await readRunLogColumns(getDb(), log!.id);
    const whole = parseLog({ mapping: MAPPING, chunks: [Buffer.from(HEADER + rowsCsv(columns, 0, n))], options: { maxBytes: 1 << 30 } });
    if (!whole.ok) throw new Error(whole.error.message);
    expect(stream.length).toBe(n);
    let worst = 0;
    for (let k = 0; k < n; k++) worst = Math.max(worst, Math.abs((stream.timeS[k] as number) - (whole.columns.timeS[k] as number)));
    expect(worst).toBeLessThan(1e-6);
    expect(Buffer.from(stream.voltageV.buffer).equals(Buffer.from(whole.columns.voltageV.buffer))).toBe(true);

    // A part that overlaps part 3 is refused: nothing of it is stored and the earlier parts are intact.
    const before = await counts(l.runId);
    expect(before).toEqual({ files: 3, parts: 3, chunks: before.chunks, objects: 3 });
    const overlapping = HEADER + rowsCsv(columns, n - 100, n) + rowsCsv(columns, n - 1, n, 1);
    const refused = await send(sender, l.runId, "channel-1-again.csv", overlapping);
    expect(refused.outcome).toBe("queued");
    await runNextLogIngestJob();
    if (refused.outcome === "queued") {
      const job = await getLogIngestJob(getDb(), refused.jobId);
      expect(job?.state).toBe("refused");
      expect(job?.outcome?.problem).toMatch(/^This part overlaps part 3: it starts at .* elapsed, but part 3 runs until .* elapsed\./);
    }
    expect(await counts(l.runId)).toEqual(before);
    const audit = await listAuditEvents(getDb(), { entityId: l.runId });
    expect(audit.map((e) => e.action)).toContain("run.refuse-log-part");
    for (const [i, part] of (await listRunLogParts(getDb(), l.runId)).entries()) {
      expect(Buffer.from((await readVerifiedFile(part.fileId)).bytes).equals(Buffer.from(sent[i] as string))).toBe(true);
    }
    expect((await getCurrentRunLog(getDb(), l.runId))?.sampleCount).toBe(n);

    // The same part sent again: already stored, nothing kept a second time, no job queued.
    const jobsBefore = await getDb().selectFrom("log_ingest_job").select(sql<number>`count(*)::int`.as("n")).where("run_id", "=", l.runId).executeTakeFirstOrThrow();
    const again = await send(sender, l.runId, "channel-1-part-2 (copy).csv", sent[1] as string);
    expect(again).toEqual({ outcome: "already-stored", partId: parts[1]?.id });
    expect(await counts(l.runId)).toEqual(before);
    const jobsAfter = await getDb().selectFrom("log_ingest_job").select(sql<number>`count(*)::int`.as("n")).where("run_id", "=", l.runId).executeTakeFirstOrThrow();
    expect(jobsAfter.n).toBe(jobsBefore.n);

    // A part in another column layout is refused and named.
    const otherColumns = "Time (s),Voltage (V),Current (A),Temperature (C)\n" + rowsCsv(columns, 0, 10, 100_000).replace(/\n/g, ",25\n");
    const layout = await send(sender, l.runId, "channel-1-new-export.csv", otherColumns);
    await runNextLogIngestJob();
    if (layout.outcome === "queued") expect((await getLogIngestJob(getDb(), layout.jobId))?.outcome?.problem).toMatch(/columns .*"Temperature \(C\)".* earlier parts/);
    expect(await counts(l.runId)).toEqual(before);

    // The app's own role cannot change or remove an accepted part.
    const partId = parts[0]!.id;
    await expect(getDb().updateTable("run_log_part").set({ sample_count: 1 }).where("id", "=", partId).execute()).rejects.toThrow(/permission denied/);
    await expect(getDb().deleteFrom("run_log_part").where("id", "=", partId).execute()).rejects.toThrow(/permission denied/);
  });

  it("records a gap, refuses time going backwards, an empty part and a part for a closed run, and keeps a machine sender", async () => {
    const l = await setUpRun("B", false);
    const machine: LogPartSender = { kind: "machine", tokenId: crypto.randomUUID(), label: "cycler CH-PB" };
    const c = l.built.log.columns;
    const first = HEADER + rowsCsv(c, 0, 1000);
    const a = await send(machine, l.runId, "p1.csv", first);
    expect(a.outcome).toBe("queued");
    await runNextLogIngestJob();
    // Two hours later the cycler writes again.
    const later = HEADER + rowsCsv(c, 1000, 2000, 7200);
    await send(machine, l.runId, "p2.csv", later, false);
    await runNextLogIngestJob();
    const parts = await listRunLogParts(getDb(), l.runId);
    expect(parts).toHaveLength(2);
    expect(parts[1]?.gapBeforeS).toBeGreaterThan(7200);
    expect(parts[1]?.gapBeforeS).toBeLessThan(7201);
    expect(parts[1]?.machineLabel).toBe("cycler CH-PB");
    const stored = await getDb().selectFrom("run_log_part").select(["uploaded_by", "machine_token_id"]).where("id", "=", parts[1]!.id).executeTakeFirstOrThrow();
    expect(stored).toEqual({ uploaded_by: null, machine_token_id: machine.kind === "machine" ? machine.tokenId : null });
    const job = await getDb().selectFrom("log_ingest_job").select("outcome").where("part_id", "=", parts[1]!.id).executeTakeFirstOrThrow();
    expect((job.outcome as { notice: string }).notice).toBe("Gap of 2 h 00 min between part 1 and part 2: no samples were logged in that time.");

    const before = await counts(l.runId);
    const backwards = HEADER + rowsCsv(c, 10, 20);
    const b = await send(machine, l.runId, "old.csv", backwards, false);
    await runNextLogIngestJob();
    if (b.outcome === "queued") expect((await getLogIngestJob(getDb(), b.jobId))?.outcome?.problem).toMatch(/^Time goes backwards/);
    expect(await counts(l.runId)).toEqual(before);

    await expect(send(machine, l.runId, "empty.csv", "")).rejects.toThrow("empty.csv is empty (0 bytes); a log part must hold samples.");
    await abandonRun(l.operator, l.runId, "cell swelled");
    await expect(send(machine, l.runId, "p3.csv", HEADER + rowsCsv(c, 2000, 2100, 7200))).rejects.toThrow(/no more log parts can be added/);
    expect(await counts(l.runId)).toEqual(before);
    const refusals = (await listAuditEvents(getDb(), { entityId: l.runId })).filter((e) => e.action === "run.refuse-log-part");
    expect(refusals).toHaveLength(3);
  });
});
