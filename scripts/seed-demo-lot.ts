import { getDb } from "../db";
import { getLotSampling } from "../lib/lots/sampling/read-lot-sampling";
import { getProcedureIdByCode } from "../db/procedures";
import { getRun } from "../db/runs";
import { formatLogCsv } from "../lib/analysis";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { listFindings, parseStoredEvaluation, type Finding, type RunEvaluation } from "../lib/conformance";
import { addDays } from "../lib/instruments/calendar-date";
import { readLabToday } from "../lib/instruments/lab-today";
import { drawLotSample, setLotSamplingPlan } from "../lib/lots";
import { acceptRun } from "../lib/reviews/accept-run";
import { listDeviatingFindings } from "../lib/reviews/reviewed-record";
import { evaluateStoredRun } from "../lib/runs/evaluate-stored-run";
import { ingestLog } from "../lib/runs/ingest-log";
import { recordStep } from "../lib/runs/record-step";
import { startRun } from "../lib/runs/start-run";
import { submitRun } from "../lib/runs/submit-run";
import { createLot, lotInputSchema } from "../lib/lots/lot-records";
import { createSpecimen, specimenInputSchema } from "../lib/specimens/specimens";
import type { ResolvedStep } from "../protocols";
import { buildDemoRunLog } from "./demo-run-log";
import { DEMO_LOT_B } from "./demo-lot-scenario";
import { DEMO_USERS } from "../scenarios/demo-lab";

const AS_RECEIVED = "as received: sleeve intact, no dents, no leakage";
const RATE_NOTE = "Taken from the lot outside the ISO 2859-1 sample, for rate characterisation.";
/** The reviewer's note on each deviation the over-current discharge leaves, by rule. */
const OVER_CURRENT_NOTES: Partial<Record<Finding["rule"], string>> = {
  "set-point-matches": "Channel programmed at 10.2 A instead of 9.7 A. The rate series sets no limit; the point is kept, marked as above the rating.",
  "current-held": "Follows from the 10.2 A set-point noted on the same step; the current itself was steady.",
};

export async function asUser(email: string): Promise<SignedInUser> {
  const r = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", email).executeTakeFirstOrThrow();
  return { id: r.id, email: r.email, displayName: r.display_name, role: r.role };
}

async function findId(table: "lot" | "specimen", identifier: string): Promise<string | undefined> {
  return (await getDb().selectFrom(table).select("id").where("identifier", "=", identifier).executeTakeFirst())?.id;
}

export async function findReleasedVersion(code: string): Promise<{ procedureId: string; versionId: string }> {
  const procedureId = await getProcedureIdByCode(getDb(), code);
  if (!procedureId) throw new Error(`the demo library has no procedure ${code}`);
  const v = await getDb().selectFrom("procedure_version").select("id").where("procedure_id", "=", procedureId).where("status", "=", "released").orderBy("number", "desc").executeTakeFirstOrThrow();
  return { procedureId, versionId: v.id };
}

const specimenIdentifier = (position: number) => `${DEMO_LOT_B.identifier}-${String(position).padStart(2, "0")}`;

/** The lot, its plan and its draw; each made only if missing. */
async function seedLotAndDraw(done: string[]): Promise<{ lotId: string; specId: string; receivedOn: string; drawn: number[] }> {
  const engineer = await asUser("engineer@brackwater.example");
  const operator = await asUser("operator@brackwater.example");
  const spec = await getDb().selectFrom("cell_specification").select("id").where("maker", "=", DEMO_LOT_B.specification.maker).where("model", "=", DEMO_LOT_B.specification.model).executeTakeFirstOrThrow();
  const receivedOn = addDays(readLabToday(), -DEMO_LOT_B.receivedDaysAgo);
  let lotId = await findId("lot", DEMO_LOT_B.identifier);
  if (!lotId) {
    const { identifier, supplier, customer, quantityReceived, notes } = DEMO_LOT_B;
    lotId = await createLot(operator, lotInputSchema.parse({ identifier, supplier, customer, quantityReceived, notes, receivedOn, cellSpecificationId: spec.id }));
    done.push(identifier);
  }
  let sampling = await getLotSampling(getDb(), lotId);
  if (!sampling?.plan) {
    const { procedureId } = await findReleasedVersion(DEMO_LOT_B.plan.acceptanceProcedure);
    await setLotSamplingPlan(engineer, lotId, { inspectionLevel: DEMO_LOT_B.plan.inspectionLevel, aql: DEMO_LOT_B.plan.aql, acceptanceProcedureId: procedureId });
  }
  if (!sampling?.draw) {
    await drawLotSample(engineer, lotId, { method: "random", seed: DEMO_LOT_B.drawSeed });
    sampling = await getLotSampling(getDb(), lotId);
    done.push(`${DEMO_LOT_B.identifier} plan and draw`);
  }
  const drawn = sampling?.draw?.positions ?? [];
  if (drawn.length !== DEMO_LOT_B.sampledModelCapacityMah.length) throw new Error(`lot ${DEMO_LOT_B.identifier}: ${drawn.length} cells drawn, the scenario has ${DEMO_LOT_B.sampledModelCapacityMah.length}`);
  return { lotId, specId: spec.id, receivedOn, drawn };
}

