import { sql } from "kysely";
import { ZodError } from "zod";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { translateConstraintError } from "@/db/constraint-errors";
import { getLotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import { closePool } from "@/db/pool";
import { setRunStatus } from "@/db/runs";
import { formatLogCsv } from "@/lib/analysis";
import { toErrorResponse } from "@/lib/api/error-response";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { addDays } from "@/lib/instruments/calendar-date";
import { readLabToday } from "@/lib/instruments/lab-today";
import { computeSamplingPlan, drawLotSample, setLotSamplingPlan } from "@/lib/lots";
import { createProcedure } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { drawSample } from "@/lib/lots/sampling";
import { createLot, editLot, lotInputSchema } from "@/lib/lots/lot-records";
import { createSpecimen, editSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { ratedCapacityAt20cTemplate } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, type BuiltRun } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, chunksOf, releaseRatedCapacityProcedure } from "./fixtures";
import { withOwnerClient } from "../support/test-database";

// pg's pool.end() resolves before its sockets close; the file's database is dropped (with force)
// right after, so let the server see the connections go first.
afterAll(async () => {
  await closePool();
  await new Promise((resolve) => setTimeout(resolve, 300));
});

const today = readLabToday();
let counter = 0;
const next = () => ++counter;

async function setUpLab() {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const reviewer = await makeUser("engineer", "Rex Reviewer");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-LOT", data: inventedCell });
  const rated = await releaseRatedCapacityProcedure(engineer, reviewer, "T-LOT-RC", "simple acceptance");
  // A guard-band rule needs the expanded uncertainty; the channel below has no accuracy, so no
  // budget is made and every run of this procedure ends "not decided" (lib/conformance/evaluate-acceptance.ts).
  const guarded = await releaseRatedCapacityProcedure(engineer, reviewer, "T-LOT-GD", "binary guard band");
  const draft = await createProcedure(engineer, procedureDraftSchema.parse({ definition: { ...structuredClone(ratedCapacityAt20cTemplate), header: { ...ratedCapacityAt20cTemplate.header, code: "T-LOT-DRAFT" } } }));
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({
        kind: "cycler-channel",
        identifier: "CH-LOT",
        serial: "S-LOT",
        accuracy: JSON.stringify({}),
        calibration_certificate: "CAL-LOT",
        calibrated_on: addDays(today, -100),
        due_on: addDays(today, 200),
        created_by: engineer.id,
      })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  return { engineer, reviewer, operator, specId, rated, guarded, draftProcedureId: draft.procedureId, channel };
}

type Lab = Awaited<ReturnType<typeof setUpLab>>;
let labPromise: Promise<Lab> | null = null;
const lab = () => (labPromise ??= setUpLab());

async function makeLot(quantityReceived: number): Promise<{ id: string; identifier: string }> {
  const l = await lab();
  const identifier = `IT-LOT-${next()}`;
  const id = await createLot(
    l.operator,
    lotInputSchema.parse({ identifier, cellSpecificationId: l.specId, supplier: "Fernhollow Components", quantityReceived, receivedOn: addDays(today, -5), customer: "Quayside Packs Ltd" }),
  );
  return { id, identifier };
}

async function registerAt(lotId: string, lotPosition: number): Promise<string> {
  const l = await lab();
  return createSpecimen(
    l.operator,
    specimenInputSchema.parse({ identifier: `IT-CELL-${next()}`, cellSpecificationId: l.specId, lotId, lotPosition, receivedOn: addDays(today, -5), conditionOnReceipt: "as received" }),
  );
}

// Two synthetic logs serve every run: a cell above its rated 3 000 mAh, and one below its 2 900 mAh
// minimum that fails all five cycles the procedure's repeat rule allows (IEC 61960-3 7.3.1).
const good = buildRatedCapacityRun({ sampleIntervalS: 20 });
const weak = buildRatedCapacityRun({ sampleIntervalS: 20, cycles: 5, cellModel: { capacityMAh: 2700 } });

