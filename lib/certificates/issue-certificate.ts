import "server-only";
import { recordAuditEvent } from "@/db/audit";
import { setRunStatus } from "@/db/runs";
import { can } from "@/lib/auth/permissions";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { enqueueMail, listRecipientsByRole } from "@/lib/mail/enqueue-mail";
import { composeCertificateIssued } from "@/lib/mail/messages";
import { confirmSignerPassword } from "@/lib/signatures/sign-record";
import type { Executor } from "@/db";
import { issueProducedCertificate, produceRunCertificate, type ProducedCertificate } from "./produce-certificate";
import { confirmBasisUnchanged, gatherRunCertificateBasis, type RunCertificateBasis } from "./run-certificate-basis";

export const actorLabel = (u: SignedInUser) => `${u.displayName} <${u.email}>`;

export function assertMaySignCertificates(actor: SignedInUser): void {
  if (!can(actor.role, "certificate.sign")) throw new DomainError("forbidden", "Only an engineer signs certificates.");
}

/** What the auditors' notice names: "run R-00012 (specimen …)" or "lot …", and the verdict in words. */
export function describeCertified(produced: ProducedCertificate, basis?: RunCertificateBasis): { runOrLot: string; verdict: string } {
  const p = produced.payload;
  if (p.subject === "lot") return { runOrLot: `lot ${p.lot.identifier}`, verdict: p.lotDecision.words };
  return { runOrLot: `run ${p.run.number} (specimen ${basis?.specimen.identifier ?? p.item.specimen.identifier})`, verdict: p.conformity.specimenConforms };
}

/** The notice to the auditors that a certificate was issued, queued in the issuing transaction. */
export async function queueCertificateNotice(tx: Executor, actor: SignedInUser, produced: ProducedCertificate, basis?: RunCertificateBasis, replaces?: string): Promise<void> {
  const auditors = await listRecipientsByRole(tx, "auditor");
  const notice = composeCertificateIssued({
    certificateNumber: produced.number,
    ...describeCertified(produced, basis),
    issuerName: actor.displayName,
    ...(replaces && { replaces }),
  });
  await enqueueMail(tx, { kind: "certificate-issued", recipients: auditors, ...notice, entityType: "certificate", entityId: produced.id });
}

/**
 * Issues the certificate of an accepted run (ISO/IEC 17025:2017 7.8): the signer confirms their
 * password (21 CFR 11.200), the PDF is rendered, signed with the lab's key and stored, then one
 * transaction writes the approval signature, the certificate, the run's new state (certified), the
 * audit events and the auditors' notice. The run's operator may not issue it; a run whose accepted
 * review does not cover the latest evaluation and every deviation in it gets none.
 */
export async function issueRunCertificate(actor: SignedInUser, runId: string, input: { password: string }): Promise<{ number: string }> {
  assertMaySignCertificates(actor);
  const { basis, curves } = await gatherRunCertificateBasis(actor, runId, "accepted");
  await confirmSignerPassword(actor, input.password, `certificate of run ${basis.runView.number}`, { entityType: "run", entityId: runId });
  const produced = await produceRunCertificate({ actor, basis, curves, replaces: null });
  await issueProducedCertificate(
    actor,
    produced,
    { runId, lotId: null, replacesId: null, amendmentReason: null },
    {
      check: (tx) => confirmBasisUnchanged(tx, basis, "accepted"),
      record: async (tx) => {
        await setRunStatus(tx, runId, "certified");
        await recordAuditEvent(tx, {
          actorId: actor.id,
          actorLabel: actorLabel(actor),
          action: "certificate.issue",
          entityType: "certificate",
          entityId: produced.id,
          after: {
            number: produced.number,
            run: basis.runView.number,
            verdict: produced.payload.conformity.specimenConforms,
            procedureFollowed: produced.payload.conformity.procedureFollowed,
            pdfSha256: produced.pdfSha256,
            payloadSha256: produced.payloadSha256,
          },
        });
        await recordAuditEvent(tx, {
          actorId: actor.id,
          actorLabel: actorLabel(actor),
          action: "run.certify",
          entityType: "run",
          entityId: runId,
          before: { status: "accepted" },
          after: { status: "certified" },
          detail: { certificate: produced.number },
        });
        await queueCertificateNotice(tx, actor, produced, basis);
      },
    },
  );
  kickMailDispatch();
  return { number: produced.number };
}
