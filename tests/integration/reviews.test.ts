import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { listReviewQueue, listRunSignatures } from "@/db/reviews";
import { listRunReviews } from "@/lib/reviews/run-reviews";
import { getRun, listStepRecords } from "@/db/runs";
import { formatLogCsv, type LogColumns } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { listFindings, parseStoredEvaluation } from "@/lib/conformance";
import { acceptRun } from "@/lib/reviews/accept-run";
import { insertSignature } from "@/lib/signatures/sign-record";
import { returnRun } from "@/lib/reviews/return-run";
import { hashReviewedRecord } from "@/lib/reviews/reviewed-record";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { readSubmitReadiness } from "@/lib/runs/submit-readiness";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, chunksOf, setPassword, releaseRatedCapacityProcedure } from "./fixtures";
import { withOwnerClient } from "../support/test-database";

// The queues page; these tests' few rows all fit on the first.
const FIRST_PAGE = { page: 1, pageSize: 100 };

const TODAY = "2026-12-01";
const PASSWORD = "reviewer's own passphrase";
const withPassword = (user: SignedInUser) => setPassword(user, PASSWORD);

let lab: { reviewer: SignedInUser; second: SignedInUser; operator: SignedInUser; versionId: string; channel: string; specId: string };

beforeAll(async () => {
  const reviewer = await withPassword(await makeUser("engineer", "Rhea Reviewer"));
  const second = await withPassword(await makeUser("engineer", "Sol Second"));
  const operator = await withPassword(await makeUser("operator", "Oda Operator"));
  const specId = await createCellSpecification(reviewer, { maker: "Testmoor Cells", model: "TM-REV", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(reviewer, second, "T-REVIEW");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-REV", serial: "S-1", accuracy: JSON.stringify({}), calibration_certificate: "CAL-1", calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  lab = { reviewer, second, operator, versionId, channel, specId };
});

/**
 * A run carried out, logged, evaluated and submitted by the operator. `hotRest` records the rest at
 * 31 °C, outside the 20 °C ± 5 °C the procedure asks (IEC 61960-3 7.1), so one finding deviates.
 */
async function submittedRun(tag: string, opts: { hotRest?: boolean; evaluate?: boolean } = {}): Promise<{ id: string; number: string; columns: LogColumns }> {
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-REV-${tag}`, cell_specification_id: lab.specId, received_on: "2026-11-20", condition_on_receipt: "intact", created_by: lab.reviewer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(lab.operator, { procedureVersionId: lab.versionId, specimenId: specimen, instrumentIds: [lab.channel] }, TODAY);
  const built = buildRatedCapacityRun({ sampleIntervalS: 10, ...(opts.hotRest && { ambient: (stepId) => (stepId === "rest" ? [31, 31] : [22.5, 22.5]) }) });
  for (const record of built.input.stepRecords) await recordStep(lab.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(lab.operator, run.id, { name: `${tag}.csv`, chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  if (opts.evaluate !== false) {
    await evaluateStoredRun(lab.operator, run.id, { columns: ingested.columns });
    const { evaluation } = await readSubmitReadiness(getDb(), run.id);
    await submitRun(lab.operator, run.id, { confirmedDeviations: evaluation?.deviations });
  } else {
    // submitRun refuses a run without an evaluation; a run submitted before that rule existed still reaches review.
    await getDb().updateTable("run").set({ status: "submitted", submitted_at: new Date() }).where("id", "=", run.id).execute();
  }
  return { id: run.id, number: run.number, columns: ingested.columns };
}

async function latestEvaluation(runId: string) {
  const row = await getDb()
    .selectFrom("run_evaluation")
    .select(["id", "evaluation"])
    .where("run_id", "=", runId)
    .orderBy("evaluated_at", "desc")
    .orderBy("id")
    .executeTakeFirstOrThrow();
  return { id: row.id, evaluation: parseStoredEvaluation(row.evaluation) };
}

/** What a refused decision must leave exactly as it was. */
async function reviewTrace(runId: string) {
  const [run, reviews, signatures, audit, mail] = await Promise.all([
    getRun(getDb(), runId),
    getDb().selectFrom("run_review").select("id").where("run_id", "=", runId).execute(),
    getDb().selectFrom("electronic_signature").select("id").where("entity_id", "=", runId).execute(),
    listAuditEvents(getDb(), { entityType: "run", entityId: runId }),
    getDb().selectFrom("mail_message").select("id").where("entity_id", "=", runId).execute(),
  ]);
  return { status: run?.status, reviews: reviews.length, signatures: signatures.length, audit: audit.length, mail: mail.length };
}

describe("review of submitted runs", () => {
  it("refuses the run's own operator as reviewer, in the service and in the database", async () => {
    const run = await submittedRun("OWN");
    const before = await reviewTrace(run.id);
    // The operator later became an engineer: the role alone would let them review.
    const promoted: SignedInUser = { ...lab.operator, role: "engineer" };
    await expect(returnRun(promoted, run.id, { comments: "looks fine to me" })).rejects.toThrow(/You took part in run R-\d+ \(you started it.*\), so you cannot review it/);
    await expect(acceptRun(promoted, run.id, { password: PASSWORD, acknowledgements: [] })).rejects.toThrow(/You took part in run R-\d+/);
    await expect(returnRun(lab.operator, run.id, { comments: "x" })).rejects.toThrow(/Only an engineer reviews runs/);

    // Straight into the tables, past the service: the triggers refuse it.
    await expect(
      getDb().insertInto("run_review").values({ run_id: run.id, reviewer_id: lab.operator.id, decision: "returned", comments: "self-review" }).execute(),
    ).rejects.toThrow(/the operator of a run cannot review it/);
    await expect(
      getDb()
        .insertInto("electronic_signature")
        .values({ signer_id: lab.operator.id, printed_name: "Oda Operator", meaning: "reviewed", entity_type: "run", entity_id: run.id, record_sha256: "a".repeat(64) })
        .execute(),
    ).rejects.toThrow(/the operator of a run cannot sign for it/);
    expect(await reviewTrace(run.id)).toEqual(before);
    expect(before.status).toBe("submitted");
  });

  it("needs comments to return a run; a return mails the operator, and their corrections and resubmission keep every record", async () => {
    const run = await submittedRun("RET");
    const before = await reviewTrace(run.id);
    await expect(returnRun(lab.reviewer, run.id, { comments: "   " })).rejects.toThrow(/needs comments/);
    expect(await reviewTrace(run.id)).toEqual(before);

    const comments = "The rest step's ambient readings are missing the chamber's identifier.\nAdd it and submit again.";
    expect(await returnRun(lab.reviewer, run.id, { comments })).toEqual({ runNumber: run.number, operatorName: "Oda Operator" });
    expect((await getRun(getDb(), run.id))?.status).toBe("returned");
    const [returned] = await listRunReviews(getDb(), run.id);
    expect(returned).toMatchObject({ decision: "returned", comments, reviewer: { name: "Rhea Reviewer" }, signature: null });
    const audit = await listAuditEvents(getDb(), { action: "run.return", entityId: run.id });
    expect(audit[0]).toMatchObject({ actorLabel: expect.stringContaining("Rhea Reviewer"), before: { status: "submitted" }, after: { status: "returned" } });

    const mail = await getDb().selectFrom("mail_message").select(["kind", "recipients", "subject", "body"]).where("entity_id", "=", run.id).where("kind", "=", "run-returned").execute();
    expect(mail).toHaveLength(1);
    expect(mail[0]).toMatchObject({ kind: "run-returned", recipients: [lab.operator.email], subject: `Run ${run.number} returned to you` });
    expect(mail[0]!.body).toContain("missing the chamber's identifier");
    expect(mail[0]!.body).toContain(`/runs/${run.id}`);

    // A returned run cannot be returned or accepted again until it is submitted again.
    await expect(returnRun(lab.second, run.id, { comments: "again" })).rejects.toThrow(/returned to the operator; only a run submitted for review/);

    // The operator corrects a record and evaluates again: the earlier evaluation and the review stay.
    const stepsBefore = await listStepRecords(getDb(), run.id);
    const rest = stepsBefore.find((r) => r.stepId === "rest")!;
    const stored = await getDb().selectFrom("step_record").select("record").where("run_id", "=", run.id).where("step_id", "=", "rest").executeTakeFirstOrThrow();
    const restRecord = stored.record as typeof rest;
    await recordStep(lab.operator, run.id, { ...restRecord, ambientReadings: rest.ambientReadings.map((a) => ({ ...a, instrumentId: "CC-01" })) });
    await evaluateStoredRun(lab.operator, run.id, { columns: run.columns });
    await submitRun(lab.operator, run.id);
    expect((await getRun(getDb(), run.id))?.status).toBe("submitted");
    const evaluations = await getDb().selectFrom("run_evaluation").select("id").where("run_id", "=", run.id).execute();
    expect(evaluations).toHaveLength(2);
    expect(await listRunReviews(getDb(), run.id)).toHaveLength(1);
    const trail = await listAuditEvents(getDb(), { entityType: "run", entityId: run.id });
    expect(trail.filter((e) => e.action === "run.submit")).toHaveLength(2);
    // The audit trail keeps the record as it was before the correction, beside the corrected one.
    const correction = trail.find((e) => e.action === "run.record-step")!;
    expect(correction.before).toMatchObject({ stepId: "rest", ambientReadings: [{ instrumentId: "TH-07" }, { instrumentId: "TH-07" }] });
    expect(correction.after).toMatchObject({ stepId: "rest", ambientReadings: [{ instrumentId: "CC-01" }, { instrumentId: "CC-01" }] });

    // Reviews are append-only: the app's role may not, and the owner role is refused by the trigger.
    await expect(sql`update run_review set comments = 'softened' where run_id = ${run.id}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await expect(sql`delete from run_review where run_id = ${run.id}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await withOwnerClient(async (owner) => {
      await expect(owner.query(`update run_review set comments = 'softened' where run_id = $1`, [run.id])).rejects.toThrow(/never changed or deleted/);
      await expect(owner.query(`delete from run_review where run_id = $1`, [run.id])).rejects.toThrow(/never changed or deleted/);
    });
  });

  it("refuses to accept without an evaluation, with a deviation left without a note, or on a stale evaluation; nothing is written", async () => {
    const unevaluated = await submittedRun("NOEVAL", { evaluate: false });
    const untouched = await reviewTrace(unevaluated.id);
    await expect(acceptRun(lab.reviewer, unevaluated.id, { password: PASSWORD, acknowledgements: [] })).rejects.toThrow(/has not been evaluated/);
    expect(await reviewTrace(unevaluated.id)).toEqual(untouched);

    const run = await submittedRun("DEV", { hotRest: true });
    const { id: evaluationId, evaluation } = await latestEvaluation(run.id);
    const deviating = listFindings(evaluation).filter((f) => f.outcome === "deviates");
    expect(deviating.map((f) => f.rule)).toContain("ambient-in-range");
    const before = await reviewTrace(run.id);

    await expect(acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: [] })).rejects.toThrow(/still without a note: .*ambient/i);
    const blank = deviating.map((f) => ({ findingId: f.id, note: "  " }));
    await expect(acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: blank })).rejects.toThrow();
    const meeting = listFindings(evaluation).find((f) => f.outcome === "meets")!;
    const stray = [...deviating.map((f) => ({ findingId: f.id, note: "seen" })), { findingId: meeting.id, note: "not a deviation" }];
    await expect(acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: stray })).rejects.toThrow(/does not deviate in the evaluation under review/);
    const notes = deviating.map((f) => ({ findingId: f.id, note: "chamber door left open for 10 min; capacity unaffected" }));
    await expect(acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: notes, evaluationId: "00000000-0000-4000-8000-000000000000" })).rejects.toThrow(
      /evaluated again after you opened it/,
    );
    expect(await reviewTrace(run.id)).toEqual(before);
    expect(evaluationId).toBeTruthy();
  });

  it("refuses a wrong password at signing: audited, nothing signed", async () => {
    const run = await submittedRun("PW");
    const before = await reviewTrace(run.id);
    const refusalsBefore = (await listAuditEvents(getDb(), { action: "signature.refused" })).length;
    await expect(acceptRun(lab.reviewer, run.id, { password: "not my password", acknowledgements: [] })).rejects.toThrow(/password is not right\. Nothing was signed/);
    const refusals = await listAuditEvents(getDb(), { action: "signature.refused" });
    expect(refusals).toHaveLength(refusalsBefore + 1);
    // The refusal is written on the run, so the run's history shows it; nothing else changes.
    expect(refusals[0]).toMatchObject({ actorLabel: expect.stringContaining("Rhea Reviewer"), entityType: "run", entityId: run.id, detail: { reason: "wrong password", what: expect.stringContaining(run.number) } });
    expect(await reviewTrace(run.id)).toEqual({ ...before, audit: before.audit + 1 });
  });

  it("accepts with the reviewer's signature, linked to the evaluation reviewed, once only", async () => {
    const run = await submittedRun("ACC", { hotRest: true });
    const { id: evaluationId, evaluation } = await latestEvaluation(run.id);
    const deviating = listFindings(evaluation).filter((f) => f.outcome === "deviates");
    const notes = deviating.map((f) => ({ findingId: f.id, note: "chamber door left open for 10 min; capacity unaffected" }));

    const queueBefore = (await listReviewQueue(getDb(), lab.operator.id, FIRST_PAGE)).rows;
    expect(queueBefore.find((q) => q.runId === run.id)).toMatchObject({ runNumber: run.number, operatorName: "Oda Operator", operatedByYou: true });
    expect((await listReviewQueue(getDb(), lab.reviewer.id, FIRST_PAGE)).rows.find((q) => q.runId === run.id)?.operatedByYou).toBe(false);

    const accepted = await acceptRun(lab.reviewer, run.id, { password: PASSWORD, acknowledgements: notes, evaluationId });
    expect(accepted.signature).toMatchObject({ printedName: "Rhea Reviewer", meaning: "reviewed" });
    expect((await getRun(getDb(), run.id))?.status).toBe("accepted");
    expect((await listReviewQueue(getDb(), lab.reviewer.id, FIRST_PAGE)).rows.some((q) => q.runId === run.id)).toBe(false);

    const signature = await getDb().selectFrom("electronic_signature").selectAll().where("entity_id", "=", run.id).executeTakeFirstOrThrow();
    expect(signature).toMatchObject({ signer_id: lab.reviewer.id, printed_name: "Rhea Reviewer", meaning: "reviewed", entity_type: "run" });
    // The hash is recomputed here from the stored evaluation: the signature belongs to this run and this evaluation.
    expect(signature.record_sha256).toBe(hashReviewedRecord({ runId: run.id, evaluationId, evaluation }));
    expect(signature.record_sha256).not.toBe(hashReviewedRecord({ runId: lab.channel, evaluationId, evaluation }));

    const reviews = await listRunReviews(getDb(), run.id);
    expect(reviews).toHaveLength(1);
    expect(reviews[0]).toMatchObject({ decision: "accepted", runEvaluationId: evaluationId, signature: { id: signature.id, printedName: "Rhea Reviewer", meaning: "reviewed" } });
    expect(reviews[0]!.acknowledgedDeviations).toEqual(deviating.map((f) => ({ findingId: f.id, note: notes[0]!.note, findingTitle: expect.stringMatching(new RegExp(`: ${f.title}$`)) })));
    expect((await listRunSignatures(getDb(), run.id)).map((s) => s.printedName)).toEqual(["Rhea Reviewer"]);
    const audit = await listAuditEvents(getDb(), { action: "run.accept", entityId: run.id });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ after: { status: "accepted" }, detail: { evaluation: evaluationId, deviationsAcknowledged: deviating.length, recordSha256: signature.record_sha256 } });

    // Signing twice: refused by the service, and by the database if the service is bypassed.
    const after = await reviewTrace(run.id);
    await expect(acceptRun(lab.second, run.id, { password: PASSWORD, acknowledgements: notes })).rejects.toThrow(/is accepted; only a run submitted for review/);
    await expect(returnRun(lab.second, run.id, { comments: "too late" })).rejects.toThrow(/is accepted/);
    await expect(
      getDb()
        .insertInto("electronic_signature")
        .values({ signer_id: lab.second.id, printed_name: "Sol Second", meaning: "reviewed", entity_type: "run", entity_id: run.id, record_sha256: signature.record_sha256 })
        .execute(),
    ).rejects.toMatchObject({ constraint: "electronic_signature_once" });
    await expect(sql`update electronic_signature set printed_name = 'someone else' where id = ${signature.id}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await withOwnerClient((owner) =>
      expect(owner.query(`update electronic_signature set printed_name = 'someone else' where id = $1`, [signature.id])).rejects.toThrow(/never changed or deleted/),
    );
    expect(await reviewTrace(run.id)).toEqual(after);
  });
});

