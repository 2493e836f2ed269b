/**
 * Ingest-and-evaluate benchmark for a 2-million-row cycler log (`npm run bench`). Reports, does not
 * assert: figures from a shared 2-core machine are ratios, not promises.
 *
 * 1. the floor: read the file and parse its numbers with a minimal byte scanner into Float64Arrays;
 * 2. our parse (streaming, typed arrays), then storage two ways in PostgreSQL:
 *    A. one row per 65 536-sample chunk, one uncompressed bytea per channel (STORAGE EXTERNAL);
 *    B. one row per sample loaded with binary COPY (pg-copy-streams);
 *    A while parsing: the same chunks sent into one binary COPY as the parser hands them out, as the
 *    app's log worker does (lib/runs/store-log-while-reading.ts), against parse-then-store A, in
 *    alternating rounds (BENCH_ROUNDS, default 2) each beside its own floor, since a shared machine's
 *    load changes from minute to minute;
 * 3. segmentation + step-by-step evaluation of the parsed log;
 * 4. a 2 000-point series read back from each store.
 */
import { closeSync, createWriteStream, existsSync, mkdirSync, openSync, readFileSync, readSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { pipeline } from "node:stream/promises";
import { Readable } from "node:stream";
import pg from "pg";
import { from as copyFrom } from "pg-copy-streams";
import { downsampleLttb, segment, writeLogCsv } from "../../lib/analysis";
import { createLogParser, createScanFloor, type ColumnMapping } from "../../lib/analysis/log-import";
import { evaluateRun, type RunEvaluationInput } from "../../lib/conformance";
import { once } from "node:events";
import { finished } from "node:stream/promises";
import { COPY_BINARY_HEADER, COPY_BINARY_TRAILER, encodeCopyRow, float64Bytes } from "../../db/copy-binary";
import { buildRatedCapacityRun } from "../../scenarios/rated-capacity-run";

// One rated-capacity cycle (≈ 40 000 s of log) sampled every 0.02 s ≈ 2 million rows;
// BENCH_INTERVAL_S changes the size.
const INTERVAL_S = Number(process.env.BENCH_INTERVAL_S ?? 0.02);
const dir = path.join(process.cwd(), ".data", "bench");
const file = path.join(dir, `run-every-${INTERVAL_S}s.csv`);
const recordsFile = file.replace(/\.csv$/, ".records.json");
const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error("DATABASE_URL is not set (scripts/bench.sh sets it)");

let peakRss = 0;
const sampleRss = () => (peakRss = Math.max(peakRss, process.memoryUsage.rss()));
const rssTimer = setInterval(sampleRss, 10);

/** Times one phase and reports the peak resident memory seen while it ran. */
async function timed<T>(label: string, fn: () => Promise<T> | T): Promise<{ value: T; ms: number; peakMB: number }> {
  peakRss = process.memoryUsage.rss();
  const t0 = performance.now();
  const value = await fn();
  const ms = performance.now() - t0;
  sampleRss();
  const peakMB = peakRss / 2 ** 20;
  console.log(`${label.padEnd(58)} ${ms.toFixed(0).padStart(7)} ms   peak RSS ${peakMB.toFixed(0).padStart(4)} MB`);
  return { value, ms, peakMB };
}

function* fileChunks(size = 64 * 1024) {
  const fd = openSync(file, "r");
  try {
    for (;;) {
      const buf = new Uint8Array(size);
      const n = readSync(fd, buf, 0, size, null);
      if (n === 0) return;
      yield n === size ? buf : buf.subarray(0, n);
    }
  } finally {
    closeSync(fd);
  }
}

// A rated-capacity run (precondition, then charge–rest–discharge cycles) and its step records, made
// once and kept under .data/bench; a second process measures, so the source log is not in its memory.
if (process.argv[2] === "--make") {
  const built = buildRatedCapacityRun({ cycles: 1, sampleIntervalS: INTERVAL_S, restS: 3600 });
  mkdirSync(dir, { recursive: true });
  const csv = writeLogCsv(built.log.columns, { columns: ["time", "voltage", "current", "temperature"] });
  if (!csv.ok) throw new Error(csv.error.message);
  await timed(`write the synthetic CSV (${built.log.columns.length} rows)`, () => pipeline(Readable.from(csv.value), createWriteStream(file)));
  const records: Partial<typeof built.input> = { ...built.input };
  delete records.log;
  writeFileSync(recordsFile, JSON.stringify(records));
  process.exit(0);
}
if (!existsSync(file) || !existsSync(recordsFile)) throw new Error(`run with --make first to write ${file}`);
const runInput = JSON.parse(readFileSync(recordsFile, "utf8")) as Omit<RunEvaluationInput, "log">;
console.log(`log: ${file} (${(statSync(file).size / 2 ** 20).toFixed(1)} MB)\n`);

const floor = await timed("floor: read + minimal byte scanner → Float64Array", () => {
  const f = createScanFloor({ columnCount: 4, skipLines: 1 });
  for (const c of fileChunks()) f.push(c);
  return f.finish().rows;
});

const header = new TextDecoder().decode(fileChunks().next().value!.subarray(0, 200)).split(/\r?\n/)[0]!.split(",");
const mapping: ColumnMapping = {
  time: { form: "elapsed", column: header[0]!, unit: "s" },
  voltage: { column: header[1]!, unit: "V" },
  current: { column: header[2]!, unit: "A", dischargeSign: "negative" },
  temperature: { column: header[3]! },
  delimiter: ",",
  decimalSeparator: ".",
  headerLine: 1,
};
const parsed = await timed("parse: streaming → typed-array columns", () => {
  const p = createLogParser(mapping, { maxBytes: 1024 * 2 ** 20 });
  for (const c of fileChunks()) {
    const e = p.push(c);
    if (e) throw new Error(e.message);
  }
  const r = p.finish();
  if (!r.ok) throw new Error(r.error.message);
  return r.columns;
});
const log = parsed.value;

const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
await pool.query(`drop table if exists bench_channels, bench_samples`);
await pool.query(`create table bench_channels (run_id int, chunk int, time_s bytea, voltage_v bytea, current_a bytea, temperature_c bytea, primary key (run_id, chunk))`);
for (const c of ["time_s", "voltage_v", "current_a", "temperature_c"]) await pool.query(`alter table bench_channels alter column ${c} set storage external`);
await pool.query(`create table bench_samples (run_id int, idx int, time_s float8, voltage_v float8, current_a float8, temperature_c float8, primary key (run_id, idx))`);

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
const CHUNK = 65_536;
const storeA = await timed("store A: a row per 65 536 samples, a bytea per channel", async () => {
  for (let from = 0, chunk = 0; from < log.length; from += CHUNK, chunk++) {
    const part = (a: Float64Array) => bytes(a.subarray(from, Math.min(from + CHUNK, log.length)));
    await pool.query(`insert into bench_channels values (1, $1, $2, $3, $4, $5)`, [
      chunk,
      part(log.timeS),
      part(log.voltageV),
      part(log.currentA),
      log.temperatureC ? part(log.temperatureC) : null,
    ]);
  }
});

// PostgreSQL binary COPY format: signature, flags, extension length; per row a field count and
// length-prefixed big-endian values; a -1 trailer (PostgreSQL manual, COPY, "Binary Format").
function* binaryRows(): Generator<Buffer> {
  yield Buffer.from([0x50, 0x47, 0x43, 0x4f, 0x50, 0x59, 0x0a, 0xff, 0x0d, 0x0a, 0x00, 0, 0, 0, 0, 0, 0, 0, 0]);
  const perRow = 2 + 8 + 4 * 2 + 8 * 4 + 4 * 4;
  const batch = 8192;
  for (let from = 0; from < log.length; from += batch) {
    const n = Math.min(batch, log.length - from);
    const b = Buffer.alloc(n * perRow);
    let o = 0;
    for (let i = from; i < from + n; i++) {
      o = b.writeInt16BE(6, o);
      o = b.writeInt32BE(4, o);
      o = b.writeInt32BE(1, o);
      o = b.writeInt32BE(4, o);
      o = b.writeInt32BE(i, o);
      for (const v of [log.timeS[i]!, log.voltageV[i]!, log.currentA[i]!, log.temperatureC?.[i] ?? 0]) {
        o = b.writeInt32BE(8, o);
        o = b.writeDoubleBE(v, o);
      }
    }
    yield b;
  }
  yield Buffer.from([0xff, 0xff]);
}
const storeB = await timed("store B: a row per sample, binary COPY", async () => {
  const client = await pool.connect();
  try {
    await pipeline(Readable.from(binaryRows()), client.query(copyFrom(`copy bench_samples from stdin (format binary)`)));
  } finally {
    client.release();
  }
});

const evaluated = await timed("segment + evaluate the run step by step", () => {
  const phases = segment(log);
  const r = evaluateRun({ ...runInput, log });
  if (!r.ok) throw new Error(r.problems.map((p) => p.message).join("; "));
  const deviating = r.evaluation.steps.flatMap((st) => st.findings).concat(r.evaluation.runFindings).filter((f) => f.outcome !== "meets");
  return { phases: phases.ok ? phases.value.length : 0, verdict: r.evaluation.verdict, deviating };
});

// Before and after: parse, then store A (as the upload request did), against A written while parsing
// (as the worker does), alternating which goes first, each round beside a floor measured in that round.
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 2);
async function parseThenStore(runId: number): Promise<number> {
  const t0 = performance.now();
  const p = createLogParser(mapping, { maxBytes: 1024 * 2 ** 20 });
  for (const c of fileChunks()) if (p.push(c)) throw new Error("refused");
  const r = p.finish();
  if (!r.ok) throw new Error(r.error.message);
  const client = await pool.connect();
  try {
    await client.query("begin");
    for (let from = 0, chunk = 0; from < r.columns.length; from += CHUNK, chunk++) {
      const to = Math.min(from + CHUNK, r.columns.length);
      const c = r.columns;
      await client.query(`insert into bench_channels values ($1, $2, $3, $4, $5, $6)`, [runId, chunk, bytes(c.timeS.subarray(from, to)), bytes(c.voltageV.subarray(from, to)), bytes(c.currentA.subarray(from, to)), c.temperatureC ? bytes(c.temperatureC.subarray(from, to)) : null]);
    }
    await client.query("commit");
  } finally {
    client.release();
  }
  return performance.now() - t0;
}
async function parseWhileStoring(runId: number): Promise<number> {
  const t0 = performance.now();
  const client = await pool.connect();
  try {
    await client.query("begin");
    const copy = client.query(copyFrom(`copy bench_channels (run_id, chunk, time_s, voltage_v, current_a, temperature_c) from stdin (format binary)`, { highWaterMark: 8 * 2 ** 20 }));
    const copied = finished(copy);
    copy.write(COPY_BINARY_HEADER);
    let chunk = 0;
    const p = createLogParser(mapping, {
      maxBytes: 1024 * 2 ** 20,
      rowsPerPart: CHUNK,
      onRows: ({ columns: c }) => {
        const row = encodeCopyRow([{ int4: runId }, { int4: chunk++ }, { bytea: float64Bytes(c.timeS) }, { bytea: float64Bytes(c.voltageV) }, { bytea: float64Bytes(c.currentA) }, c.temperatureC ? { bytea: float64Bytes(c.temperatureC) } : null]);
        for (const b of row) copy.write(b);
      },
    });
    for (const c of fileChunks(1 << 20)) {
      if (p.push(c)) throw new Error("refused");
      if (copy.writableNeedDrain) await once(copy, "drain");
    }
    const r = p.finish();
    if (!r.ok) throw new Error(r.error.message);
    copy.end(COPY_BINARY_TRAILER);
    await copied;
    await client.query("commit");
  } finally {
    client.release();
  }
  return performance.now() - t0;
}
const roundLines: string[] = [];
for (let round = 1, runId = 10; round <= ROUNDS; round++) {
  const f = await timed(`round ${round}: floor`, () => {
    const s = createScanFloor({ columnCount: 4, skipLines: 1 });
    for (const c of fileChunks()) s.push(c);
    return s.finish().rows;
  });
  const order = round % 2 === 1 ? (["before", "after"] as const) : (["after", "before"] as const);
  const ms: Record<string, number> = {};
  for (const which of order) {
    ms[which] = which === "before" ? await parseThenStore(runId++) : await parseWhileStoring(runId++);
    console.log(`round ${round}: ${which === "before" ? "parse, then store A" : "store A while parsing"}`.padEnd(58) + ` ${ms[which]!.toFixed(0).padStart(7)} ms`);
  }
  const e = await timed(`round ${round}: evaluate`, () => evaluateRun({ ...runInput, log }));
  const load = (await import("node:os")).loadavg()[0]!.toFixed(2);
  const ratio = (x: number) => ((x + e.ms) / f.ms).toFixed(2);
  roundLines.push(`round ${round} (load ${load}): floor ${f.ms.toFixed(0)} ms, evaluate ${e.ms.toFixed(0)} ms; parse + store A + evaluate: before ${ratio(ms.before!)} × floor, after ${ratio(ms.after!)} × floor`);
}

