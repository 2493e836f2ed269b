import type { PdfSignatureReading } from "./verify-pdf-signature";

export interface LabSignatureJudgement {
  present: boolean;
  valid: boolean;
  /** Valid, and made with the lab's own signing certificate (same SHA-256 fingerprint). */
  signedByLab: boolean;
  reason: string;
  signer?: string;
  signedAt?: string;
}

/** What a reader is told about a PDF's signature, given the fingerprint of the lab's signing certificate. */
export function judgeLabSignature(reading: PdfSignatureReading, labFingerprintSha256: string): LabSignatureJudgement {
  const signedByLab = reading.valid && reading.signerFingerprintSha256 === labFingerprintSha256;
  const reason = !reading.valid
    ? reading.reason
    : signedByLab
      ? `${reading.reason} It was signed with this laboratory's key.`
      : `The signature is intact, but it was not made with this laboratory's key (signed by "${reading.signer ?? "unknown"}"): not signed by the lab.`;
  return {
    present: reading.present,
    valid: reading.valid,
    signedByLab,
    reason,
    ...(reading.signer && { signer: reading.signer }),
    ...(reading.signedAt && { signedAt: reading.signedAt }),
  };
}
