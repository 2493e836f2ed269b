import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { getRun } from "@/db/runs";
import { formatLogCsv } from "@/lib/analysis";
import { parseStoredEvaluation } from "@/lib/conformance";
import { releaseVersion, submitForReview } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { readRunCapacitySeries, readRunTimeSeries } from "@/lib/runs/read-run-series";
import { saveDraft, startNewDraft } from "@/lib/procedures/lifecycle";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification, editCellSpecification } from "@/lib/specs/cell-specifications";
import { listObjectKeys } from "@/lib/storage";
import { ratedCapacityAt20cTemplate } from "@/protocols";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, chunksOf, releaseRatedCapacityProcedure } from "./fixtures";

const TODAY = "2026-12-01";
async function setUpLab(tag: string) {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: `TM-${tag}`, data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, `T-RUN-${tag}`);
  const instrument = async (identifier: string, dueOn: string, accuracy: object = {}) =>
    (
      await getDb()
        .insertInto("instrument")
        .values({ kind: "cycler-channel", identifier, serial: "S-1", accuracy: JSON.stringify(accuracy), calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: dueOn, created_by: engineer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
  const channel = await instrument(`CH-${tag}`, "2027-01-10");
  const overdue = await instrument(`CH-OLD-${tag}`, "2026-11-01");
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-${tag}`, cell_specification_id: specId, received_on: "2026-11-20", condition_on_receipt: "intact, 3.4 V", created_by: engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  // docs/references.md §6 Example B: ±(0.05 % of reading + 0.05 % of the 5 A range), time base 100 ppm.
  const exampleB = await instrument(`CH-B-${tag}`, "2027-01-10", {
    current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
    voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
    time: { ppm: 100 },
  });
  return { engineer, operator, specId, versionId, channel, overdue, exampleB, specimen };
}

describe("runs", () => {
  it("plans a run only from a released version on calibrated instruments, and freezes its set-points", async () => {
    const lab = await setUpLab("A");
    await expect(startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.overdue] }, TODAY)).rejects.toThrow(
      /overdue for calibration/,
    );
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.channel] }, TODAY);
    const stored = await getRun(getDb(), run.id);
    const discharge = stored?.resolution.steps.find((s) => s.id === "discharge");
    // 0.2 It of the invented 3 000 mAh cell (IEC 61434): 0.6 A, frozen into the run.
    expect(discharge?.kind === "discharge" && discharge.current?.value).toBe(0.6);

    await editCellSpecification(lab.engineer, lab.specId, { maker: "Testmoor Cells", model: "TM-A", data: { ...inventedCell, ratedCapacityMah: 3500 } });
    const after = await getRun(getDb(), run.id);
    expect(after?.resolution).toEqual(stored?.resolution);
    await expect(sql`update run set resolution = '{}'::jsonb where id = ${run.id}`.execute(getDb())).rejects.toThrow(/frozen/);
  });

  it("records steps, refuses a bad log without storing anything, ingests a good one, evaluates and submits", async () => {
    const lab = await setUpLab("B");
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.channel] }, TODAY);
    const built = buildRatedCapacityRun({ sampleIntervalS: 10 });
    for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
    expect((await getRun(getDb(), run.id))?.status).toBe("in_progress");

    const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
    if (!csv.ok) throw new Error(csv.error.message);
    const lines = csv.value.split("\n");
    const backwards = [lines[0], lines[1], lines[3], lines[2], ...lines.slice(4)].join("\n");
    const refused = await ingestLog(lab.operator, run.id, { name: "bad.csv", chunks: chunksOf(backwards), mapping: MAPPING });
    expect(refused.ok).toBe(false);
    if (!refused.ok) {
      expect(refused.error.line).toBe(4);
      expect(refused.error.message).toMatch(/line 4/i);
    }
    expect(await getDb().selectFrom("run_log").select("id").where("run_id", "=", run.id).execute()).toEqual([]);
    expect(await listObjectKeys(`logs/${run.id}/`)).toEqual([]);

    const ingested = await ingestLog(lab.operator, run.id, { name: "channel-3.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
    expect(ingested.ok).toBe(true);
    if (!ingested.ok) return;
    expect(ingested.rows).toBe(built.log.columns.length);
    expect(await listObjectKeys(`logs/${run.id}/`)).toHaveLength(1);

    const first = await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    expect(first.verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "conforms" });
    // Re-evaluating from what is stored (the log read back from its chunks) gives the same answer.
    const again = await evaluateStoredRun(lab.operator, run.id);
    expect(again.verdict).toEqual(first.verdict);
    const capacity = (e: typeof first) => e.steps.find((s) => s.stepId === "discharge")?.results?.capacityAh;
    expect(capacity(again)).toBeCloseTo(capacity(first)!, 9);

    await submitRun(lab.operator, run.id);
    expect((await getRun(getDb(), run.id))?.status).toBe("submitted");
    await expect(recordStep(lab.operator, run.id, built.input.stepRecords[0]!)).rejects.toThrow(/can no longer change/);
    const actions = (await listAuditEvents(getDb(), { entityType: "run", entityId: run.id })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["run.plan", "run.record-step", "run.upload-log", "run.evaluate", "run.submit"]));
  });

  it("reads an uploaded log even before any step is recorded, and says the steps are not recorded rather than that no log exists", async () => {
    const lab = await setUpLab("N");
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.channel] }, TODAY);
    const built = buildRatedCapacityRun({ sampleIntervalS: 10 });
    const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
    if (!csv.ok) throw new Error(csv.error.message);
    const ingested = await ingestLog(lab.operator, run.id, { name: "early.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);
    const evaluation = await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    expect(evaluation.log.status).not.toBe("no log");
    const discharge = evaluation.steps.find((s) => s.stepId === "discharge");
    expect(discharge?.results?.capacityAh).toBeGreaterThan(0);
    expect(evaluation.steps.flatMap((s) => s.findings).filter((f) => f.rule === "step-recorded").every((f) => f.outcome === "deviates")).toBe(true);
    expect(JSON.stringify(evaluation)).not.toContain("no data log was uploaded");
  });

  it("needs a reason to change a recorded time, and keeps it in the audit trail", async () => {
    const lab = await setUpLab("C");
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.channel] }, TODAY);
    const base = { stepId: "rest", cycle: 1, startedAt: "2026-12-01T10:00:00.000Z", endedAt: "2026-12-01T11:30:00.000Z", completed: true };
    await recordStep(lab.operator, run.id, base);
    await expect(recordStep(lab.operator, run.id, { ...base, endedAt: "2026-12-01T11:40:00.000Z" })).rejects.toThrow(/needs a reason/);
    await recordStep(lab.operator, run.id, { ...base, endedAt: "2026-12-01T11:40:00.000Z", timeChangeReason: "clock on the bench PC was 10 min behind" });
    const changed = await listAuditEvents(getDb(), { action: "run.change-step-times", entityId: run.id });
    expect(changed[0]?.detail).toMatchObject({ reason: "clock on the bench PC was 10 min behind" });
  });

  it("serves thinned series from the stored chunks and judges the records against a newer version, marked as such", async () => {
    const lab = await setUpLab("D");
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.channel] }, TODAY);
    const built = buildRatedCapacityRun({ sampleIntervalS: 2 });
    for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
    const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
    if (!csv.ok) throw new Error(csv.error.message);
    const ingested = await ingestLog(lab.operator, run.id, { name: "d.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);
    const n = built.log.columns.length;
    // The plot's step bands come from the run's latest evaluation.
    const own = await evaluateStoredRun(lab.operator, run.id);
    expect(own.evaluatedAgainst.otherThanRunVersion).toBe(false);

    const series = await readRunTimeSeries(run.id, 500);
    expect(series.sampleCount).toBe(n);
    expect(series.timeS.length).toBeLessThanOrEqual(500);
    // The CSV carries times to the millisecond.
    expect(series.timeS[0]).toBeCloseTo(built.log.columns.timeS[0]!, 2);
    expect(series.timeS.at(-1)).toBeCloseTo(built.log.columns.timeS[n - 1]!, 2);
    expect(series.steps.length).toBeGreaterThan(0);
    const capacity = await readRunCapacitySeries(run.id, { stepId: "discharge", cycle: 1, points: 300 });
    // The curve ends at the step's delivered capacity (trapezoid over every sample), in mAh.
    const delivered = own.steps.find((s) => s.stepId === "discharge")?.results?.capacityAh ?? 0;
    expect(capacity.capacityMAh.at(-1)! / 1000).toBeCloseTo(delivered, 3);

    // Version 2 asks for a rest of at least 3 h; the run rested 2 h under version 1.
    const { versionId: v2 } = await startNewDraft(lab.engineer, lab.versionId);
    const draft = procedureDraftSchema.parse({ definition: structuredClone(ratedCapacityAt20cTemplate) });
    draft.definition.header.code = "T-RUN-D";
    const rest = draft.definition.steps.find((s) => s.id === "rest");
    if (rest?.kind !== "rest") throw new Error("template changed: no rest step");
    rest.minDuration = { value: 3, unit: "h" };
    await saveDraft(lab.engineer, v2, draft);
    await submitForReview(lab.engineer, v2);
    await releaseVersion(await makeUser("engineer", "Sol Second"), v2);

    const newer = await evaluateStoredRun(lab.operator, run.id, { againstVersionId: v2 });
    expect(newer.evaluatedAgainst).toMatchObject({ procedureVersionId: v2, runProcedureVersionId: lab.versionId, otherThanRunVersion: true });
    const restFindings = newer.steps.find((s) => s.stepId === "rest")?.findings ?? [];
    expect(restFindings.some((f) => f.outcome === "deviates")).toBe(true);
    const row = await getDb().selectFrom("run_evaluation").select("procedure_version_id").where("run_id", "=", run.id).orderBy("evaluated_at", "desc").executeTakeFirstOrThrow();
    expect(row.procedure_version_id).toBe(v2);
  });

  it("budgets the discharge capacity from the register's accuracy of the run's cycler channel (docs/references.md §6 Example B)", async () => {
    const lab = await setUpLab("E");
    const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: lab.specimen, instrumentIds: [lab.exampleB] }, TODAY);
    const built = buildRatedCapacityRun({ sampleIntervalS: 10 });
    for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
    const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
    if (!csv.ok) throw new Error(csv.error.message);
    const ingested = await ingestLog(lab.operator, run.id, { name: "e.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);

    const evaluation = await evaluateStoredRun(lab.operator, run.id);
    const results = evaluation.steps.find((s) => s.stepId === "discharge")?.results;
    const entry = evaluation.uncertainty.find((u) => u.stepId === "discharge" && u.cycle === 1 && u.quantity === "capacity");
    if (!results || !entry) throw new Error("the discharge has no results or no capacity budget");
    const { budget } = entry;
    // The reading is the step's mean current Ī = Q / t, 0.2 It = 0.6 A of the invented 3 000 mAh cell.
    const meanA = (results.capacityAh * 3600) / results.durationS;
    expect(meanA).toBeCloseTo(0.6, 3);
    // Example B arithmetic at this reading: a(I) = 0.05 % of Ī + 0.05 % of 5 A, u = a/√3 (GUM 4.3.7);
    // u_r(t) = 100 ppm/√3; u_r(Q)² = u_r(I)² + u_r(t)² (GUM 5.1.6); U = 2·u_r(Q) (GUM 6.2.1).
    const urI = (0.0005 * meanA + 0.0025) / Math.sqrt(3) / meanA;
    const urT = 1e-4 / Math.sqrt(3);
    // Current and time, then the end-voltage term (issue 12, 2); the log written with 10 s times and few decimals adds resolution lines.
    expect(budget.rows.slice(0, 2).map((row) => row.source)).toEqual([`CH-B-E current accuracy`, `CH-B-E time accuracy`]);
    expect(budget.rows[2]!.quantity).toBe("end voltage");
    expect(budget.rows[0]!.relativeStandardUncertainty).toBeCloseTo(urI, 12);
    expect(budget.rows[1]!.relativeStandardUncertainty).toBeCloseTo(urT, 12);
    // …which at 0.6 A is the published U = 0.539 % (docs/references.md §6 Example B) for current and time alone;
    // the further terms add in quadrature.
    expect(Math.abs(2 * Math.hypot(urI, urT) * 100 - 0.539)).toBeLessThanOrEqual(0.0005);
    expect(budget.relativeExpandedUncertainty).toBeCloseTo(2 * Math.hypot(...budget.rows.map((row) => row.relativeContribution)), 12);
    expect(budget.relativeExpandedUncertainty).toBeGreaterThanOrEqual(2 * Math.hypot(urI, urT));
    expect(budget.expandedUncertainty).toBeCloseTo(budget.relativeExpandedUncertainty * results.capacityAh, 12);
    expect(evaluation.acceptance[0]).toMatchObject({ rule: "simple acceptance", uncertainty: { evaluated: true, quantity: "capacity" } });

    // Kept with the stored evaluation, as the results page and the certificate read it.
    const stored = await getDb().selectFrom("run_evaluation").select("evaluation").where("run_id", "=", run.id).executeTakeFirstOrThrow();
    expect(parseStoredEvaluation(stored.evaluation).uncertainty).toHaveLength(evaluation.uncertainty.length);
  });
});
