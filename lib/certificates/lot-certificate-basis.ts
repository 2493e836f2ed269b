import "server-only";
import { getDb, type Executor } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { findValidLotCertificate, findValidRunCertificate, getLatestRunReview, getLotCustomer, getRunEvaluationRecord } from "@/db/certificates";
import { listDischargeResults } from "@/lib/lots/results/list-discharge-results";
import { getLab } from "@/db/lab";
import { getLotSampling, type LotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import { getLot, lockLot } from "@/db/lots";
import { listRunsTakenPartIn } from "@/db/run-participants";
import { getRun, listStepRecords } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { formatNumber } from "@/protocols/format-number";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import type { LotCertificateRecords, LotSampledRun } from "./build-lot-payload";
import { findDatesOfTesting, findTestingSpan, readDecisionRule } from "./build-run-payload";
import { hashCanonicalJson } from "./canonical-json";

/** Everything a lot certificate rests on but the number, the issue time, the approval and what it replaces. */
export interface LotCertificateBasis {
  lotId: string;
  lotIdentifier: string;
  records: Omit<LotCertificateRecords, "number" | "issuedAt" | "approval" | "replaces">;
  /** SHA-256 of the plan, the draw, each drawn cell's counted run and result, and the decision: re-checked in the issuing transaction. */
  fingerprint: string;
}

function fingerprintOf(sampling: LotSampling): string {
  return hashCanonicalJson({
    plan: sampling.plan,
    draw: sampling.draw && { method: sampling.draw.method, seed: sampling.draw.seed, positions: sampling.draw.positions },
    members: sampling.members.map((m) => [m.position, m.specimenId, m.runId, m.result]),
    verdict: sampling.decision?.verdict ?? null,
  });
}

/** The numbers of the runs counted in a lot's sample that this person operated. */
export async function findSampledRunsOperatedBy(db: Executor, lotId: string, userId: string): Promise<string[]> {
  const sampling = await getLotSampling(db, lotId);
  const runIds = sampling?.members.flatMap((m) => (m.runId ? [m.runId] : [])) ?? [];
  const runs = await Promise.all(runIds.map((id) => getRun(db, id)));
  const tookPart = await listRunsTakenPartIn(db, runIds, userId);
  return runs.filter((r) => r && tookPart.has(r.id)).map((r) => r!.number);
}

/**
 * The checks before a lot certificate may be made, in the order a person would fix them: the lot, its
 * plan, its draw, a decision (accept or reject), no valid lot certificate yet (or exactly the one being
 * amended), and a signer who operated none of the runs counted in the sample. Each refusal says what to
 * do; nothing is written.
 */
async function checkLotMayBeCertified(db: Executor, actor: SignedInUser, lotId: string, replacing: string | null) {
  const lot = await getLot(db, lotId);
  const sampling = lot ? await getLotSampling(db, lotId) : null;
  if (!lot || !sampling) throw new DomainError("not-found", "No such lot.");
  const { plan, draw, decision } = sampling;
  if (!plan || !decision) throw new DomainError("conflict", `Lot ${lot.identifier} has no sampling plan: a quality engineer sets one, draws the sample, and the sample is tested before the lot is certified.`);
  if (!draw) throw new DomainError("conflict", `The sample of lot ${lot.identifier} is not drawn yet: draw the ${formatNumber(plan.sampleSize)} cells and test them before the lot is certified.`);
  if (decision.verdict === "pending") {
    throw new DomainError("conflict", `The decision on lot ${lot.identifier} is pending (${decision.statement}) A lot certificate is issued once the lot is accepted or rejected.`);
  }
  const existing = await findValidLotCertificate(db, lotId);
  if (existing !== replacing) {
    throw new DomainError(
      "conflict",
      existing
        ? `Lot ${lot.identifier} already has certificate ${existing}. To correct it, amend it; a lot is never certified twice.`
        : `Lot ${lot.identifier} has no valid certificate to amend.`,
    );
  }
  const runIds = sampling.members.flatMap((m) => (m.runId ? [m.runId] : []));
  const runs = await Promise.all(runIds.map((id) => getRun(db, id)));
  const tookPart = await listRunsTakenPartIn(db, runIds, actor.id);
  const operated = runs.filter((r) => r && tookPart.has(r.id)).map((r) => r!.number);
  if (operated.length > 0) {
    throw new DomainError(
      "forbidden",
      `You took part in ${operated.length === 1 ? "run" : "runs"} ${operated.join(", ")}, counted in the sample of lot ${lot.identifier}; its certificate must be signed by an engineer who operated none of the sampled runs.`,
    );
  }
  return { lot, sampling: { ...sampling, plan, draw, decision }, runs: runs.filter((r) => r !== null) };
}

const spanOnly = ({ from, to }: { from: string | null; to: string | null }) => ({ from, to });

/** What each sampled run adds: its procedure, its certificate, the decision rule it was judged by and when it was tested. */
async function describeSampledRun(db: Executor, run: NonNullable<Awaited<ReturnType<typeof getRun>>>): Promise<LotSampledRun> {
  const [review, certificate, records] = await Promise.all([getLatestRunReview(db, run.id), findValidRunCertificate(db, run.id), listStepRecords(db, run.id)]);
  const evaluation = review?.runEvaluationId ? await getRunEvaluationRecord(db, review.runEvaluationId) : null;
  return {
    runId: run.id,
    runNumber: run.number,
    certificate,
    procedure: { code: run.procedure.code, title: run.procedure.title, version: run.procedure.number, standard: run.procedureSource.standard, clause: run.procedureSource.clause },
    decisionRule: evaluation ? readDecisionRule(evaluation.evaluation) : "simple acceptance",
    // The data log's own span when the evaluation knows it (issue 12, 7a), else the step sheet's.
    testing: evaluation ? spanOnly(findDatesOfTesting(evaluation.evaluation, records)) : findTestingSpan(records),
  };
}

/** Reads, checks and gathers what a lot certificate states; refuses with a DomainError when it may not be made. */
export async function gatherLotCertificateBasis(actor: SignedInUser, lotId: string, options: { replacing: string | null } = { replacing: null }): Promise<LotCertificateBasis> {
  const db = getDb();
  const { lot, sampling, runs } = await checkLotMayBeCertified(db, actor, lotId, options.replacing);
  const [lab, cell, customer, sampledRuns] = await Promise.all([
    getLab(db),
    getCellSpecification(db, lot.specification.id),
    getLotCustomer(db, lotId),
    Promise.all(runs.map((r) => describeSampledRun(db, r))),
  ]);
  if (!lab || !lab.name.trim() || !lab.address.trim()) {
    throw new DomainError("conflict", "The laboratory's name and address are not set; an administrator enters them before any certificate is issued.");
  }
  if (!cell) throw new DomainError("conflict", `The cell specification of lot ${lot.identifier} is missing.`);
  const results = runs.length === 0 ? [] : await listDischargeResults(db, { runNumbers: runs.map((r) => r.number) });
  return {
    lotId,
    lotIdentifier: lot.identifier,
    fingerprint: fingerprintOf(sampling),
    records: {
      lab: { name: lab.name, address: lab.address, accreditation: lab.accreditation },
      customer,
      lot: { identifier: lot.identifier, supplier: lot.supplier, quantityReceived: lot.quantityReceived, receivedOn: lot.receivedOn },
      cell: { maker: cell.maker, model: cell.model, designation: cell.designation, data: cell.data },
      plan: sampling.plan,
      acceptanceProcedure: sampling.acceptanceProcedure?.code ?? null,
      draw: sampling.draw,
      members: sampling.members.map((m) => ({ position: m.position, specimenIdentifier: m.specimenIdentifier, result: m.result, runId: m.runId, runNumber: m.runNumber })),
      counts: sampling.counts,
      decision: sampling.decision,
      runs: sampledRuns,
      results,
      meaningWords: { approved: SIGNATURE_MEANING_WORDS.approved },
    },
  };
}

/** Re-checks, inside the issuing transaction and with the lot's row locked, that nothing the certificate rests on moved. */
export async function confirmLotBasisUnchanged(tx: Executor, basis: LotCertificateBasis, replacing: string | null): Promise<void> {
  await lockLot(tx, basis.lotId);
  const sampling = await getLotSampling(tx, basis.lotId);
  if (!sampling || fingerprintOf(sampling) !== basis.fingerprint) {
    throw new DomainError("conflict", `The sample or the decision of lot ${basis.lotIdentifier} changed while its certificate was being made. Nothing was issued.`);
  }
  const existing = await findValidLotCertificate(tx, basis.lotId);
  if (existing !== replacing) {
    throw new DomainError("conflict", `Lot ${basis.lotIdentifier} was certified by someone else meanwhile (${existing ?? "no valid certificate"}). Nothing was issued.`);
  }
}