/** A run carried out, logged, evaluated and submitted by the operator; `review` adds the accepting review. */
async function testCell(specimenId: string, versionId: string, built: BuiltRun, review = true) {
  const l = await lab();
  const run = await startRun(l.operator, { procedureVersionId: versionId, specimenId, instrumentIds: [l.channel] }, today);
  for (const record of built.input.stepRecords) await recordStep(l.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(l.operator, run.id, { name: "log.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  const evaluation = await evaluateStoredRun(l.operator, run.id, { columns: ingested.columns });
  await submitRun(l.operator, run.id);
  if (review) await acceptRun(run.id);
  return { runId: run.id, number: run.number, conforms: evaluation.verdict.specimenConforms };
}

/** The accepting review as the review screen writes it: a 'reviewed' signature, the review row, the run accepted. */
async function acceptRun(runId: string) {
  const l = await lab();
  const latest = await getDb().selectFrom("run_evaluation").select(["id", "evaluation"]).where("run_id", "=", runId).orderBy("evaluated_at", "desc").executeTakeFirstOrThrow();
  const signature = await getDb()
    .insertInto("electronic_signature")
    .values({ signer_id: l.reviewer.id, printed_name: l.reviewer.displayName, meaning: "reviewed", entity_type: "run", entity_id: runId, record_sha256: hashCanonicalJson(latest.evaluation) })
    .returning("id")
    .executeTakeFirstOrThrow();
  await getDb()
    .insertInto("run_review")
    .values({ run_id: runId, reviewer_id: l.reviewer.id, decision: "accepted", comments: "Records complete.", run_evaluation_id: latest.id, acknowledged_deviations: "[]", signature_id: signature.id })
    .execute();
  await setRunStatus(getDb(), runId, "accepted");
}

const planColumns = (lotId: string) =>
  getDb().selectFrom("lot").select(["inspection_level", "aql", "severity", "sampling_plan", "acceptance_procedure_id", "plan_set_by", "plan_set_at"]).where("id", "=", lotId).executeTakeFirstOrThrow();
const auditActions = async (lotId: string) =>
  (await getDb().selectFrom("audit_event").select("action").where("entity_id", "=", lotId).orderBy("id").execute()).map((e) => e.action);
const drawCount = async (lotId: string) => (await getDb().selectFrom("lot_sample_draw").select("id").where("lot_id", "=", lotId).execute()).length;

describe("lot sampling plans", () => {
  it("sets a lot's plan from its quantity and stores it with its audit event (lot of 60 at II, AQL 1.0: E, n = 13, Ac 0, Re 1)", async () => {
    const l = await lab();
    const lot = await makeLot(60);
    const plan = await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "1.0", acceptanceProcedureId: l.rated.procedureId });
    // docs/references.md §10 [published]: lot 51–90 at AQL 1.0 → E, n = 13, Ac 0, Re 1.
    expect(plan).toMatchObject({ lotSize: 60, codeLetter: "E", sampleSize: 13, acceptanceNumber: 0, rejectionNumber: 1, hundredPercent: false });
    const stored = await planColumns(lot.id);
    expect(stored).toMatchObject({ inspection_level: "II", aql: "1.0", severity: "normal", acceptance_procedure_id: l.rated.procedureId, plan_set_by: l.engineer.id });
    expect(stored.sampling_plan).toEqual(plan);
    expect(stored.plan_set_at).toBeInstanceOf(Date);
    expect(await auditActions(lot.id)).toEqual(["lot.create", "lot.set-sampling-plan"]);

    const sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling).toMatchObject({ aql: "1.0", inspectionLevel: "II", acceptanceProcedure: { id: l.rated.procedureId, code: "T-LOT-RC" }, draw: null, members: [] });
    expect(sampling?.decision).toMatchObject({ verdict: "pending", tested: 0, remaining: 13 });

    // Before the draw the plan may change; an AQL given as a number is stored as the table heads it.
    const changed = await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "S-3", aql: 4 });
    // Lot 51–90 at S-3 → C; C at AQL 4.0 is an arrow up to B (n = 3, Ac 0, Re 1).
    expect(changed).toMatchObject({ initialCodeLetter: "C", codeLetter: "B", arrow: "up", sampleSize: 3, acceptanceNumber: 0, rejectionNumber: 1, aqlLabel: "4.0" });
    expect(await planColumns(lot.id)).toMatchObject({ inspection_level: "S-3", aql: "4.0", acceptance_procedure_id: null });
    const changeEvent = await getDb().selectFrom("audit_event").select(["before", "after"]).where("entity_id", "=", lot.id).where("action", "=", "lot.set-sampling-plan").orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(changeEvent.before).toMatchObject({ codeLetter: "E", sampleSize: 13, acceptanceProcedure: "T-LOT-RC" });
    expect(changeEvent.after).toMatchObject({ codeLetter: "B", sampleSize: 3, acceptanceProcedure: "any procedure's reviewed run" });
  });

  it("refuses impossible plans with a message naming the field, and stores nothing", async () => {
    const l = await lab();
    const lot = await makeLot(60);
    const refusals: [Parameters<typeof setLotSamplingPlan>[2], string, RegExp][] = [
      [{ inspectionLevel: "II", aql: "0.7" }, "aql", /AQL 0\.7 is not a column of Table 2-A; choose one of 0\.010, .*, 10/],
      [{ inspectionLevel: "II", aql: 15 }, "aql", /nonconformities per hundred items/],
      [{ inspectionLevel: "II", aql: "lots" }, "aql", /percentage from the table/],
      [{ inspectionLevel: "IV", aql: "1.0" }, "inspectionLevel", /inspection level is one of S-1, S-2, S-3, S-4, I, II, III/],
      [{ inspectionLevel: "II", aql: "1.0", acceptanceProcedureId: l.draftProcedureId }, "acceptanceProcedureId", /no released version/],
    ];
    for (const [input, field, message] of refusals) {
      const error = await setLotSamplingPlan(l.engineer, lot.id, input).catch((e: unknown) => e);
      expect(error).toBeInstanceOf(ZodError);
      expect((error as ZodError).issues[0]).toMatchObject({ path: [field], message: expect.stringMatching(message) });
    }
    await expect(setLotSamplingPlan(l.operator, lot.id, { inspectionLevel: "II", aql: "1.0" })).rejects.toThrow(/Only a quality engineer/);
    expect(await planColumns(lot.id)).toMatchObject({ inspection_level: null, aql: null, sampling_plan: null, plan_set_at: null });
    expect(await auditActions(lot.id)).toEqual(["lot.create"]);

    // The database keeps the plan's columns together whatever the code does.
    await expect(sql`update lot set aql = '1.0' where id = ${lot.id}`.execute(getDb())).rejects.toMatchObject({ constraint: "lot_plan_complete" });

    // What POST /api/sampling-plan answers: a lot of 0 cells is refused as a 422 naming lotSize.
    const refused = (() => {
      try {
        computeSamplingPlan({ lotSize: 0, inspectionLevel: "II", aql: "1.0" });
      } catch (e) {
        return toErrorResponse(e);
      }
      throw new Error("a lot of 0 must be refused");
    })();
    expect(refused.status).toBe(422);
    expect((await refused.json()).error.fields).toEqual([{ path: "lotSize", message: "The lot size must be a whole number of specimens, at least 1 (got 0)." }]);
    // 100 % inspection when n reaches the lot size: a lot of 5 at II is A, an arrow down at AQL 1.0 to E (n = 13), so all 5 are inspected.
    expect(computeSamplingPlan({ lotSize: 5, inspectionLevel: "II", aql: "1.0" })).toMatchObject({ codeLetter: "E", tableSampleSize: 13, sampleSize: 5, hundredPercent: true });
  });

  it("recomputes the plan when the lot's quantity changes before the draw", async () => {
    const l = await lab();
    const lot = await makeLot(60);
    // Lot 51–90 at II → E; E at AQL 2.5 is an arrow down to F (n = 20, Ac 1, Re 2). Lot 151–280 → G (n = 32, Ac 2, Re 3).
    expect(await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "2.5" })).toMatchObject({ codeLetter: "F", sampleSize: 20 });
    await editLot(
      l.operator,
      lot.id,
      lotInputSchema.parse({ identifier: lot.identifier, cellSpecificationId: l.specId, supplier: "Fernhollow Components", quantityReceived: 200, receivedOn: addDays(today, -5), customer: "" }),
    );
    const after = await getLotSampling(getDb(), lot.id);
    expect(after?.plan).toMatchObject({ lotSize: 200, codeLetter: "G", sampleSize: 32, acceptanceNumber: 2, rejectionNumber: 3 });
    expect((await planColumns(lot.id)).plan_set_by).toBe(l.engineer.id);
    const edit = await getDb().selectFrom("audit_event").select(["detail", "after"]).where("entity_id", "=", lot.id).where("action", "=", "lot.edit").executeTakeFirstOrThrow();
    expect(edit.detail).toEqual({ samplingPlan: "lot of 60: code letter F, n = 20, Ac 1, Re 2 → lot of 200: code letter G, n = 32, Ac 2, Re 3" });
    expect(edit.after).toMatchObject({ customer: null, quantityReceived: 200 });
  });
});

