import "server-only";
import { listPartsOfLog } from "@/db/run-log-parts";
import { formatPartTime } from "@/lib/runs/log-parts/part-sequence";
import { getDb, type Executor } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import {
  countEvaluationsAfter,
  getEvaluatedLog,
  getLatestRunReview,
  getLotCustomer,
  getRunEvaluationRecord,
  listCertificateInstruments,
} from "@/db/certificates";
import { getLab } from "@/db/lab";
import { getLot } from "@/db/lots";
import { getProcedureVersionById } from "@/db/procedures";
import { describeRunParticipation } from "@/db/run-participants";
import { getRun, listRunInstrumentIds, listStepRecords, type RunView } from "@/db/runs";
import { getSpecimen } from "@/db/specimens";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import type { StepRecord } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";
import { readRunCapacitySeries } from "@/lib/runs/read-run-series";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import type { RecordedInstrument, RunCertificateRecords, StoredEvaluation } from "./build-run-payload";
import { findUnacknowledgedDeviations, readAcknowledgedDeviations } from "./review-coverage";
import type { DischargeCurve } from "./vq-plot";

/** Points drawn per discharge curve: enough for a smooth line at print size, few enough for a small file. */
const CURVE_POINTS = 400;

/** Everything but the number, the issue time and the approval: the records a run certificate rests on. */
export type RunCertificateBasis = Omit<RunCertificateRecords, "number" | "issuedAt" | "approval" | "replaces"> & {
  runView: RunView;
  reviewId: string;
  evaluationId: string;
};

/**
 * The checks before a run certificate may be made, in the order a person would fix them: the run,
 * who asks, its state, its accepted review, that the review covers the latest evaluation and every
 * deviation in it. Each refusal says what to do; nothing is written.
 */
async function checkRunMayBeCertified(db: Executor, actor: SignedInUser, runId: string, expected: "accepted" | "certified") {
  const run = await getRun(db, runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  const tookPart = await describeRunParticipation(db, runId, actor.id);
  if (tookPart) {
    throw new DomainError("forbidden", `You took part in run ${run.number} (you ${tookPart}); its certificate must be signed by an engineer who took no part in it.`);
  }
  if (run.status !== expected) {
    if (expected === "accepted" && run.status === "certified") {
      throw new DomainError("conflict", `Run ${run.number} is already certified. To correct its certificate, amend it; it is never signed twice.`);
    }
    throw new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}: only an accepted run gets a certificate.`);
  }
  const review = await getLatestRunReview(db, runId);
  if (!review || review.decision !== "accepted" || !review.runEvaluationId || !review.signature) {
    throw new DomainError("conflict", `Run ${run.number} has no accepted, signed review: it must be reviewed before a certificate is issued.`);
  }
  const evaluation = await getRunEvaluationRecord(db, review.runEvaluationId);
  if (!evaluation || evaluation.runId !== runId) throw new DomainError("conflict", `The evaluation reviewed for run ${run.number} is missing.`);
  if ((await countEvaluationsAfter(db, runId, evaluation)) > 0) {
    throw new DomainError("conflict", `Run ${run.number} was evaluated again after its review; the newer evaluation must be reviewed before a certificate is issued.`);
  }
  const value = evaluation.evaluation;
  const acknowledged = readAcknowledgedDeviations(review.acknowledgedDeviations);
  const missing = findUnacknowledgedDeviations(value, acknowledged);
  if (missing.length > 0) {
    const list = missing.map((f) => `${f.stepId ?? "run"}: ${f.title}`).join("; ");
    throw new DomainError("conflict", `The review of run ${run.number} does not note ${missing.length === 1 ? "this deviation" : `these ${missing.length} deviations`}: ${list}. Review the run again and note each one.`);
  }
  return { run, review: { ...review, signature: review.signature }, evaluation: { ...evaluation, value }, acknowledged };
}

function listCurveSteps(run: RunView, evaluation: StoredEvaluation): { stepId: string; cycle: number }[] {
  const measured = new Set(run.resolution.steps.filter((s) => s.kind === "discharge" && s.purpose === "measure").map((s) => s.id));
  return evaluation.steps.filter((s) => measured.has(s.stepId) && s.logPhase !== null).map((s) => ({ stepId: s.stepId, cycle: s.cycle }));
}

/** Voltage against delivered charge of each measured discharge, from the stored log; a curve that cannot be read is left out. */
async function readCurves(run: RunView, evaluation: StoredEvaluation): Promise<DischargeCurve[]> {
  const curves: DischargeCurve[] = [];
  for (const step of listCurveSteps(run, evaluation)) {
    try {
      const series = await readRunCapacitySeries(run.id, { ...step, points: CURVE_POINTS });
      curves.push({ stepId: series.stepId, cycle: series.cycle, label: series.label, capacityMAh: series.capacityMAh, voltageV: series.voltageV });
    } catch (error) {
      console.error(`certificate of run ${run.number}: the curve of ${step.stepId}#${step.cycle} could not be read`, error);
    }
  }
  return curves;
}