const size = async (t: string) => (await pool.query(`select pg_total_relation_size($1) as n`, [t])).rows[0].n as string;
const points = 2000;
const stride = Math.floor(log.length / points);
const readA = await timed("series A: 2 000 points by substring on the bytea", async () => {
  const idx = Array.from({ length: points }, (_, k) => k * stride);
  const r = await pool.query(
    `select string_agg(substring(c.voltage_v from (i % ${CHUNK}) * 8 + 1 for 8), ''::bytea order by i) as v
       from unnest($1::int[]) as i join bench_channels c on c.run_id = 1 and c.chunk = i / ${CHUNK}`,
    [idx],
  );
  const v = r.rows[0].v as Buffer;
  return new Float64Array(v.buffer.slice(v.byteOffset, v.byteOffset + v.byteLength)).length;
});
const readA2 = await timed("series A': whole voltage channel, then LTTB to 2 000", async () => {
  const r = await pool.query(`select string_agg(voltage_v, ''::bytea order by chunk) as v, string_agg(time_s, ''::bytea order by chunk) as t from bench_channels where run_id = 1`);
  const v = Buffer.from(r.rows[0].v as Buffer);
  const t = Buffer.from(r.rows[0].t as Buffer);
  const x = new Float64Array(t.buffer, t.byteOffset, t.byteLength / 8);
  const y = new Float64Array(v.buffer, v.byteOffset, v.byteLength / 8);
  return downsampleLttb({ x, y }, points);
});
const readB = await timed("series B: 2 000 points by primary-key stride", async () => {
  const idx = Array.from({ length: points }, (_, k) => k * stride);
  return (await pool.query(`select idx, time_s, voltage_v from bench_samples where run_id = 1 and idx = any($1::int[]) order by idx`, [idx])).rowCount;
});
const [sizeA, sizeB] = [await size("bench_channels"), await size("bench_samples")];
await pool.query(`drop table bench_channels, bench_samples`);
await pool.end();
clearInterval(rssTimer);
sampleRss();

