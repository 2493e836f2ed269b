// Writing a certificate: its number, its row and its approval signature (one transaction, lib/certificates).
import "server-only";
import { sql } from "kysely";
import type { CertificatePayload } from "@/lib/certificates/certificate-payload";
import type { SignatureManifestation } from "@/lib/signatures/sign-record";
import type { Executor } from "../index";

/** Takes the next certificate number ('C-' and five digits, as the column default writes it) before anything is written. */
export async function takeCertificateNumber(db: Executor): Promise<string> {
  const { rows } = await sql<{ number: string }>`select 'C-' || lpad(nextval('certificate_number_seq')::text, 5, '0') as number`.execute(db);
  const number = rows[0]?.number;
  if (!number) throw new Error("the certificate number sequence gave nothing");
  return number;
}

export async function insertCertificate(
  db: Executor,
  c: {
    id: string;
    number: string;
    runId: string | null;
    lotId: string | null;
    replacesId: string | null;
    amendmentReason: string | null;
    payload: CertificatePayload;
    payloadSha256: string;
    pdfFileId: string;
    pdfSha256: string;
    issuedBy: string;
    issuedAt: Date;
    signatureId: string;
  },
): Promise<void> {
  await db
    .insertInto("certificate")
    .values({
      id: c.id,
      number: c.number,
      run_id: c.runId,
      lot_id: c.lotId,
      replaces_id: c.replacesId,
      amendment_reason: c.amendmentReason,
      payload: JSON.stringify(c.payload),
      payload_sha256: c.payloadSha256,
      pdf_file_id: c.pdfFileId,
      pdf_sha256: c.pdfSha256,
      issued_by: c.issuedBy,
      issued_at: c.issuedAt,
      signature_id: c.signatureId,
    })
    .execute();
}

/** The approval signature of a certificate, written with the issue time so the PDF and the record state the same moment. */
export async function insertApprovalSignature(
  db: Executor,
  s: { signerId: string; printedName: string; certificateId: string; recordSha256: string; signedAt: Date },
): Promise<SignatureManifestation> {
  const row = await db
    .insertInto("electronic_signature")
    .values({
      signer_id: s.signerId,
      printed_name: s.printedName,
      meaning: "approved",
      entity_type: "certificate",
      entity_id: s.certificateId,
      record_sha256: s.recordSha256,
      signed_at: s.signedAt,
    })
    .returning(["id", "printed_name", "meaning", "signed_at"])
    .executeTakeFirstOrThrow();
  return { id: row.id, printedName: row.printed_name, meaning: row.meaning, signedAt: row.signed_at };
}
