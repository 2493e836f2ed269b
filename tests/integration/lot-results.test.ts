import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listDischargeResults } from "@/lib/lots/results/list-discharge-results";
import { formatLogCsv } from "@/lib/analysis";
import { hashPassword } from "@/lib/auth/password";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { parseStoredEvaluation } from "@/lib/conformance";
import { classifyDischarge } from "@/lib/lots/results/capacity-discharge";
import { EXPORT_COLUMNS, formatResultsCsv, listExportedResults } from "@/lib/lots/results/export-results";
import { readLotResults } from "@/lib/lots/results/read-results";
import { acceptRun } from "@/lib/reviews/accept-run";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { describeResults } from "@/lib/statistics";
import { chargeRetentionTemplate, dischargeAtMinus20cTemplate } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, resolveOrThrow } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, releaseRatedCapacityProcedure } from "./fixtures";
import { forgeAsOwner } from "../support/test-database";

const TODAY = "2026-12-01";
const PASSWORD = "lot reviewer's passphrase";
async function* chunksOf(text: string, size = 256 * 1024) {
  const bytes = new TextEncoder().encode(text);
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

let lab: { reviewer: SignedInUser; operator: SignedInUser; versionId: string; channel: string; specId: string };

async function makeLot(identifier: string): Promise<string> {
  const r = await getDb()
    .insertInto("lot")
    .values({ identifier, cell_specification_id: lab.specId, supplier: "Fernhollow Supply", quantity_received: 20, received_on: "2026-11-10", created_by: lab.reviewer.id })
    .returning("id")
    .executeTakeFirstOrThrow();
  return r.id;
}

/** A rated-capacity run of one specimen of the lot, carried out and submitted; accepted by the reviewer unless `accept` is false. */
async function reviewedRun(lotId: string, tag: string, capacityMAh: number, opts: { accept?: boolean } = {}): Promise<{ runId: string; specimenId: string }> {
  const specimenId = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-LOT-${tag}`, cell_specification_id: lab.specId, lot_id: lotId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId, instrumentIds: [lab.channel] }, TODAY);
  const built = buildRatedCapacityRun({ sampleIntervalS: 20, cellModel: { capacityMAh } });
  for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(lab.operator, run.id, { name: `${tag}.csv`, chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
  await submitRun(lab.operator, run.id);
  if (opts.accept !== false) await acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: [] });
  return { runId: run.id, specimenId };
}

let lots: { three: string; one: string };
let runs: { accepted: { runId: string; specimenId: string }[]; submitted: { runId: string } };

beforeAll(async () => {
  const reviewer = await makeUser("engineer", "Lena Lotreview");
  await getDb().updateTable("app_user").set({ password_hash: await hashPassword(PASSWORD) }).where("id", "=", reviewer.id).execute();
  const second = await makeUser("engineer", "Sam Second");
  const operator = await makeUser("operator", "Omar Operator");
  const specId = await createCellSpecification(reviewer, { maker: "Testmoor Cells", model: "TM-LOT", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(reviewer, second, "T-LOTRES");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-LOT", serial: "S-LOT", accuracy: JSON.stringify({}), calibration_certificate: "CAL-LOT", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  lab = { reviewer, operator, versionId, channel, specId };
  lots = { three: await makeLot("L-THREE"), one: await makeLot("L-ONE") };
  runs = {
    accepted: [await reviewedRun(lots.three, "A", 2980), await reviewedRun(lots.three, "B", 3020), await reviewedRun(lots.three, "C", 3060)],
    submitted: await reviewedRun(lots.three, "D", 3100, { accept: false }),
  };
  await reviewedRun(lots.one, "E", 3000);
}, 120_000);

describe("discharge results of reviewed runs", () => {
  it("lists only the capacity discharges of accepted runs, from the evaluation the reviewer signed for", async () => {
    const rows = await listDischargeResults(getDb(), { lotId: lots.three });
    expect(rows.map((r) => r.runId).sort()).toEqual(runs.accepted.map((r) => r.runId).sort());
    expect(rows.some((r) => r.runId === runs.submitted.runId)).toBe(false);
    // One result per run: the measured discharge at 0.2 It (0.6 A for 3 000 mAh), never the precondition.
    expect(rows.map((r) => r.stepId)).toEqual(["discharge", "discharge", "discharge"]);
    for (const r of rows) {
      expect(r.runStatus).toBe("accepted");
      expect(r.currentA).toBeCloseTo(0.6, 2);
      expect(r.meanVoltageV).toBeCloseTo(r.energyWh / r.capacityAh, 9);
      expect(r.beyondRating).toBe(false);
      const review = await getDb().selectFrom("run_review").select("run_evaluation_id").where("run_id", "=", r.runId).where("decision", "=", "accepted").executeTakeFirstOrThrow();
      expect(r.evaluationId).toBe(review.run_evaluation_id);
    }
    // Larger cells deliver more: the three results keep the order of their cells.
    const bySpecimen = runs.accepted.map((a) => rows.find((r) => r.specimenId === a.specimenId)!.capacityAh);
    expect(bySpecimen[0]).toBeLessThan(bySpecimen[1]!);
    expect(bySpecimen[1]).toBeLessThan(bySpecimen[2]!);
  });

  it("keeps the signed-for figures when a later evaluation of the run says otherwise", async () => {
    const { runId } = runs.accepted[0]!;
    const [before] = await listDischargeResults(getDb(), { specimenId: runs.accepted[0]!.specimenId });
    const signed = await getDb().selectFrom("run_evaluation").selectAll().where("id", "=", before!.evaluationId).executeTakeFirstOrThrow();
    const altered = parseStoredEvaluation(structuredClone(signed.evaluation));
    for (const step of altered.steps) if (step.results) step.results.capacityAh = 9.999;
    const values = { run_id: runId, run_log_id: signed.run_log_id, procedure_version_id: signed.procedure_version_id, evaluation: JSON.stringify(altered), procedure_followed: signed.procedure_followed, specimen_conforms: signed.specimen_conforms };
    // The database refuses a later evaluation of an accepted run; forged past its trigger, the results still keep the signed-for one.
    await expect(getDb().insertInto("run_evaluation").values(values).execute()).rejects.toThrow(/frozen/);
    await forgeAsOwner(
      "run_evaluation",
      "run_evaluation_frozen_with_run",
      "insert into run_evaluation (run_id, run_log_id, procedure_version_id, evaluation, procedure_followed, specimen_conforms) values ($1, $2, $3, $4, $5, $6)",
      Object.values(values),
    );
    const [after] = await listDischargeResults(getDb(), { specimenId: runs.accepted[0]!.specimenId });
    expect(after).toEqual(before);
  });

  it("leaves out discharges that answer another question: a precondition, a cold discharge, one after storage", () => {
    const rated = resolveOrThrow({});
    expect(classifyDischarge(rated.steps, "discharge")).toEqual({ counts: true });
    expect(classifyDischarge(rated.steps, "precondition")).toMatchObject({ counts: false, reason: expect.stringMatching(/precondition/) });
    const cold = resolveOrThrow({ procedure: dischargeAtMinus20cTemplate });
    expect(classifyDischarge(cold.steps, "discharge")).toMatchObject({ counts: false, reason: expect.stringMatching(/not at the 20 °C test ambient/) });
    const retention = resolveOrThrow({ procedure: chargeRetentionTemplate });
    expect(classifyDischarge(retention.steps, "discharge")).toMatchObject({ counts: false, reason: expect.stringMatching(/storage/) });
  });
});

describe("lot statistics, export and refusals", () => {
  it("gives the statistics at 0.2 It of describeResults on the same numbers", async () => {
    const { statistics, results } = await readLotResults(lots.three);
    expect(statistics.resultCount).toBe(3);
    expect(statistics.currents).toHaveLength(1);
    const group = statistics.currents[0]!;
    expect(group.isReferenceCurrent).toBe(true);
    expect(group.multipleOfIt).toBeCloseTo(0.2, 3);
    const expected = describeResults({ values: results.map((r) => r.capacityAh * 1000), unit: "mAh", rated: 3000, minimum: 2900 });
    expect(group.capacity).toEqual(expected);
    const energy = describeResults({ values: results.map((r) => r.energyWh), unit: "Wh", rated: 10.8 });
    expect(group.energy).toEqual(energy);
    expect(group.capacityHistogram.ok && group.capacityHistogram.value.bins.reduce((n, b) => n + b.count, 0)).toBe(3);
  });

  it("says plainly that one result is too few, and stores nothing", async () => {
    const count = async () =>
      Promise.all((["audit_event", "run_evaluation", "run_review", "lot", "mail_message"] as const).map(async (t) => Number((await getDb().selectFrom(t).select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow()).n)));
    const before = await count();
    const { statistics } = await readLotResults(lots.one);
    expect(statistics.resultCount).toBe(1);
    const group = statistics.currents[0]!;
    expect(group.capacity.ok).toBe(false);
    expect(!group.capacity.ok && group.capacity.error.message).toBe("Statistics need at least two results; this group has only one.");
    expect(await count()).toEqual(before);
  });

  it("writes a CSV with the header and one line per discharge result", async () => {
    const { results, specification } = await readLotResults(lots.three);
    const csv = formatResultsCsv(listExportedResults(results, specification.data));
    const parsed = Papa.parse<string[]>(csv.trim());
    expect(parsed.errors).toEqual([]);
    const [header, ...lines] = parsed.data;
    expect(header).toEqual(EXPORT_COLUMNS.map((c) => c.heading));
    expect(lines).toHaveLength(results.length);
    const column = (name: string) => header!.indexOf(name);
    for (const [k, r] of results.entries()) {
      expect(lines[k]![column("run")]).toBe(r.runNumber);
      expect(Number(lines[k]![column("capacity (mAh)")])).toBeCloseTo(r.capacityAh * 1000, 1);
      expect(Number(lines[k]![column("current (× It)")])).toBeCloseTo(0.2, 3);
      expect(lines[k]![column("above the rating")]).toBe("no");
      expect(lines[k]![column("reviewed status")]).toBe("accepted");
    }
  });
});