/** Reads, checks and gathers what a run certificate states; refuses with a DomainError when it may not be made. */
export async function gatherRunCertificateBasis(
  actor: SignedInUser,
  runId: string,
  expected: "accepted" | "certified",
): Promise<{ basis: RunCertificateBasis; curves: DischargeCurve[] }> {
  const db = getDb();
  const { run, review, evaluation, acknowledged } = await checkRunMayBeCertified(db, actor, runId, expected);
  const [lab, specimen, cell, version, instrumentIds, records, log] = await Promise.all([
    getLab(db),
    getSpecimen(db, run.specimen.id),
    getCellSpecification(db, run.specimen.cellSpecificationId),
    getProcedureVersionById(db, run.procedureVersionId),
    listRunInstrumentIds(db, runId),
    listStepRecords(db, runId),
    evaluation.runLogId ? getEvaluatedLog(db, evaluation.runLogId) : Promise.resolve(null),
  ]);
  if (!lab || !lab.name.trim() || !lab.address.trim()) {
    throw new DomainError("conflict", "The laboratory's name and address are not set; an administrator enters them before any certificate is issued.");
  }
  if (!specimen || !cell || !version) throw new DomainError("conflict", `The specimen, cell specification or procedure version of run ${run.number} is missing.`);
  const [lot, customer] = specimen.lot ? await Promise.all([getLot(db, specimen.lot.id), getLotCustomer(db, specimen.lot.id)]) : [null, null];
  const stepRecords: StepRecord[] = records.map((r) => {
    const record: Partial<typeof r> = { ...r };
    delete record.recordedBy;
    delete record.updatedAt;
    return record as StepRecord;
  });
  const thermometers = [...new Set(stepRecords.flatMap((r) => r.ambientReadings.map((a) => a.instrumentId)).filter((id): id is string => Boolean(id)))];
  const registered = await listCertificateInstruments(db, { ids: instrumentIds, identifiers: thermometers });
  const instruments: RecordedInstrument[] = registered.map((i) => ({ ...i, usedFor: instrumentIds.includes(i.id) ? "run" : "ambient readings" }));
  const curves = await readCurves(run, evaluation.value);
  // A log sent in parts is listed part by part: the parts the evaluation read (those received before it).
  const parts =
    log?.inParts && evaluation.runLogId
      ? (await listPartsOfLog(db, evaluation.runLogId))
          .filter((p) => p.receivedAt.getTime() <= new Date(evaluation.evaluatedAt).getTime())
          .map((p) => ({
            fileName: p.fileName,
            sha256: p.sha256,
            sizeBytes: p.sizeBytes,
            samples: p.sampleCount,
            uploadedAt: p.receivedAt,
            part: p.number,
            span: `${formatPartTime(p.firstTimeS, log.timeForm)} to ${formatPartTime(p.lastTimeS, log.timeForm)}`,
          }))
      : [];
  return {
    curves,
    basis: {
      runView: run,
      reviewId: review.id,
      evaluationId: evaluation.id,
      lab: { name: lab.name, address: lab.address, accreditation: lab.accreditation },
      customer,
      run: { number: run.number, procedureSource: run.procedureSource, resolution: run.resolution },
      procedure: { code: version.code, title: version.title, version: version.number },
      specimen: { identifier: specimen.identifier, receivedOn: specimen.receivedOn, conditionOnReceipt: specimen.conditionOnReceipt },
      lot: lot ? { identifier: lot.identifier, supplier: lot.supplier, receivedOn: lot.receivedOn } : null,
      cell: { maker: cell.maker, model: cell.model, designation: cell.designation, data: cell.data },
      instruments,
      stepRecords,
      evaluation: { evaluatedAt: evaluation.evaluatedAt, value: evaluation.value, stored: evaluation.stored },
      logs: parts.length > 0 ? parts : log ? [{ fileName: log.fileName, sha256: log.sha256, sizeBytes: log.sizeBytes, samples: log.samples, uploadedAt: log.uploadedAt }] : [],
      review: { printedName: review.signature.printedName, signedAt: review.signature.signedAt, comments: review.comments, acknowledged },
      meaningWords: SIGNATURE_MEANING_WORDS,
    },
  };
}

/** Re-checks, inside the issuing transaction, that nothing the certificate rests on moved since it was gathered. */
export async function confirmBasisUnchanged(tx: Executor, basis: RunCertificateBasis, expected: "accepted" | "certified"): Promise<void> {
  const run = await getRun(tx, basis.runView.id, { forUpdate: true });
  if (!run || run.status !== expected) {
    throw new DomainError("conflict", `Run ${basis.runView.number} changed while its certificate was being made (it is now ${run ? RUN_STATUS_WORDS[run.status].words : "gone"}). Nothing was issued.`);
  }
  const review = await getLatestRunReview(tx, run.id);
  const evaluation = await getRunEvaluationRecord(tx, basis.evaluationId);
  if (review?.id !== basis.reviewId || !evaluation || (await countEvaluationsAfter(tx, run.id, evaluation)) > 0) {
    throw new DomainError("conflict", `Run ${run.number} was reviewed or evaluated again while its certificate was being made. Nothing was issued.`);
  }
}
