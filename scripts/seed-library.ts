import { formatLogCsv } from "../lib/analysis";
import { getRun } from "../db/runs";
import { getLatestRunEvaluation } from "../db/run-series";
import { issueRunCertificate } from "../lib/certificates/issue-certificate";
import { listFindings } from "../lib/conformance";
import { acceptRun } from "../lib/reviews/accept-run";
import { listDeviatingFindings } from "../lib/reviews/reviewed-record";
import { evaluateStoredRun } from "../lib/runs/evaluate-stored-run";
import { ingestLog } from "../lib/runs/ingest-log";
import { recordStep } from "../lib/runs/record-step";
import { submitRun } from "../lib/runs/submit-run";
import { buildRatedCapacityRun, logStartedAt } from "../scenarios/rated-capacity-run";
import { getDb } from "../db";
import { getProcedureIdByCode } from "../db/procedures";
import { addDays } from "../lib/instruments/calendar-date";
import { createInstrument, instrumentInputSchema } from "../lib/instruments/instruments";
import { readLabToday } from "../lib/instruments/lab-today";
import type { SignedInUser } from "../lib/auth/signed-in-user";
import { createProcedure, releaseVersion, submitForReview } from "../lib/procedures/lifecycle";
import { procedureDraftSchema } from "../lib/procedures/procedure-input";
import { plainToRichText } from "../lib/rich-text";
import { startRun } from "../lib/runs/start-run";
import { createLot, lotInputSchema } from "../lib/lots/lot-records";
import { createSpecimen, specimenInputSchema } from "../lib/specimens/specimens";
import { attachDatasheet, createCellSpecification, cellSpecificationInputSchema } from "../lib/specs/cell-specifications";
import { procedureTemplates } from "../protocols";
import { renderDemoDatasheet } from "./demo-datasheet";
import {
  DEMO_CALIBRATION_INTERVAL_DAYS,
  DEMO_CELL_SPECIFICATIONS,
  DEMO_INSTRUMENTS,
  DEMO_LOOSE_SPECIMENS,
  DEMO_LOT,
  DEMO_USERS,
} from "../scenarios/demo-lab";

const STANDARD_CAUTIONS = plainToRichText(
  [
    "Lithium cells can vent, burn or explode. Test inside the fire-safe enclosure with the extraction on.",
    "Never exceed the cell's maximum charge current, maximum continuous discharge current or charge voltage from its specification.",
    "Do not charge below 0 °C. Stop the step and call the engineer on an abnormal temperature rise, swelling, smell or leakage.",
    "This procedure does not replace the lab's safety rules, local codes or the text of the standard.",
  ].join("\n\n"),
);

async function asUser(email: string): Promise<SignedInUser> {
  const r = await getDb().selectFrom("app_user").select(["id", "email", "display_name", "role"]).where("email", "=", email).executeTakeFirstOrThrow();
  return { id: r.id, email: r.email, displayName: r.display_name, role: r.role };
}

/** Cell specifications and the built-in templates, released by a second engineer. Idempotent. */
export async function seedLibrary(): Promise<string[]> {
  const done: string[] = [];
  const author = await asUser("engineer@brackwater.example");
  const releaser = await asUser("engineer2@brackwater.example");

  for (const spec of DEMO_CELL_SPECIFICATIONS) {
    const exists = await getDb().selectFrom("cell_specification").select("id").where("maker", "=", spec.maker).where("model", "=", spec.model).executeTakeFirst();
    if (exists) continue;
    const id = await createCellSpecification(author, cellSpecificationInputSchema.parse(spec));
    const fileName = `${spec.model.toLowerCase()}-datasheet.pdf`;
    await attachDatasheet(author, id, { name: fileName, bytes: renderDemoDatasheet(spec.maker, spec.model, spec.data) });
    done.push(`${spec.maker} ${spec.model}`);
  }

  for (const template of procedureTemplates) {
    if (await getProcedureIdByCode(getDb(), template.procedure.header.code)) continue;
    const input = procedureDraftSchema.parse({
      definition: template.procedure,
      instructions: plainToRichText(template.procedure.header.scope),
      cautions: STANDARD_CAUTIONS,
    });
    const { versionId } = await createProcedure(author, input);
    await submitForReview(author, versionId);
    await releaseVersion(releaser, versionId);
    done.push(template.procedure.header.code);
  }
  done.push(...(await seedInstruments()), ...(await seedLotAndSpecimens()), ...(await seedDemoRun()), ...(await seedEvaluatedRun()), ...(await seedCertifiedRun()));
  return done;
}

