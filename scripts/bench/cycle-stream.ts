/**
 * Streaming per-cycle evaluation benchmark (`npm run bench`, scripts/bench/cycle-stream.sh). Reports, never
 * asserts. An invented endurance log (scenarios/endurance-log.ts, 1 s sampling, about 15 600 samples a
 * cycle) is written by the bench in parts of PART_SAMPLES samples, then read part after part through the
 * app's own path (ingestLog: spool + hash, parse, binary COPY of the chunks, the per-cycle accumulator
 * continued from the state the last part saved, cycle rows and state in the samples' transaction), in a
 * process of its own per case, so each case's peak RSS is its own. Time is given as a multiple of the
 * parse floor (read + bare byte scanner) over the same files, measured in the same process.
 *
 *   --make <samples>   write the parts for a case under .data/bench/cycles/<samples>/
 *   --case <samples>   ingest them and report
 */
import { closeSync, createReadStream, existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync, writeSync } from "node:fs";
import { loadavg } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { getDb } from "../../db";
import { closePool } from "../../db/pool";
import { getRunCycleState, listRunCycleResults } from "../../db/run-cycles";
import { createScanFloor } from "../../lib/analysis/log-import";
import type { SignedInUser } from "../../lib/auth/signed-in-user";
import { ingestLog } from "../../lib/runs/ingest-log";
import { countEnduranceSamples, enduranceLogPlan, generateEnduranceLog, type EnduranceLogPlan } from "../../scenarios/endurance-log";

const PART_SAMPLES = Number(process.env.BENCH_PART_SAMPLES ?? 500_000);
const root = path.join(process.cwd(), ".data", "bench", "cycles");
const MAPPING = {
  time: { form: "elapsed", column: "Time (s)", unit: "s" },
  voltage: { column: "Voltage (V)", unit: "V" },
  current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
  delimiter: ",",
  decimalSeparator: ".",
  headerLine: 1,
} as const;

interface Manifest {
  samples: number;
  parts: { file: string; firstTimeS: number; samples: number }[];
}

/** Enough cycles of the plan for `samples` samples; the log is cut there (mid-cycle, as a running test is). */
function planFor(samples: number): EnduranceLogPlan {
  // Cycles shorten as the capacity fades: add cycles until the plan holds the samples asked for.
  const plan = { ...enduranceLogPlan, cycles: Math.ceil(samples / 15_600), sampleIntervalS: 1, fadePerCycle: 0.0003, pulseEveryCycles: 50 };
  while (countEnduranceSamples(plan) < samples) plan.cycles += Math.max(1, Math.ceil((samples - countEnduranceSamples(plan)) / 12_000));
  return plan;
}

function make(samples: number): void {
  const dir = path.join(root, String(samples));
  const manifestFile = path.join(dir, "manifest.json");
  if (existsSync(manifestFile) && (JSON.parse(readFileSync(manifestFile, "utf8")) as Manifest).samples === samples) {
    console.log(`parts for ${samples} samples already in ${path.relative(process.cwd(), dir)}`);
    return;
  }
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  const manifest: Manifest = { samples, parts: [] };
  let written = 0;
  let fd = -1;
  let inPart = PART_SAMPLES;
  let text = "";
  const flush = () => {
    if (fd >= 0 && text) writeSync(fd, text);
    text = "";
  };
  outer: for (const c of generateEnduranceLog(planFor(samples), 65_536)) {
    for (let i = 0; i < c.length; i++) {
      if (written === samples) break outer;
      if (inPart === PART_SAMPLES) {
        flush();
        if (fd >= 0) closeSync(fd);
        const file = `part-${String(manifest.parts.length + 1).padStart(3, "0")}.csv`;
        fd = openSync(path.join(dir, file), "w");
        text = "Time (s),Voltage (V),Current (A)\n";
        manifest.parts.push({ file, firstTimeS: Number((c.timeS[i] as number).toFixed(1)), samples: 0 });
        inPart = 0;
      }
      text += `${(c.timeS[i] as number).toFixed(1)},${(c.voltageV[i] as number).toFixed(4)},${(c.currentA[i] as number).toFixed(4)}\n`;
      if (text.length > 1 << 20) flush();
      inPart++;
      written++;
      (manifest.parts[manifest.parts.length - 1] as Manifest["parts"][number]).samples++;
    }
  }
  flush();
  if (fd >= 0) closeSync(fd);
  writeFileSync(manifestFile, JSON.stringify(manifest, null, 1));
  console.log(`wrote ${samples} samples in ${manifest.parts.length} parts to ${path.relative(process.cwd(), dir)}`);
}

