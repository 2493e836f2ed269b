import type { CertificateView } from "@/db/certificates";

/** A certificate as the API answers it: what it states and its state, never storage keys. */
export function toCertificateJson(c: CertificateView) {
  return {
    number: c.number,
    status: c.status,
    verdict: c.verdict,
    issuedAt: c.issuedAt,
    issuedBy: c.issuedByName,
    run: c.runNumber && { id: c.runId, number: c.runNumber },
    lot: c.lotIdentifier && { id: c.lotId, identifier: c.lotIdentifier },
    specimen: c.specimenIdentifier,
    cell: c.cellLabel,
    pdfSha256: c.pdfSha256,
    payloadSha256: c.payloadSha256,
    replaces: c.replacesNumber,
    replacedBy: c.replacedByNumber,
    amendmentReason: c.amendmentReason,
    revoked: c.revokedAt && { at: c.revokedAt, by: c.revokedByName, reason: c.revocationReason },
    signature: { printedName: c.signature.printedName, meaning: c.signature.meaning, signedAt: c.signature.signedAt },
    pdf: `/api/certificates/${c.number}/pdf`,
    check: `/check/${c.number}`,
  };
}
