import type { CertificateView } from "@/db/certificates";

/**
 * What the public check page may say about a certificate: only what the certificate itself states,
 * plus its current state (docs/design.md §2). No customer, no internal ids, no people other than the signer.
 */
export function toPublicCertificate(c: CertificateView) {
  return {
    number: c.number,
    status: c.status,
    issuedAt: c.issuedAt,
    lab: c.labName,
    specimen: c.specimenIdentifier,
    lot: c.lotIdentifier,
    cell: c.cellLabel,
    verdict: c.verdict,
    pdfSha256: c.pdfSha256,
    replaces: c.replacesNumber,
    replacedBy: c.replacedByNumber,
    revoked: c.revokedAt && { at: c.revokedAt, reason: c.revocationReason },
    signedBy: { printedName: c.signature.printedName, meaning: c.signature.meaning, signedAt: c.signature.signedAt },
  };
}

export type PublicCertificate = ReturnType<typeof toPublicCertificate>;