/** A specimen at a tray position of the lot, registered only if missing. */
async function ensureSpecimen(lot: { lotId: string; specId: string; receivedOn: string }, position: number, notes: string | null, done: string[]): Promise<string> {
  const identifier = specimenIdentifier(position);
  const existing = await findId("specimen", identifier);
  if (existing) return existing;
  const operator = await asUser("operator@brackwater.example");
  const id = await createSpecimen(
    operator,
    specimenInputSchema.parse({ identifier, cellSpecificationId: lot.specId, lotId: lot.lotId, lotPosition: position, receivedOn: lot.receivedOn, conditionOnReceipt: AS_RECEIVED, notes }),
  );
  done.push(identifier);
  return id;
}

interface DemoRun {
  specimenId: string;
  procedure: string;
  channel: string;
  startedAt: string;
  modelCapacityMah: number;
  resistanceOhm: number;
  seed: number;
  /** Set-points programmed other than the resolved ones, by step id. */
  programmed?: Record<string, { current: number }>;
}

/** Uploads a demo log as a cycler would write it (CSV, elapsed seconds), through the app's own ingest. */
export async function uploadLog(operator: SignedInUser, runId: string, name: string, columns: Parameters<typeof formatLogCsv>[0]) {
  const withTemperature = columns.temperatureC !== undefined;
  const csv = formatLogCsv(columns, { columns: withTemperature ? ["time", "voltage", "current", "temperature"] : ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const bytes = new TextEncoder().encode(csv.value);
  async function* chunks() {
    for (let i = 0; i < bytes.length; i += 256 * 1024) yield bytes.subarray(i, i + 256 * 1024);
  }
  const mapping = {
    time: { form: "elapsed", column: "Time (s)", unit: "s" },
    voltage: { column: "Voltage (V)", unit: "V" },
    current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
    ...(withTemperature && { temperature: { column: "Temperature (°C)" } }),
    delimiter: ",",
    decimalSeparator: ".",
    headerLine: 1,
  };
  const ingested = await ingestLog(operator, runId, { name, chunks: chunks(), mapping });
  if (!ingested.ok) throw new Error(`demo log refused: ${ingested.error.message}`);
  return ingested.columns;
}

/** The reviewer's note on each deviation: only the over-current discharge is meant to leave any. */
function noteDeviations(evaluation: RunEvaluation, runNumber: string): { findingId: string; note: string }[] {
  return listDeviatingFindings(evaluation).map((f) => {
    const note = OVER_CURRENT_NOTES[f.rule];
    if (!note) throw new Error(`demo run ${runNumber}: unexpected deviation ${f.id} (${f.observed.text})`);
    return { findingId: f.id, note };
  });
}

/**
 * One run carried out, logged, evaluated and submitted by the operator, then accepted and signed
 * ("reviewed") by the second engineer: the same services as the app, with the demo passwords.
 */
async function seedReviewedRun(run: DemoRun): Promise<string> {
  const operator = await asUser("operator@brackwater.example");
  const reviewer = await asUser("engineer2@brackwater.example");
  const { versionId } = await findReleasedVersion(run.procedure);
  const instrumentIds = (await getDb().selectFrom("instrument").select("id").where("identifier", "in", [run.channel, "CC-01"]).execute()).map((r) => r.id);
  const started = await startRun(operator, { procedureVersionId: versionId, specimenId: run.specimenId, instrumentIds }, readLabToday());
  const stored = await getRun(getDb(), started.id);
  const acknowledged: Record<string, string[]> = {};
  for (const stepId of Object.keys(run.programmed ?? {})) acknowledged[stepId] = [`discharge-current-above-rating/${stepId}/current`];
  const log = buildDemoRunLog({
    resolution: stored!.resolution,
    cellModel: { capacityMAh: run.modelCapacityMah, seriesResistanceOhm: run.resistanceOhm, initialSoc: 0.45 },
    seed: run.seed,
    startedAt: run.startedAt,
    sampleIntervalS: 2,
    restS: (step: ResolvedStep) => (step.kind === "rest" ? step.minDuration.value + 300 : 0),
    ...(run.programmed && { programmed: run.programmed, acknowledged }),
    ambientC: 21.8,
    ambientInstrument: "CC-01",
  });
  for (const record of log.stepRecords) await recordStep(operator, started.id, record);
  const specimen = await getDb().selectFrom("specimen").select("identifier").where("id", "=", run.specimenId).executeTakeFirstOrThrow();
  const columns = await uploadLog(operator, started.id, `${specimen.identifier.toLowerCase()}-${run.channel.toLowerCase()}.csv`, log.columns);
  const evaluated = await evaluateStoredRun(operator, started.id, { columns });
  await submitRun(operator, started.id, { confirmedDeviations: listFindings(evaluated).filter((f) => f.outcome === "deviates").length });
  const evaluation = await getDb().selectFrom("run_evaluation").select(["id", "evaluation"]).where("run_id", "=", started.id).orderBy("evaluated_at", "desc").executeTakeFirstOrThrow();
  const password = DEMO_USERS.find((u) => u.email === reviewer.email)!.password;
  await acceptRun(reviewer, started.id, {
    password,
    evaluationId: evaluation.id,
    acknowledgements: noteDeviations(parseStoredEvaluation(evaluation.evaluation), started.number),
  });
  return started.number;
}

const at = (day: string, hour: number) => `${day}T${String(hour).padStart(2, "0")}:30:00Z`;

/**
 * The second demo lot with its sample drawn and reviewed, and its rate series. Idempotent: the lot,
 * plan, draw and specimens are made only if missing, and a specimen that has a run is left as it is.
 */
export async function seedDemoLot(): Promise<string[]> {
  const done: string[] = [];
  const lot = await seedLotAndDraw(done);
  const runs: DemoRun[] = [];
  for (const [k, position] of lot.drawn.entries()) {
    const specimenId = await ensureSpecimen(lot, position, null, done);
    runs.push({
      specimenId,
      procedure: "TPL-RC20",
      channel: k % 2 === 0 ? "CY1-CH01" : "CY1-CH02",
      startedAt: at(addDays(lot.receivedOn, 1 + Math.floor(k / 2)), k % 2 === 0 ? 7 : 8),
      modelCapacityMah: DEMO_LOT_B.sampledModelCapacityMah[k]!,
      resistanceOhm: 0.025,
      seed: 26_120 + position,
    });
  }
  const spare = Array.from({ length: DEMO_LOT_B.quantityReceived }, (_, k) => k + 1).filter((p) => !lot.drawn.includes(p));
  for (const [j, cell] of DEMO_LOT_B.rateCells.entries()) {
    const position = spare[j]!;
    const specimenId = await ensureSpecimen(lot, position, RATE_NOTE, done);
    runs.push({
      specimenId,
      procedure: "TPL-RATE",
      channel: j % 2 === 0 ? "CY1-CH01" : "CY1-CH02",
      startedAt: at(addDays(lot.receivedOn, 8 + 2 * j), 7),
      modelCapacityMah: cell.modelCapacityMah,
      resistanceOhm: cell.resistanceOhm,
      seed: 26_180 + position,
      ...(cell.maxDischargeProgrammedA !== undefined && { programmed: { "discharge-max": { current: cell.maxDischargeProgrammedA } } }),
    });
  }
  for (const run of runs) {
    if (await getDb().selectFrom("run").select("id").where("specimen_id", "=", run.specimenId).executeTakeFirst()) continue;
    done.push(`run ${await seedReviewedRun(run)} (${run.procedure}, accepted)`);
  }
  return done;
}
