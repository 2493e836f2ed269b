import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCertificateRecord, setCertificateRevoked, type CertificateRecord } from "@/db/certificates";
import { describeRunParticipation } from "@/db/run-participants";
import { getRun } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { confirmSignerPassword } from "@/lib/signatures/sign-record";
import type { Executor } from "@/db";
import { actorLabel, assertMaySignCertificates, queueCertificateNotice } from "./issue-certificate";
import { confirmLotBasisUnchanged, findSampledRunsOperatedBy, gatherLotCertificateBasis } from "./lot-certificate-basis";
import { issueProducedCertificate, produceLotCertificate, produceRunCertificate, type ProducedCertificate } from "./produce-certificate";
import { confirmBasisUnchanged, gatherRunCertificateBasis } from "./run-certificate-basis";

function requireReason(reason: string, what: string): string {
  const text = reason.trim();
  if (text.length === 0) throw new DomainError("invalid", `Say why the certificate is ${what}: the reason is kept with it.`);
  if (text.length > 2000) throw new DomainError("invalid", "Keep the reason to 2 000 characters.");
  return text;
}

/** The certificate as it stands, refused unless it is the valid (neither revoked nor replaced) one. */
async function requireValidCertificate(db: Executor, number: string, options: { forUpdate?: boolean } = {}): Promise<CertificateRecord> {
  const certificate = await getCertificateRecord(db, number, options);
  if (!certificate) throw new DomainError("not-found", `No certificate ${number}.`);
  if (certificate.revokedAt) throw new DomainError("conflict", `Certificate ${number} is revoked; a revoked certificate is neither amended nor revoked again.`);
  if (certificate.replacedByNumber) {
    throw new DomainError("conflict", `Certificate ${number} is already replaced by ${certificate.replacedByNumber}; act on ${certificate.replacedByNumber} instead.`);
  }
  return certificate;
}

/** The audit events of an amendment: the new certificate, and the old one superseded. */
async function recordAmendment(tx: Executor, actor: SignedInUser, produced: ProducedCertificate, old: CertificateRecord, reason: string, verdict: string): Promise<void> {
  await recordAuditEvent(tx, {
    actorId: actor.id,
    actorLabel: actorLabel(actor),
    action: "certificate.amend",
    entityType: "certificate",
    entityId: produced.id,
    after: { number: produced.number, replaces: old.number, verdict, pdfSha256: produced.pdfSha256 },
    detail: { reason },
  });
  await recordAuditEvent(tx, {
    actorId: actor.id,
    actorLabel: actorLabel(actor),
    action: "certificate.supersede",
    entityType: "certificate",
    entityId: old.id,
    before: { status: "valid" },
    after: { status: "superseded", replacedBy: produced.number },
    detail: { reason },
  });
}

/** A lot certificate's amendment: made from the lot's sample and decision as they are now. */
async function amendLotCertificate(actor: SignedInUser, old: CertificateRecord & { lotId: string }, input: { password: string; reason: string }): Promise<{ number: string }> {
  const basis = await gatherLotCertificateBasis(actor, old.lotId, { replacing: old.number });
  await confirmSignerPassword(actor, input.password, `amendment of certificate ${old.number}`, { entityType: "certificate", entityId: old.id });
  const produced = await produceLotCertificate({ actor, basis, replaces: { number: old.number, reason: input.reason } });
  await issueProducedCertificate(
    actor,
    produced,
    { runId: null, lotId: old.lotId, replacesId: old.id, amendmentReason: input.reason },
    {
      check: async (tx) => {
        await requireValidCertificate(tx, old.number, { forUpdate: true });
        await confirmLotBasisUnchanged(tx, basis, old.number);
      },
      record: async (tx) => {
        await recordAmendment(tx, actor, produced, old, input.reason, produced.payload.lotDecision.words);
        await queueCertificateNotice(tx, actor, produced, undefined, old.number);
      },
    },
  );
  kickMailDispatch();
  return { number: produced.number };
}

/**
 * Amends a certificate (ISO/IEC 17025:2017 7.8.8): a new certificate, made from the run's (or the
 * lot's) records as they are now, that names the one it replaces and says why; the old one then shows
 * as superseded. Needs the signer's password, like the first issue; both steps are in the audit trail.
 */
export async function amendCertificate(actor: SignedInUser, number: string, input: { password: string; reason: string }): Promise<{ number: string }> {
  assertMaySignCertificates(actor);
  const reason = requireReason(input.reason, "amended");
  const old = await requireValidCertificate(getDb(), number);
  if (old.lotId) return amendLotCertificate(actor, { ...old, lotId: old.lotId }, { password: input.password, reason });
  if (!old.runId) throw new DomainError("invalid", `Certificate ${number} names neither a run nor a lot.`);
  const { basis, curves } = await gatherRunCertificateBasis(actor, old.runId, "certified");
  await confirmSignerPassword(actor, input.password, `amendment of certificate ${number}`, { entityType: "certificate", entityId: old.id });
  const produced = await produceRunCertificate({ actor, basis, curves, replaces: { number, reason } });
  await issueProducedCertificate(
    actor,
    produced,
    { runId: old.runId, lotId: null, replacesId: old.id, amendmentReason: reason },
    {
      check: async (tx) => {
        await requireValidCertificate(tx, number, { forUpdate: true });
        await confirmBasisUnchanged(tx, basis, "certified");
      },
      record: async (tx) => {
        await recordAmendment(tx, actor, produced, old, reason, produced.payload.conformity.specimenConforms);
        await queueCertificateNotice(tx, actor, produced, basis, number);
      },
    },
  );
  kickMailDispatch();
  return { number: produced.number };
}

/**
 * Revokes a certificate: it stays on record, marked revoked, with who, when and why; its PDF and
 * what it states never change. Needs the signer's password; the run's operator (or, for a lot, the
 * operator of any sampled run) may not revoke it.
 */
export async function revokeCertificate(actor: SignedInUser, number: string, input: { password: string; reason: string }): Promise<void> {
  assertMaySignCertificates(actor);
  const reason = requireReason(input.reason, "revoked");
  const certificate = await requireValidCertificate(getDb(), number);
  if (certificate.runId) {
    const run = await getRun(getDb(), certificate.runId);
    if (run && (await describeRunParticipation(getDb(), run.id, actor.id))) throw new DomainError("forbidden", `You took part in run ${run.number}; someone else must revoke its certificate.`);
  }
  if (certificate.lotId) {
    const operated = await findSampledRunsOperatedBy(getDb(), certificate.lotId, actor.id);
    if (operated.length > 0) throw new DomainError("forbidden", `You took part in run ${operated.join(", ")}, counted in the sample of this lot; someone else must revoke its certificate.`);
  }
  await confirmSignerPassword(actor, input.password, `revocation of certificate ${number}`, { entityType: "certificate", entityId: certificate.id });
  await getDb()
    .transaction()
    .execute(async (tx) => {
      const locked = await requireValidCertificate(tx, number, { forUpdate: true });
      const at = new Date();
      await setCertificateRevoked(tx, locked.id, { by: actor.id, at, reason });
      await recordAuditEvent(tx, {
        actorId: actor.id,
        actorLabel: actorLabel(actor),
        action: "certificate.revoke",
        entityType: "certificate",
        entityId: locked.id,
        before: { status: "valid" },
        after: { status: "revoked", revokedAt: at.toISOString() },
        detail: { number, reason },
      });
    });
}
