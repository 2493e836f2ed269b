import "server-only";
import { recordAuditEvent } from "@/db/audit";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { confirmSignerPassword } from "@/lib/signatures/sign-record";
import { actorLabel, assertMaySignCertificates, queueCertificateNotice } from "./issue-certificate";
import { confirmLotBasisUnchanged, gatherLotCertificateBasis } from "./lot-certificate-basis";
import { issueProducedCertificate, produceLotCertificate } from "./produce-certificate";

/**
 * Issues the certificate of a lot whose sample has decided it (ISO 2859-1 single sampling; ISO/IEC
 * 17025:2017 7.8, with the sampling plan of 7.8.2.1 k): the signer confirms their password (21 CFR
 * 11.200), the PDF is rendered, signed with the lab's key and stored, then one transaction writes the
 * approval signature, the certificate, the audit events on the certificate and the lot, and the
 * auditors' notice. Refused without a plan, a draw or a decision, when a valid lot certificate exists
 * (amend it instead), and for an engineer who operated any run counted in the sample.
 */
export async function issueLotCertificate(actor: SignedInUser, lotId: string, input: { password: string }): Promise<{ number: string }> {
  assertMaySignCertificates(actor);
  const basis = await gatherLotCertificateBasis(actor, lotId);
  await confirmSignerPassword(actor, input.password, `certificate of lot ${basis.lotIdentifier}`, { entityType: "lot", entityId: lotId });
  const produced = await produceLotCertificate({ actor, basis, replaces: null });
  const decision = produced.payload.lotDecision;
  await issueProducedCertificate(
    actor,
    produced,
    { runId: null, lotId, replacesId: null, amendmentReason: null },
    {
      check: (tx) => confirmLotBasisUnchanged(tx, basis, null),
      record: async (tx) => {
        await recordAuditEvent(tx, {
          actorId: actor.id,
          actorLabel: actorLabel(actor),
          action: "certificate.issue",
          entityType: "certificate",
          entityId: produced.id,
          after: {
            number: produced.number,
            lot: basis.lotIdentifier,
            verdict: decision.words,
            sampled: produced.payload.sample.map((c) => c.run).filter((r): r is string => r !== null),
            pdfSha256: produced.pdfSha256,
            payloadSha256: produced.payloadSha256,
          },
        });
        await recordAuditEvent(tx, {
          actorId: actor.id,
          actorLabel: actorLabel(actor),
          action: "lot.certify",
          entityType: "lot",
          entityId: lotId,
          after: { certificate: produced.number, decision: decision.verdict },
          detail: { statement: decision.statement },
        });
        await queueCertificateNotice(tx, actor, produced);
      },
    },
  );
  kickMailDispatch();
  return { number: produced.number };
}
