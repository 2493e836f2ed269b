// `npm run worker`: reads uploaded data logs (docs/decisions/007). Any number may run against one
// database: each claims a job with FOR UPDATE SKIP LOCKED and a lease, so a job is read by one worker
// at a time, and a job whose worker died is taken up again when its lease runs out.
// Needs DATABASE_URL (the app role) and the S3_* settings, like the app.
import pg from "pg";
import { closePool, getDatabaseUrl } from "../db/pool";
import { LOG_INGEST_CHANNEL } from "../lib/runs/log-ingest/stage-log-upload";
import { runNextLogIngestJob } from "../lib/runs/log-ingest/run-log-ingest-job";
import { noticeStalledRuns, readStallAfterHours } from "../lib/runs/notice-stalled-runs";

/** Between looks when no notice arrives (a notice is lost if the worker was reconnecting). */
const pollMs = Number(process.env.LOG_INGEST_POLL_MS ?? 2000);
/** Between looks for endurance runs that stopped receiving samples (a stalled test: lib/runs/notice-stalled-runs.ts). */
const stallCheckMs = Number(process.env.STALL_CHECK_MS ?? 15 * 60_000);
let stopping = false;
let nextStallCheck = 0;

async function checkStalledRuns(): Promise<void> {
  if (Date.now() < nextStallCheck) return;
  nextStallCheck = Date.now() + stallCheckMs;
  try {
    const noticed = await noticeStalledRuns(new Date(), readStallAfterHours());
    if (noticed.length > 0) console.log(`worker ${process.pid}: ${noticed.length} stalled run(s) noticed`);
  } catch (e) {
    console.error("worker: could not look for stalled runs", e);
  }
}
let wake: (() => void) | null = null;

async function listen(): Promise<pg.Client | null> {
  const client = new pg.Client({ connectionString: getDatabaseUrl() });
  client.on("error", (e) => console.warn(`worker: notice connection lost (${e.message}); looking every ${pollMs} ms`));
  client.on("notification", () => wake?.());
  try {
    await client.connect();
    await client.query(`listen ${LOG_INGEST_CHANNEL}`);
    return client;
  } catch (e) {
    console.warn(`worker: cannot listen for notices (${(e as Error).message}); looking every ${pollMs} ms`);
    return null;
  }
}

async function main(): Promise<void> {
  const once = process.argv.includes("--once");
  const listener = once ? null : await listen();
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.on(signal, () => {
      stopping = true;
      wake?.();
    });
  }
  console.log(`worker ${process.pid}: reading data logs${once ? " (once)" : ""}`);
  while (!stopping) {
    if (!once) await checkStalledRuns();
    let id: string | null = null;
    try {
      id = await runNextLogIngestJob();
      if (id) console.log(`worker ${process.pid}: job ${id} done`);
    } catch (e) {
      console.error("worker: could not claim a job", e);
    }
    if (id) continue;
    if (once) break;
    await new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, pollMs);
      wake = () => {
        clearTimeout(timer);
        resolve();
      };
    });
    wake = null;
  }
  await listener?.end().catch(() => undefined);
  await closePool();
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
