import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { listDischargeResults } from "@/lib/lots/results/list-discharge-results";
import { getRun, listStepRecords } from "@/db/runs";
import { formatLogCsv } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { stepRecordSchema } from "@/lib/conformance";
import { returnRun } from "@/lib/reviews/return-run";
import { abandonRun } from "@/lib/runs/abandon-run";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { readSubmitReadiness } from "@/lib/runs/submit-readiness";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { chunksOf, ELAPSED_LOG_MAPPING as MAPPING, makeUser, releaseRatedCapacityProcedure } from "./fixtures";

const TODAY = "2026-12-01";
let lab: { engineer: SignedInUser; operator: SignedInUser; versionId: string; specId: string; channel: string; small: string };

beforeAll(async () => {
  const engineer = await makeUser("engineer", "Eli Engineer");
  const second = await makeUser("engineer", "Sol Second");
  const operator = await makeUser("operator", "Oda Operator");
  const specId = await createCellSpecification(engineer, { maker: "Testmoor Cells", model: "TM-OP", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(engineer, second, "T-OP");
  const channelWith = async (identifier: string, currentRange: number) =>
    (
      await getDb()
        .insertInto("instrument")
        .values({
          kind: "cycler-channel",
          identifier,
          serial: "S-1",
          accuracy: JSON.stringify({ current: { percentOfReading: 0.05, percentOfRange: 0.05, range: currentRange } }),
          calibration_certificate: "CAL-1",
          calibrated_on: "2026-01-10",
          due_on: "2027-01-10",
          created_by: engineer.id,
        })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
  lab = { engineer, operator, versionId, specId, channel: await channelWith("CH-OP", 5), small: await channelWith("CH-TINY", 0.1) };
});

/** A stored step record as recordStep takes it (without the row's own fields). */
function withoutRowFields<T extends { recordedBy: string; updatedAt: Date }>(row: T): Omit<T, "recordedBy" | "updatedAt"> {
  const copy: Partial<T> = { ...row };
  delete copy.recordedBy;
  delete copy.updatedAt;
  return copy as Omit<T, "recordedBy" | "updatedAt">;
}

let specimens = 0;
async function plannedRun() {
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-OP-${++specimens}`, cell_specification_id: lab.specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.engineer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  return { ...(await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: specimen, instrumentIds: [lab.channel] }, TODAY)), specimen };
}

async function tickedRun(opts: { hotRest?: boolean } = {}) {
  const run = await plannedRun();
  const built = buildRatedCapacityRun({ sampleIntervalS: 30, ...(opts.hotRest && { ambient: (id: string) => (id === "rest" ? [31, 31] : [22.5, 22.5]) }) });
  for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  return { run, built, csv: csv.value };
}

describe("planning", () => {
  it("refuses a run whose set-points lie above a chosen cycler channel's range, naming the step and the range", async () => {
    const specimen = (
      await getDb()
        .insertInto("specimen")
        .values({ identifier: "SP-OP-RANGE", cell_specification_id: lab.specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.engineer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
    const before = await getDb().selectFrom("run").select("id").execute();
    await expect(startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: specimen, instrumentIds: [lab.small] }, TODAY)).rejects.toThrow(
      /The run cannot start on these instruments: step \d+ “.+”: its .* current of .* A is above the 0\.1 A current range of cycler channel CH-TINY/,
    );
    expect(await getDb().selectFrom("run").select("id").execute()).toEqual(before);
  });
});

describe("submission", () => {
  it("needs the log stored and evaluated after the last record change, and the deviations confirmed by their count", async () => {
    const { run, csv } = await tickedRun({ hotRest: true });
    await expect(submitRun(lab.operator, run.id)).rejects.toThrow(/No data log is stored yet/);
    const ingested = await ingestLog(lab.operator, run.id, { name: "op.csv", chunks: chunksOf(csv), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);
    await expect(submitRun(lab.operator, run.id)).rejects.toThrow(/has not been evaluated since/);
    await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    const readiness = await readSubmitReadiness(getDb(), run.id);
    expect(readiness.problems).toEqual([]);
    const deviations = readiness.evaluation!.deviations;
    expect(deviations).toBeGreaterThan(0);
    await expect(submitRun(lab.operator, run.id)).rejects.toThrow(new RegExp(`The evaluation found ${deviations} deviation`));
    await expect(submitRun(lab.operator, run.id, { confirmedDeviations: deviations + 1 })).rejects.toThrow(/confirm/);
    expect((await getRun(getDb(), run.id))?.status).toBe("in_progress");

    // A record changed after the evaluation makes it stale again.
    const [first] = await listStepRecords(getDb(), run.id);
    const record = withoutRowFields(first!);
    await recordStep(lab.operator, run.id, { ...record, notes: "late note" });
    await expect(submitRun(lab.operator, run.id, { confirmedDeviations: deviations })).rejects.toThrow(/has not been evaluated since/);
    await evaluateStoredRun(lab.operator, run.id);
    await submitRun(lab.operator, run.id, { confirmedDeviations: deviations });
    expect((await getRun(getDb(), run.id))?.status).toBe("submitted");
    const submitted = await listAuditEvents(getDb(), { action: "run.submit", entityId: run.id });
    expect(submitted[0]?.detail).toMatchObject({ deviations });
  });
});

describe("corrections", () => {
  it("on a returned run, strikes a reading and adds the new one; nothing recorded can be erased or un-struck; a 500 °C reading is refused", async () => {
    const { run, csv } = await tickedRun();
    const ingested = await ingestLog(lab.operator, run.id, { name: "op.csv", chunks: chunksOf(csv), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);
    await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    await submitRun(lab.operator, run.id);
    await returnRun(lab.engineer, run.id, { comments: "The rest reading of 22.5 °C was read off the wrong display." });

    const stored = (await listStepRecords(getDb(), run.id)).find((r) => r.stepId === "rest")!;
    const rest = withoutRowFields(stored);
    const wrong = rest.ambientReadings[0]!;
    const struck = { ...wrong, struck: { reason: "read off the wrong display", at: new Date().toISOString(), by: lab.operator.displayName } };
    const right = { at: wrong.at, celsius: 21.8, backdatedReason: "read off the wrong display" };
    await recordStep(lab.operator, run.id, { ...rest, ambientReadings: [struck, ...rest.ambientReadings.slice(1), right] }, { summary: ["struck 22.5 °C"], reason: "read off the wrong display" });

    const after = stepRecordSchema.parse((await getDb().selectFrom("step_record").select("record").where("run_id", "=", run.id).where("step_id", "=", "rest").executeTakeFirstOrThrow()).record);
    expect(after.ambientReadings[0]).toMatchObject({ celsius: wrong.celsius, struck: { reason: "read off the wrong display" } });
    expect(after.ambientReadings.at(-1)).toMatchObject({ celsius: 21.8 });
    const audit = await listAuditEvents(getDb(), { action: "run.correct-step", entityId: run.id });
    expect(audit[0]?.detail).toMatchObject({ reason: "read off the wrong display", corrected: "struck 22.5 °C" });

    const base = { ...after };
    await expect(recordStep(lab.operator, run.id, { ...base, ambientReadings: base.ambientReadings.slice(1) })).rejects.toThrow(/cannot be removed or un-struck/);
    const unstruck = base.ambientReadings.map((r, i) => (i === 0 ? { at: r.at, celsius: r.celsius } : r));
    await expect(recordStep(lab.operator, run.id, { ...base, ambientReadings: unstruck })).rejects.toThrow(/cannot be removed or un-struck/);
    await expect(recordStep(lab.operator, run.id, { ...base, ambientReadings: [...base.ambientReadings, { at: wrong.at, celsius: 500 }] })).rejects.toThrow(
      /500 °C cannot be an ambient temperature/,
    );

    // The evaluation leaves the struck reading out.
    const evaluation = await evaluateStoredRun(lab.operator, run.id);
    const finding = evaluation.steps.find((s) => s.stepId === "rest")!.findings.find((f) => f.rule === "ambient-in-range")!;
    expect(finding.observed.text).toContain("not counted: 1 struck as an error");
  });
});

describe("abandoning", () => {
  it("keeps the run with a reason, audited, shown as abandoned; final in the database; out of the statistics", async () => {
    const { run } = await tickedRun();
    await expect(abandonRun(lab.operator, run.id, "  ")).rejects.toThrow(/Say why/);
    await abandonRun(lab.operator, run.id, "cell vented during the charge");
    const stored = await getRun(getDb(), run.id);
    expect(stored?.status).toBe("abandoned");
    expect(stored?.abandoned).toMatchObject({ by: lab.operator.displayName, reason: "cell vented during the charge" });
    expect((await listStepRecords(getDb(), run.id)).length).toBeGreaterThan(0);
    const audit = await listAuditEvents(getDb(), { action: "run.abandon", entityId: run.id });
    expect(audit[0]?.detail).toMatchObject({ reason: "cell vented during the charge" });

    await expect(abandonRun(lab.operator, run.id, "again")).rejects.toThrow(/abandoned; only a run not yet submitted/);
    await expect(submitRun(lab.operator, run.id)).rejects.toThrow(/is abandoned/);
    const [first] = await listStepRecords(getDb(), run.id);
    const record = withoutRowFields(first!);
    await expect(recordStep(lab.operator, run.id, { ...record, notes: "after" })).rejects.toThrow(/can no longer change/);
    // The database refuses too, whatever the app does.
    await expect(sql`update run set status = 'in_progress' where id = ${run.id}`.execute(getDb())).rejects.toThrow(/abandoned; it stays so/);
    await expect(sql`update step_record set completed = false where run_id = ${run.id}`.execute(getDb())).rejects.toThrow(/abandoned/);
    await expect(sql`update run set abandon_reason = null where id = ${run.id}`.execute(getDb())).rejects.toThrow();

    const results = await listDischargeResults(getDb(), { cellSpecificationId: lab.specId });
    expect(results.map((r) => r.runId)).not.toContain(run.id);
  });

  it("refuses to abandon a submitted run", async () => {
    const { run, csv } = await tickedRun();
    const ingested = await ingestLog(lab.operator, run.id, { name: "op.csv", chunks: chunksOf(csv), mapping: MAPPING });
    if (!ingested.ok) throw new Error(ingested.error.message);
    await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    await submitRun(lab.operator, run.id);
    await expect(abandonRun(lab.operator, run.id, "changed my mind")).rejects.toThrow(/submitted for review; only a run not yet submitted/);
    await expect(sql`update run set status = 'abandoned', abandoned_at = now(), abandoned_by = ${lab.operator.id}, abandon_reason = 'x' where id = ${run.id}`.execute(getDb())).rejects.toThrow(
      /only an open run can be abandoned/,
    );
  });
});