/** The demo instruments, dated from today so none is overdue and one falls due soon. Idempotent. */
export async function seedInstruments(): Promise<string[]> {
  const done: string[] = [];
  const admin = await asUser("admin@brackwater.example");
  const today = readLabToday();
  for (const { dueInDays, ...instrument } of DEMO_INSTRUMENTS) {
    if (await findId("instrument", instrument.identifier)) continue;
    const dueOn = addDays(today, dueInDays);
    const calibratedOn = addDays(dueOn, -DEMO_CALIBRATION_INTERVAL_DAYS);
    await createInstrument(admin, instrumentInputSchema.parse({ ...instrument, calibratedOn, dueOn }));
    done.push(instrument.identifier);
  }
  return done;
}

/** The demo lot with its six specimens, and two loose specimens of another cell. Idempotent. */
export async function seedLotAndSpecimens(): Promise<string[]> {
  const done: string[] = [];
  const operator = await asUser("operator@brackwater.example");
  const today = readLabToday();
  const lotSpec = await findSpecification(DEMO_LOT.specification);
  const receivedOn = addDays(today, -DEMO_LOT.receivedDaysAgo);
  let lotId = await findId("lot", DEMO_LOT.identifier);
  if (!lotId) {
    const { identifier, supplier, quantityReceived, notes } = DEMO_LOT;
    lotId = await createLot(operator, lotInputSchema.parse({ identifier, supplier, quantityReceived, notes, receivedOn, cellSpecificationId: lotSpec }));
    done.push(identifier);
  }
  const specimens = [
    ...DEMO_LOT.specimens.map((s) => ({ ...s, cellSpecificationId: lotSpec, lotId, receivedOn, notes: null })),
    ...(await Promise.all(
      DEMO_LOOSE_SPECIMENS.map(async ({ specification, receivedDaysAgo, ...s }) => ({
        ...s,
        cellSpecificationId: await findSpecification(specification),
        lotId: null,
        receivedOn: addDays(today, -receivedDaysAgo),
      })),
    )),
  ];
  for (const specimen of specimens) {
    if (await findId("specimen", specimen.identifier)) continue;
    await createSpecimen(operator, specimenInputSchema.parse(specimen));
    done.push(specimen.identifier);
  }
  return done;
}

/** A planned run of TPL-RC20 on the lot's first specimen by the demo operator, nothing recorded yet. Idempotent. */
export async function seedDemoRun(): Promise<string[]> {
  const specimenId = await findId("specimen", DEMO_LOT.specimens[0]!.identifier);
  const procedureId = await getProcedureIdByCode(getDb(), "TPL-RC20");
  if (!specimenId || !procedureId) return [];
  const version = await getDb()
    .selectFrom("procedure_version")
    .select("id")
    .where("procedure_id", "=", procedureId)
    .where("status", "=", "released")
    .orderBy("number", "desc")
    .executeTakeFirst();
  if (!version) return [];
  const existing = await getDb().selectFrom("run").select("id").where("specimen_id", "=", specimenId).where("procedure_version_id", "=", version.id).executeTakeFirst();
  if (existing) return [];
  const channel = await findId("instrument", "CY1-CH01");
  const ambient = await getDb()
    .selectFrom("instrument")
    .select("id")
    .where("kind", "in", ["thermometer", "climate-chamber"])
    .where("active", "=", true)
    .orderBy("kind", "desc")
    .orderBy("identifier")
    .executeTakeFirst();
  const instrumentIds = [channel, ambient?.id].filter((id): id is string => id !== undefined);
  const operator = await asUser("operator@brackwater.example");
  const run = await startRun(operator, { procedureVersionId: version.id, specimenId, instrumentIds }, readLabToday());
  return [`run ${run.number}`];
}

/**
 * A finished run to look at: every step recorded, an invented cycler log (from the simple cell model in
 * scenarios/rated-capacity-run.ts) uploaded, evaluated and submitted, all through the same services as the app. Idempotent.
 */
export async function seedEvaluatedRun(): Promise<string[]> {
  const run = await seedSubmittedRun(DEMO_LOT.specimens[2]!.identifier, 5010, 4);
  return run ? [`run ${run.number} (evaluated, submitted)`] : [];
}

/**
 * A run carried through to the end for the auditor: submitted by the operator, accepted and signed as
 * reviewed by the second engineer (noting any deviation), and certified by the same engineer. Idempotent.
 */
