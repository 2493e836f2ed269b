import "server-only";
import { getDb } from "@/db";
import { getCertificateRecord } from "@/db/certificates";
import { getObjectBytes, sha256Hex } from "@/lib/storage";

/**
 * The issued PDF exactly as stored, or null for an unknown number. A stored file whose hash no longer
 * matches the one recorded at issue is never served as the certificate.
 */
export async function readCertificatePdf(number: string): Promise<{ bytes: Buffer; fileName: string } | null> {
  const certificate = await getCertificateRecord(getDb(), number);
  if (!certificate) return null;
  const bytes = Buffer.from(await getObjectBytes(certificate.pdfStorageKey));
  if (sha256Hex(bytes) !== certificate.pdfSha256) throw new Error(`the stored PDF of certificate ${number} does not match its recorded SHA-256`);
  return { bytes, fileName: `${certificate.number}.pdf` };
}
