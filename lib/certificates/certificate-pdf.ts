import "server-only";
import { getDb } from "@/db";
import { getCertificateRecord } from "@/db/certificates";
import { readVerifiedFile, type Reader } from "@/lib/integrity/read-verified-file";
import { DomainError } from "@/lib/errors";

/**
 * The issued PDF exactly as stored, or null for an unknown number. A stored file whose hash no longer
 * matches the one recorded at issue is never served as the certificate: it is refused, and the refusal
 * is in the audit trail.
 */
export async function readCertificatePdf(number: string, reader?: Reader, during = "certificate download"): Promise<{ bytes: Buffer; fileName: string; sha256: string } | null> {
  const certificate = await getCertificateRecord(getDb(), number);
  if (!certificate) return null;
  const { file, bytes } = await readVerifiedFile(certificate.pdfFileId, reader, during);
  // The certificate row states the PDF's hash too (frozen at issue); both must agree.
  if (file.sha256 !== certificate.pdfSha256) throw new DomainError("integrity", `The file record of certificate ${number} states another SHA-256 than the certificate itself; the PDF is not handed out.`);
  return { bytes: Buffer.from(bytes), fileName: `${certificate.number}.pdf`, sha256: certificate.pdfSha256 };
}