describe("drawing a lot's sample", () => {
  it("draws n positions once, reproducibly from the recorded seed, with its audit event", async () => {
    const l = await lab();
    const lot = await makeLot(60);
    await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "1.0" });
    const drawn = await drawLotSample(l.engineer, lot.id, { method: "random", seed: 20261202 });
    expect(drawn.seed).toBe("20261202");
    expect(drawn.positions).toHaveLength(13);
    expect(new Set(drawn.positions).size).toBe(13);
    expect(drawn.positions.every((p) => Number.isInteger(p) && p >= 1 && p <= 60)).toBe(true);
    // Repeatable by anyone from the seed: drawSample over the zero-padded positions "01"…"60".
    const again = drawSample({ specimenIds: Array.from({ length: 60 }, (_, k) => String(k + 1).padStart(2, "0")), n: 13, seed: 20261202 });
    expect(again.ok && again.draw.drawn.map(Number)).toEqual(drawn.positions);
    // Another lot of the same size and plan, same seed: the same positions.
    const twin = await makeLot(60);
    await setLotSamplingPlan(l.engineer, twin.id, { inspectionLevel: "II", aql: "1.0" });
    expect((await drawLotSample(l.engineer, twin.id, { method: "random", seed: 20261202 })).positions).toEqual(drawn.positions);

    const stored = await getDb().selectFrom("lot_sample_draw").select(["method", "seed", "positions", "drawn_by"]).where("lot_id", "=", lot.id).executeTakeFirstOrThrow();
    expect(stored).toEqual({ method: "random", seed: "20261202", positions: drawn.positions, drawn_by: l.engineer.id });
    expect(await auditActions(lot.id)).toEqual(["lot.create", "lot.set-sampling-plan", "lot.draw-sample"]);
    const sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling?.members.map((m) => m.position)).toEqual(drawn.positions);
    expect(sampling?.members.every((m) => m.result === "not tested" && m.specimenId === null)).toBe(true);
    expect(sampling?.counts).toEqual({ drawn: 13, registered: 0, tested: 0, nonconforming: 0, notDecided: 0 });

    // Drawn once: no second draw, no new plan, no new quantity, and the database refuses a change.
    await expect(drawLotSample(l.engineer, lot.id, { method: "random" })).rejects.toThrow(/already drawn/);
    await expect(setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "III", aql: "1.0" })).rejects.toThrow(/already drawn; its sampling plan stays/);
    await expect(
      editLot(l.operator, lot.id, lotInputSchema.parse({ identifier: lot.identifier, cellSpecificationId: l.specId, supplier: "Fernhollow Components", quantityReceived: 70, receivedOn: addDays(today, -5) })),
    ).rejects.toThrow(/the quantity received cannot change now/);
    await expect(sql`update lot_sample_draw set positions = '{1}' where lot_id = ${lot.id}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await expect(sql`delete from lot_sample_draw where lot_id = ${lot.id}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await withOwnerClient(async (owner) => {
      await expect(owner.query(`update lot_sample_draw set positions = '{1}' where lot_id = $1`, [lot.id])).rejects.toThrow(/never changed or deleted/);
      await expect(owner.query(`delete from lot_sample_draw where lot_id = $1`, [lot.id])).rejects.toThrow(/never changed or deleted/);
    });
    const duplicate = await getDb()
      .insertInto("lot_sample_draw")
      .values({ lot_id: lot.id, method: "chosen", seed: null, positions: [1], drawn_by: l.engineer.id })
      .execute()
      .catch((e: unknown) => e);
    expect(translateConstraintError(duplicate)?.message).toMatch(/already been drawn/);
  });

  it("picks and records its own seed when none is given", async () => {
    const l = await lab();
    const lot = await makeLot(40);
    // Lot 26–50 at S-4 → C; C at AQL 6.5 is an arrow down to D (n = 8, Ac 1, Re 2).
    await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "S-4", aql: "6.5" });
    const drawn = await drawLotSample(l.engineer, lot.id, { method: "random" });
    const seed = Number(drawn.seed);
    expect(Number.isInteger(seed) && seed >= 0 && seed <= 2 ** 32 - 1).toBe(true);
    const again = drawSample({ specimenIds: Array.from({ length: 40 }, (_, k) => String(k + 1).padStart(2, "0")), n: 8, seed });
    expect(again.ok && again.draw.drawn.map(Number)).toEqual(drawn.positions);
  });

  it("refuses a draw without a plan, more cells than the lot holds and bad positions, storing nothing", async () => {
    const l = await lab();
    const lot = await makeLot(10);
    await expect(drawLotSample(l.engineer, lot.id, { method: "random", seed: 1 })).rejects.toThrow(/no sampling plan yet/);
    // Lot 9–15 at II → B; B at AQL 10 is an arrow down to C (n = 5, Ac 1, Re 2).
    await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "10" });
    const attempts: [number[], RegExp][] = [
      [[1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11], /Cannot draw 11 cells from a lot of 10/],
      [[0, 2, 3, 4, 11], /Tray positions 0, 11 are outside the lot: its cells are numbered 1 to 10/],
      [[1, 2, 2, 4, 5], /Tray position 2 is listed twice/],
      [[1, 2, 3, 4], /The plan calls for 5 cells; 4 tray positions were given/],
    ];
    for (const [positions, message] of attempts) {
      await expect(drawLotSample(l.engineer, lot.id, { method: "chosen", positions })).rejects.toThrow(message);
    }
    await expect(drawLotSample(l.operator, lot.id, { method: "random" })).rejects.toThrow(/Only a quality engineer/);
    expect(await drawCount(lot.id)).toBe(0);
    expect(await auditActions(lot.id)).toEqual(["lot.create", "lot.set-sampling-plan"]);

    const chosen = await drawLotSample(l.engineer, lot.id, { method: "chosen", positions: [7, 2, 9, 4, 1] });
    expect(chosen).toEqual({ positions: [7, 2, 9, 4, 1], seed: null });
    expect((await getLotSampling(getDb(), lot.id))?.draw).toMatchObject({ method: "chosen", seed: null, positions: [7, 2, 9, 4, 1], drawnBy: "Eli Engineer" });
  });
});