export async function seedCertifiedRun(): Promise<string[]> {
  const run = await seedSubmittedRun(DEMO_LOT.specimens[3]!.identifier, 4985, 3);
  if (!run) return [];
  const reviewer = await asUser("engineer2@brackwater.example");
  const password = DEMO_USERS.find((u) => u.email === reviewer.email)!.password;
  const latest = await getLatestRunEvaluation(getDb(), run.id);
  if (!latest) throw new Error(`run ${run.number} has no evaluation`);
  const acknowledgements = listDeviatingFindings(latest.evaluation).map((f) => ({
    findingId: f.id,
    note: "Reviewed against the run's records; no effect on the delivered capacity (demo note).",
  }));
  await acceptRun(reviewer, run.id, { password, acknowledgements, evaluationId: latest.id });
  const { number } = await issueRunCertificate(reviewer, run.id, { password });
  return [`run ${run.number} (certified as ${number})`];
}

async function seedSubmittedRun(identifier: string, capacityMAh: number, daysAgo: number): Promise<{ id: string; number: string } | null> {
  const specimenId = await findId("specimen", identifier);
  const procedureId = await getProcedureIdByCode(getDb(), "TPL-RC20");
  if (!specimenId || !procedureId) return null;
  if (await getDb().selectFrom("run").select("id").where("specimen_id", "=", specimenId).executeTakeFirst()) return null;
  const version = await getDb().selectFrom("procedure_version").select("id").where("procedure_id", "=", procedureId).where("status", "=", "released").executeTakeFirstOrThrow();
  const instrumentIds = [await findId("instrument", "CY1-CH02"), await findId("instrument", "CC-01")].filter((id): id is string => id !== undefined);
  const operator = await asUser("operator@brackwater.example");
  const run = await startRun(operator, { procedureVersionId: version.id, specimenId, instrumentIds }, readLabToday());
  const stored = await getRun(getDb(), run.id);
  const korvel = DEMO_CELL_SPECIFICATIONS.find((s) => s.model === "KV-21N48")!;
  const built = buildRatedCapacityRun({ cell: korvel.data, resolution: stored!.resolution, cellModel: { capacityMAh }, sampleIntervalS: 2 });
  // The invented log starts on a fixed day; the records are moved to a few days before today so the
  // testing falls inside the instruments' calibration periods (the log itself counts elapsed seconds).
  const shiftMs = Date.parse(`${addDays(readLabToday(), -daysAgo)}T08:00:00.000Z`) - Date.parse(logStartedAt);
  const shift = (iso: string | undefined) => iso && new Date(Date.parse(iso) + shiftMs).toISOString();
  for (const record of built.input.stepRecords) {
    await recordStep(operator, run.id, {
      ...record,
      startedAt: shift(record.startedAt),
      endedAt: shift(record.endedAt),
      ambientReadings: record.ambientReadings?.map((a) => ({ ...a, at: shift(a.at)!, instrumentId: "CC-01" })),
    });
  }
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current", "temperature"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const bytes = new TextEncoder().encode(csv.value);
  async function* chunks() {
    for (let i = 0; i < bytes.length; i += 64 * 1024) yield bytes.subarray(i, i + 64 * 1024);
  }
  const mapping = {
    time: { form: "elapsed", column: "Time (s)", unit: "s" },
    voltage: { column: "Voltage (V)", unit: "V" },
    current: { column: "Current (A)", unit: "A", dischargeSign: "negative" },
    temperature: { column: "Temperature (°C)" },
    delimiter: ",",
    decimalSeparator: ".",
    headerLine: 1,
  };
  const ingested = await ingestLog(operator, run.id, { name: `${identifier.toLowerCase()}-cy1-ch02.csv`, chunks: chunks(), mapping });
  if (!ingested.ok) throw new Error(`demo log refused: ${ingested.error.message}`);
  const evaluation = await evaluateStoredRun(operator, run.id, { columns: ingested.columns });
  await submitRun(operator, run.id, { confirmedDeviations: listFindings(evaluation).filter((f) => f.outcome === "deviates").length });
  return { id: run.id, number: run.number };
}

async function findId(table: "instrument" | "lot" | "specimen", identifier: string): Promise<string | undefined> {
  const r = await getDb().selectFrom(table).select("id").where("identifier", "=", identifier).executeTakeFirst();
  return r?.id;
}

async function findSpecification(s: { maker: string; model: string }): Promise<string> {
  const r = await getDb().selectFrom("cell_specification").select("id").where("maker", "=", s.maker).where("model", "=", s.model).executeTakeFirstOrThrow();
  return r.id;
}