describe("an evaluation racing an acceptance", () => {
  /** Until some statement of this database waits on a row lock (or `ms` pass): then the race is set. */
  async function waitForALockWait(ms = 5000): Promise<boolean> {
    for (const until = Date.now() + ms; Date.now() < until; ) {
      const { rows } = await sql<{ n: number }>`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`.execute(getDb());
      if (rows[0]!.n > 0) return true;
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    return false;
  }

  /**
   * Accepts the run as acceptRun writes it (signature, review, status) in a transaction held open
   * until `commit` resolves, so something else can be tried while the acceptance is in flight.
   */
  function acceptHeldOpen(runId: string, evaluationId: string, commit: Promise<void>): { accepted: Promise<void>; locked: Promise<void> } {
    let markLocked!: () => void;
    const locked = new Promise<void>((resolve) => (markLocked = resolve));
    const accepted = getDb()
      .transaction()
      .execute(async (tx) => {
        await getRun(tx, runId, { forUpdate: true });
        const signature = await insertSignature(tx, { signer: lab.reviewer, meaning: "reviewed", entityType: "run", entityId: runId, recordSha256: "0".repeat(64) });
        await tx.insertInto("run_review").values({ run_id: runId, reviewer_id: lab.reviewer.id, decision: "accepted", run_evaluation_id: evaluationId, acknowledged_deviations: "[]", signature_id: signature.id }).execute();
        await tx.updateTable("run").set({ status: "accepted" }).where("id", "=", runId).execute();
        markLocked();
        await commit;
      });
    return { accepted, locked };
  }

  it("makes the database wait for the acceptance in flight, then refuse the evaluation (from the app's role)", async () => {
    const run = await submittedRun("RACE-DB");
    const signed = await latestEvaluation(run.id);
    const row = await getDb().selectFrom("run_evaluation").selectAll().where("id", "=", signed.id).executeTakeFirstOrThrow();
    let commit!: () => void;
    const { accepted, locked } = acceptHeldOpen(run.id, signed.id, new Promise<void>((resolve) => (commit = resolve)));
    await locked;
    const insert = getDb()
      .insertInto("run_evaluation")
      .values({ run_id: run.id, run_log_id: row.run_log_id, procedure_version_id: row.procedure_version_id, evaluation: JSON.stringify(row.evaluation), procedure_followed: row.procedure_followed, specimen_conforms: row.specimen_conforms })
      .execute()
      .then(
        () => "stored",
        (error: Error) => error.message,
      );
    // Without the share lock of migration 0020 the insert read "submitted" and never waited.
    expect(await waitForALockWait()).toBe(true);
    commit();
    await accepted;
    expect(await insert).toMatch(/has been accepted: .* frozen \(INSERT refused on run_evaluation\)/);
    expect(await getDb().selectFrom("run_evaluation").select("id").where("run_id", "=", run.id).execute()).toEqual([{ id: signed.id }]);
  });

  it("makes evaluateStoredRun wait for the acceptance in flight, then refuse in plain words", async () => {
    const run = await submittedRun("RACE-APP");
    const signed = await latestEvaluation(run.id);
    let commit!: () => void;
    const { accepted, locked } = acceptHeldOpen(run.id, signed.id, new Promise<void>((resolve) => (commit = resolve)));
    await locked;
    // Its first read (outside the transaction) still sees "submitted"; the locked read inside sees the acceptance.
    const evaluating = evaluateStoredRun(lab.operator, run.id, { columns: run.columns }).then(
      () => "evaluated",
      (error: Error) => error.message,
    );
    expect(await waitForALockWait(15_000)).toBe(true);
    commit();
    await accepted;
    expect(await evaluating).toBe(`Run ${run.number} is accepted: the evaluation its reviewer signed for is final and is not evaluated again.`);
    expect(await getDb().selectFrom("run_evaluation").select("id").where("run_id", "=", run.id).execute()).toEqual([{ id: signed.id }]);
  });
});