const ingestA = parsed.ms + storeA.ms + evaluated.ms;
const ingestB = parsed.ms + storeB.ms + evaluated.ms;
console.log(`
rows parsed                 ${log.length}   (floor counted ${floor.value})
phases found                ${evaluated.value.phases}; verdict: procedure followed ${evaluated.value.verdict.procedureFollowed}, specimen ${evaluated.value.verdict.specimenConforms}
on disk                     A ${(Number(sizeA) / 2 ** 20).toFixed(1)} MB, B ${(Number(sizeB) / 2 ** 20).toFixed(1)} MB
ingest + evaluate           A ${ingestA.toFixed(0)} ms = ${(ingestA / floor.ms).toFixed(2)} × floor;  B ${ingestB.toFixed(0)} ms = ${(ingestB / floor.ms).toFixed(2)} × floor   (target ≤ 4 ×)
2 000-point series          A ${readA.ms.toFixed(0)} ms (substring), A' ${readA2.ms.toFixed(0)} ms (whole channel + LTTB), B ${readB.ms.toFixed(0)} ms   (target ≤ 50 ms)
peak RSS, ingest A path     ${Math.max(floor.peakMB, parsed.peakMB, storeA.peakMB, evaluated.peakMB).toFixed(0)} MB   (target ≤ 300 MB)
parse + store A + evaluate, before (stored after parsing) and after (stored while parsing), target ≤ 2.0 × floor:
${roundLines.map((l) => `  ${l}`).join("\n")}`);
for (const f of evaluated.value.deviating) console.log(`  not "meets": ${f.stepId} #${f.cycle} ${f.rule}: ${f.outcome}; expected ${f.expected.text}; observed ${f.observed.text}`);
void readA.value;
void readA2.value;
void readB.value;
