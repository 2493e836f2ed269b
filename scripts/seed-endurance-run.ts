import { getDb } from "../db";
import { readLabToday } from "../lib/instruments/lab-today";
import { addDays } from "../lib/instruments/calendar-date";
import { evaluateStoredRun } from "../lib/runs/evaluate-stored-run";
import { recordStep } from "../lib/runs/record-step";
import { startRun } from "../lib/runs/start-run";
import { createSpecimen, specimenInputSchema } from "../lib/specimens/specimens";
import { DEMO_ENDURANCE_RUN } from "../scenarios/demo-lab";
import { generateEnduranceLog } from "../scenarios/endurance-run";
import { asUser, findReleasedVersion, uploadLog } from "./seed-demo-lot";

/**
 * The demo endurance run: TPL-END400 on an engineering sample, in progress, with a log of some tens of
 * cycles whose capacity fades. The operator recorded the precondition and the start of the cycle block;
 * the block is still running, so the run is evaluated but not submitted. Idempotent: skipped when the
 * specimen has a run.
 */
export async function seedEnduranceRun(): Promise<string[]> {
  const scenario = DEMO_ENDURANCE_RUN;
  const db = getDb();
  const operator = await asUser("operator@brackwater.example");
  const today = readLabToday();
  let specimenId = (await db.selectFrom("specimen").select("id").where("identifier", "=", scenario.specimen).executeTakeFirst())?.id;
  const done: string[] = [];
  if (!specimenId) {
    const spec = await db.selectFrom("cell_specification").select("id").where("maker", "=", scenario.maker).where("model", "=", scenario.model).executeTakeFirstOrThrow();
    specimenId = await createSpecimen(
      operator,
      specimenInputSchema.parse({
        identifier: scenario.specimen,
        cellSpecificationId: spec.id,
        lotId: null,
        receivedOn: addDays(today, -scenario.startedDaysAgo - 2),
        conditionOnReceipt: "as received: sleeve and can undamaged",
        notes: scenario.notes,
      }),
    );
    done.push(scenario.specimen);
  }
  if (await db.selectFrom("run").select("id").where("specimen_id", "=", specimenId).executeTakeFirst()) return done;

  const { versionId } = await findReleasedVersion("TPL-END400");
  const instrumentIds = (await db.selectFrom("instrument").select("id").where("identifier", "in", [scenario.channel, scenario.ambientInstrument]).execute()).map((r) => r.id);
  const started = await startRun(operator, { procedureVersionId: versionId, specimenId, instrumentIds }, today);
  const log = generateEnduranceLog({
    cycles: scenario.cycles,
    checkEveryCycles: 50,
    fadeMahPerCycle: scenario.fadeMahPerCycle,
    precondition: { currentA: 0.6, durationS: 1800 },
  });
  const startMs = Date.parse(`${addDays(today, -scenario.startedDaysAgo)}T07:30:00Z`);
  const at = (seconds: number) => new Date(startMs + seconds * 1000).toISOString();
  const reading = (seconds: number, celsius: number) => ({ at: at(seconds), celsius, instrumentId: scenario.ambientInstrument });
  await recordStep(operator, started.id, {
    stepId: "precondition",
    cycle: 1,
    startedAt: at(0),
    endedAt: at(log.preconditionEndS ?? 0),
    ambientReadings: [reading(0, 21.6), reading(log.preconditionEndS ?? 0, 21.7)],
    programmed: { current: 0.6, endVoltage: 2.5 },
    completed: true,
  });
  // The block is still running: started, with ambient readings, not yet ended.
  const readings = Array.from({ length: 6 }, (_, k) => log.startS + ((log.endS - log.startS) * k) / 5).map((s, k) => reading(s, [21.8, 22.6, 23.1, 22.2, 21.9, 22.4][k]!));
  await recordStep(operator, started.id, {
    stepId: "cycles",
    cycle: 1,
    startedAt: at(log.startS),
    ambientReadings: readings,
    programmed: {},
    notes: "Cycle program loaded on the channel; every 50th discharge at 0.6 A.",
    completed: false,
  });
  const columns = await uploadLog(operator, started.id, `${scenario.specimen.toLowerCase()}-${scenario.channel.toLowerCase()}-cycles-1-${scenario.cycles}.csv`, log.columns);
  await evaluateStoredRun(operator, started.id, { columns });
  done.push(`run ${started.number} (TPL-END400, in progress, ${scenario.cycles} cycles logged)`);
  return done;
}
