import { getDb } from "../db";
import { getProcedureIdByCode } from "../db/procedures";
import type { LogColumns } from "../lib/analysis";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { readLabToday } from "../lib/instruments/lab-today";
import { ingestLog } from "../lib/runs/ingest-log";
import { startRun } from "../lib/runs/start-run";
import { enduranceLogPlan, generateEnduranceLog, type EnduranceLogPlan } from "../scenarios/endurance-log";

/** The demo's cycling run: 250 cycles of an invented fade, sampled every 30 s (≈ 130 000 samples, ≈ 5 MB). */
export const DEMO_ENDURANCE_SPECIMEN = "HV30-ENG-02";
const DEMO_PLAN: EnduranceLogPlan = { ...enduranceLogPlan, cycles: 250, sampleIntervalS: 30, fadePerCycle: 0.0006, pulseEveryCycles: 50 };

/**
 * A run in progress on an engineering sample whose cycler log so far holds 250 cycles, so the run page
 * shows its capacity per cycle and the trend. Nothing is recorded on its step sheet. Idempotent.
 */
export async function seedEnduranceTrendRun(): Promise<string[]> {
  const specimen = await getDb().selectFrom("specimen").select("id").where("identifier", "=", DEMO_ENDURANCE_SPECIMEN).executeTakeFirst();
  const procedureId = await getProcedureIdByCode(getDb(), "TPL-RC20");
  if (!specimen || !procedureId) return [];
  if (await getDb().selectFrom("run").select("id").where("specimen_id", "=", specimen.id).executeTakeFirst()) return [];
  const version = await getDb().selectFrom("procedure_version").select("id").where("procedure_id", "=", procedureId).where("status", "=", "released").executeTakeFirstOrThrow();
  const channel = await getDb().selectFrom("instrument").select("id").where("identifier", "=", "CY1-CH01").executeTakeFirst();
  const u = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", "operator@brackwater.example").executeTakeFirstOrThrow();
  const operator: SignedInUser = { id: u.id, email: u.email, displayName: u.display_name, role: u.role };
  const run = await startRun(operator, { procedureVersionId: version.id, specimenId: specimen.id, instrumentIds: channel ? [channel.id] : [] }, readLabToday());
  const ingested = await ingestLog(operator, run.id, {
    name: `${DEMO_ENDURANCE_SPECIMEN.toLowerCase()}-cy1-ch01-cycles-1-250.csv`,
    chunks: csvChunks(generateEnduranceLog(DEMO_PLAN, 8192)),
    mapping: {
      time: { form: "elapsed", column: "Time (s)", unit: "s" },
      voltage: { column: "Voltage (V)", unit: "V" },
      current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
      delimiter: ",",
      decimalSeparator: ".",
      headerLine: 1,
    },
  });
  if (!ingested.ok) throw new Error(`demo cycling log refused: ${ingested.error.message}`);
  return [`run ${run.number} (250 cycles so far)`];
}

/** The samples as CSV bytes, chunk by chunk, without the whole log in memory. */
export async function* csvChunks(chunks: Iterable<LogColumns>): AsyncIterable<Uint8Array> {
  const encoder = new TextEncoder();
  yield encoder.encode("Time (s),Voltage (V),Current (A)\n");
  for (const c of chunks) {
    let text = "";
    for (let i = 0; i < c.length; i++) text += `${(c.timeS[i] as number).toFixed(1)},${(c.voltageV[i] as number).toFixed(4)},${(c.currentA[i] as number).toFixed(4)}\n`;
    yield encoder.encode(text);
  }
}