let peakRss = 0;
const sampleRss = () => (peakRss = Math.max(peakRss, process.memoryUsage.rss()));

async function runCase(samples: number): Promise<void> {
  const dir = path.join(root, String(samples));
  const manifest = JSON.parse(readFileSync(path.join(dir, "manifest.json"), "utf8")) as Manifest;
  const files = manifest.parts.map((p) => path.join(dir, p.file));

  // The floor: every part read and scanned into Float64Arrays by the bare scanner, nothing kept.
  const f0 = performance.now();
  let floorRows = 0;
  for (const file of files) {
    const s = createScanFloor({ columnCount: 3, skipLines: 1 });
    for await (const chunk of createReadStream(file, { highWaterMark: 1 << 20 })) s.push(chunk as Buffer);
    floorRows += s.finish().rows;
  }
  const floorMs = performance.now() - f0;

  const run = await getDb().selectFrom("run").select("id").where("status", "=", "planned").orderBy("created_at").executeTakeFirstOrThrow();
  const u = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", "operator@brackwater.example").executeTakeFirstOrThrow();
  const operator: SignedInUser = { id: u.id, email: u.email, displayName: u.display_name, role: u.role };

  const rssTimer = setInterval(sampleRss, 10);
  peakRss = process.memoryUsage.rss();
  const rssBefore = peakRss;
  const t0 = performance.now();
  for (const [k, part] of manifest.parts.entries()) {
    const result = await ingestLog(operator, run.id, {
      name: part.file,
      chunks: createReadStream(path.join(dir, part.file), { highWaterMark: 1 << 20 }) as AsyncIterable<Uint8Array>,
      mapping: MAPPING,
      cycles: k === 0 ? { kind: "whole-log" } : { kind: "part", timeOffsetS: part.firstTimeS },
    });
    if (!result.ok) throw new Error(`part ${part.file} refused: ${result.error.message}`);
  }
  const ms = performance.now() - t0;
  clearInterval(rssTimer);
  sampleRss();

  const state = await getRunCycleState(getDb(), run.id);
  const cycles = await listRunCycleResults(getDb(), run.id);
  const last = cycles[cycles.length - 1];
  const line = {
    samples,
    parts: manifest.parts.length,
    partSamples: PART_SAMPLES,
    floorRows,
    floorMs: Math.round(floorMs),
    ingestMs: Math.round(ms),
    timesFloor: Number((ms / floorMs).toFixed(2)),
    peakRssMB: Math.round(peakRss / 2 ** 20),
    rssBeforeMB: Math.round(rssBefore / 2 ** 20),
    cyclesStored: cycles.length,
    stateSampleCount: state?.sampleCount ?? 0,
    stateBytes: JSON.stringify(state?.state ?? null).length,
    lastCycleRetention: last ? Number(((last.dischargeAh / 3) * 100).toFixed(2)) : null,
    loadAverage: loadavg().map((x) => Number(x.toFixed(1))),
  };
  console.log(
    `${String(samples).padStart(9)} samples in ${line.parts} parts: ingest + cycles ${line.ingestMs} ms = ${line.timesFloor} × floor (${line.floorMs} ms); ` +
      `peak RSS ${line.peakRssMB} MB; ${line.cyclesStored} cycles stored; state ${line.stateBytes} bytes; load ${line.loadAverage.join(" ")}`,
  );
  writeFileSync(path.join(root, `result-${samples}.json`), JSON.stringify(line));
  await closePool();
}

const [flag, value] = process.argv.slice(2);
const samples = Number(value);
if (!(samples > 0)) throw new Error("usage: cycle-stream.ts --make|--case <samples>");
if (flag === "--make") make(samples);
else if (flag === "--case")
  runCase(samples).catch((e: unknown) => {
    console.error(e);
    process.exit(1);
  });
else throw new Error(`unknown flag ${flag}`);