describe("tray positions of specimens", () => {
  it("refuses a position outside the lot or already registered, and keeps a tested cell where it was", async () => {
    const l = await lab();
    const lot = await makeLot(10);
    const input = (lotPosition: number | null, lotId: string | null = lot.id) =>
      specimenInputSchema.parse({ identifier: `IT-CELL-${next()}`, cellSpecificationId: l.specId, lotId, lotPosition, receivedOn: addDays(today, -5), conditionOnReceipt: "as received" });
    await expect(createSpecimen(l.operator, input(11))).rejects.toThrow(/Tray position 11 is outside lot IT-LOT-\d+: its cells are numbered 1 to 10/);
    await expect(createSpecimen(l.operator, input(3, null))).rejects.toThrow(/A tray position belongs to a lot/);
    expect(() => input(0)).toThrow(/whole number, 1 or more/);
    const first = await createSpecimen(l.operator, input(3));
    await expect(createSpecimen(l.operator, input(3))).rejects.toThrow(/Tray position 3 of lot IT-LOT-\d+ is already registered as specimen IT-CELL-\d+/);
    // The unique index says the same when two registrations race past the check.
    const raced = await getDb()
      .insertInto("specimen")
      .values({ identifier: `IT-CELL-${next()}`, cell_specification_id: l.specId, lot_id: lot.id, lot_position: 3, received_on: addDays(today, -5), condition_on_receipt: "x", created_by: l.operator.id })
      .execute()
      .catch((e: unknown) => e);
    expect(translateConstraintError(raced)?.message).toMatch(/already registered at this tray position/);
    await expect(
      editLot(l.operator, lot.id, lotInputSchema.parse({ identifier: lot.identifier, cellSpecificationId: l.specId, supplier: "Fernhollow Components", quantityReceived: 2, receivedOn: addDays(today, -5) })),
    ).rejects.toThrow(/registered at tray position 3: the quantity received cannot be less/);

    // Moving an untested cell is fine; once it has a run, its position stays.
    const moved = { ...input(4), identifier: (await getDb().selectFrom("specimen").select("identifier").where("id", "=", first).executeTakeFirstOrThrow()).identifier };
    await editSpecimen(l.operator, first, moved);
    expect((await getDb().selectFrom("specimen").select("lot_position").where("id", "=", first).executeTakeFirstOrThrow()).lot_position).toBe(4);
    await startRun(l.operator, { procedureVersionId: l.rated.versionId, specimenId: first, instrumentIds: [l.channel] }, today);
    await expect(editSpecimen(l.operator, first, { ...moved, lotPosition: 5 })).rejects.toThrow(/already has runs as tray position 4 .*cannot change/);
  });
});

