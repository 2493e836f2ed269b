import "server-only";
import { getDb } from "@/db";
import { getCertificateRecord } from "@/db/certificates";
import { sha256Hex } from "@/lib/storage";
import { judgeLabSignature, type LabSignatureJudgement } from "./judge-lab-signature";
import { loadLabSigningKey } from "./lab-signing-key";
import { readPdfSignature } from "./verify-pdf-signature";

export interface CertificatePdfCheck {
  /** A certificate with this number was issued here. */
  known: boolean;
  /** The file is the very one issued under this number (same SHA-256). */
  byteIdentical: boolean;
  signature: LabSignatureJudgement;
}

/**
 * Checks a PDF someone holds against the certificate issued under a number: is it byte for byte the
 * file issued, and does its embedded signature verify and come from this lab's key? Reads only;
 * nothing is stored or changed, whatever is sent.
 */
export async function checkCertificatePdf(number: string, bytes: Uint8Array): Promise<CertificatePdfCheck> {
  const [certificate, key] = await Promise.all([getCertificateRecord(getDb(), number), loadLabSigningKey()]);
  return {
    known: certificate !== null,
    byteIdentical: certificate !== null && sha256Hex(bytes) === certificate.pdfSha256,
    signature: judgeLabSignature(readPdfSignature(bytes), key.fingerprintSha256),
  };
}
