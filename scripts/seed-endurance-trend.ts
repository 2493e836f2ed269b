import { getDb } from "../db";
import { getProcedureIdByCode } from "../db/procedures";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { addDays } from "../lib/instruments/calendar-date";
import { readLabToday } from "../lib/instruments/lab-today";
import { recordStep } from "../lib/runs/record-step";
import { runNextLogIngestJob } from "../lib/runs/log-ingest/run-log-ingest-job";
import { appendLogPart } from "../lib/runs/log-parts/append-log-part";
import { startRun } from "../lib/runs/start-run";
import { DEMO_LIVE_ENDURANCE_RUN } from "../scenarios/demo-lab";
import { enduranceLogPlan, formatEnduranceLogPart } from "../scenarios/endurance-log";

/** The specimen of the demo's live endurance run. */
export const DEMO_ENDURANCE_SPECIMEN = DEMO_LIVE_ENDURANCE_RUN.specimen;

/**
 * The demo's live endurance run (DEMO_LIVE_ENDURANCE_RUN): TPL-END400 in progress on an engineering sample,
 * its log sent in parts. The seed sends the first 250 cycles (≈ 130 000 samples, ≈ 5 MB) as the first part,
 * as an operator does from the log page, and reads it at once; the precondition and the start of the cycle block are recorded; `npm run demo` then pushes the next parts
 * (scripts/demo-cycler.ts and the push command). Idempotent.
 */
export async function seedEnduranceTrendRun(): Promise<string[]> {
  const scenario = DEMO_LIVE_ENDURANCE_RUN;
  const specimen = await getDb().selectFrom("specimen").select("id").where("identifier", "=", scenario.specimen).executeTakeFirst();
  const procedureId = await getProcedureIdByCode(getDb(), "TPL-END400");
  if (!specimen || !procedureId) return [];
  if (await getDb().selectFrom("run").select("id").where("specimen_id", "=", specimen.id).executeTakeFirst()) return [];
  const version = await getDb().selectFrom("procedure_version").select("id").where("procedure_id", "=", procedureId).where("status", "=", "released").executeTakeFirstOrThrow();
  const instrumentIds = (await getDb().selectFrom("instrument").select("id").where("identifier", "in", [scenario.channel, scenario.ambientInstrument]).execute()).map((r) => r.id);
  const u = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", "operator@brackwater.example").executeTakeFirstOrThrow();
  const operator: SignedInUser = { id: u.id, email: u.email, displayName: u.display_name, role: u.role };
  const today = readLabToday();
  const run = await startRun(operator, { procedureVersionId: version.id, specimenId: specimen.id, instrumentIds }, today);
  // The operator recorded the precondition and the start of the cycle block, which is still running.
  const startMs = Date.parse(`${addDays(today, -scenario.startedDaysAgo)}T07:30:00Z`);
  const at = (seconds: number) => new Date(startMs + seconds * 1000).toISOString();
  const reading = (seconds: number, celsius: number) => ({ at: at(seconds), celsius, instrumentId: scenario.ambientInstrument });
  await recordStep(operator, run.id, {
    stepId: "precondition",
    cycle: 1,
    startedAt: at(0),
    endedAt: at(1800),
    ambientReadings: [reading(0, 21.4), reading(1800, 21.6)],
    programmed: { current: 0.6, endVoltage: 2.5 },
    completed: true,
  });
  await recordStep(operator, run.id, {
    stepId: "cycles",
    cycle: 1,
    startedAt: at(2400),
    ambientReadings: [7, 14, 21, 28, 35].map((d, k) => reading(2400 + d * 86400, [21.9, 22.4, 21.7, 22.8, 22.1][k]!)),
    programmed: {},
    notes: "Cycle program loaded on the channel; the cycler writes its log in files, sent by the push command.",
    completed: false,
  });
  const csv = Buffer.from(formatEnduranceLogPart({ ...enduranceLogPlan, ...scenario.plan }, 1, scenario.seededCycles));
  const sent = await appendLogPart({ kind: "user", user: operator }, run.id, {
    name: `${scenario.specimen.toLowerCase()}-${scenario.channel.toLowerCase()}-cycles-0001-${String(scenario.seededCycles).padStart(4, "0")}.csv`,
    chunks: (async function* () {
      for (let at = 0; at < csv.length; at += 1 << 20) yield csv.subarray(at, at + (1 << 20));
    })(),
    sizeBytes: csv.length,
    mapping: {
      time: { form: "elapsed", column: "Time (s)", unit: "s" },
      voltage: { column: "Voltage (V)", unit: "V" },
      current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
      delimiter: ",",
      decimalSeparator: ".",
      headerLine: 1,
    },
  });
  // The seed reads the part itself (the demo's worker starts after it); a worker already running may take it instead.
  while ((await runNextLogIngestJob()) !== null);
  for (let waited = 0; ; waited += 500) {
    const job = await getDb().selectFrom("log_ingest_job").select(["state", "outcome"]).where("run_id", "=", run.id).executeTakeFirstOrThrow();
    if (job.state === "refused") throw new Error(`demo endurance log refused: ${JSON.stringify(job.outcome)}`);
    if (job.state === "evaluated" || job.state === "stored") break;
    if (waited > 120_000) throw new Error(`demo endurance log not read within 2 minutes (job ${sent.outcome === "queued" ? sent.jobId : "?"})`);
    await new Promise((r) => setTimeout(r, 500));
  }
  return [`run ${run.number} (TPL-END400 on ${scenario.channel}, in progress, ${scenario.seededCycles} cycles in its first log part)`];
}