describe("lot decisions from reviewed runs", () => {
  it("stays pending while cells are untested and accepts with at most Ac nonconforming, counting only the acceptance procedure", async () => {
    const l = await lab();
    const lot = await makeLot(10);
    // C: n = 5, Ac 1, Re 2 (lot 9–15 at II is B, arrow down at AQL 10).
    await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "10", acceptanceProcedureId: l.rated.procedureId });
    const { positions } = await drawLotSample(l.engineer, lot.id, { method: "random", seed: 61960 });
    const specimens = [];
    for (const position of positions) specimens.push(await registerAt(lot.id, position));
    const [a, b, c, d, e] = specimens as [string, string, string, string, string];

    expect((await testCell(a, l.rated.versionId, good)).conforms).toBe("conforms");
    await testCell(b, l.rated.versionId, good);
    await testCell(c, l.rated.versionId, good);
    let sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling?.decision).toMatchObject({ verdict: "pending", tested: 3, nonconforming: 0, remaining: 2 });

    expect((await testCell(d, l.rated.versionId, weak)).conforms).toBe("does not conform");
    // A run of another procedure does not decide this lot's cells; nor does a run still awaiting review.
    expect((await testCell(e, l.guarded.versionId, good)).conforms).toBe("not decided");
    const awaiting = await testCell(e, l.rated.versionId, good, false);
    sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling?.members[4]).toMatchObject({ position: positions[4], specimenId: e, result: "not tested", runId: null });
    expect(sampling?.decision).toMatchObject({ verdict: "pending", tested: 4, nonconforming: 1, remaining: 1 });

    await acceptRun(awaiting.runId);
    sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling?.members.map((m) => m.result)).toEqual(["conforms", "conforms", "conforms", "does not conform", "conforms"]);
    expect(sampling?.members[4]).toMatchObject({ runId: awaiting.runId, runNumber: awaiting.number });
    expect(sampling?.counts).toEqual({ drawn: 5, registered: 5, tested: 5, nonconforming: 1, notDecided: 0 });
    expect(sampling?.decision).toMatchObject({ verdict: "accept", tested: 5, nonconforming: 1, remaining: 0 });
    expect(sampling?.decision?.statement).toBe("1 nonconforming of 5 tested is within the acceptance number 1: accept.");
  });

  it("rejects as soon as Re cells do not conform, ignoring cells outside the draw and counting 'not decided' apart", async () => {
    const l = await lab();
    const lot = await makeLot(10);
    await setLotSamplingPlan(l.engineer, lot.id, { inspectionLevel: "II", aql: "10" });
    const { positions } = await drawLotSample(l.engineer, lot.id, { method: "chosen", positions: [2, 4, 6, 8, 10] });
    const outside = await registerAt(lot.id, 1);
    await testCell(outside, l.rated.versionId, weak);
    const [p2, p4, p6] = [await registerAt(lot.id, 2), await registerAt(lot.id, 4), await registerAt(lot.id, 6)];

    // Any procedure's reviewed run counts here; a "not decided" statement is not a test result.
    await testCell(p2, l.guarded.versionId, good);
    let sampling = await getLotSampling(getDb(), lot.id);
    expect(sampling?.members[0]).toMatchObject({ position: 2, result: "not decided" });
    expect(sampling?.counts).toEqual({ drawn: 5, registered: 3, tested: 0, nonconforming: 0, notDecided: 1 });
    expect(sampling?.decision?.verdict).toBe("pending");

    await testCell(p4, l.rated.versionId, weak);
    expect((await getLotSampling(getDb(), lot.id))?.decision).toMatchObject({ verdict: "pending", tested: 1, nonconforming: 1 });
    await testCell(p6, l.rated.versionId, weak);
    sampling = await getLotSampling(getDb(), lot.id);
    expect(positions).toEqual([2, 4, 6, 8, 10]);
    expect(sampling?.members.map((m) => m.result)).toEqual(["not decided", "does not conform", "does not conform", "not tested", "not tested"]);
    expect(sampling?.counts).toEqual({ drawn: 5, registered: 3, tested: 2, nonconforming: 2, notDecided: 1 });
    expect(sampling?.decision).toMatchObject({ verdict: "reject", tested: 2, nonconforming: 2, remaining: 0 });
    expect(sampling?.decision?.statement).toBe("2 nonconforming of 2 tested reaches the rejection number 2: reject.");

    // A retest of the undecided cell replaces its earlier result.
    await testCell(p2, l.rated.versionId, good);
    expect((await getLotSampling(getDb(), lot.id))?.members[0]).toMatchObject({ position: 2, result: "conforms" });
  });
});
