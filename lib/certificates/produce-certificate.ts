import "server-only";
import { randomUUID } from "node:crypto";
import { getDb, type Executor } from "@/db";
import { insertApprovalSignature, insertCertificate, takeCertificateNumber } from "@/db/certificates";
import { insertStoredFile } from "@/db/stored-files";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { publicUrl } from "@/lib/public-url";
import { deleteObject, putObject } from "@/lib/storage";
import { buildLotCertificatePayload } from "./build-lot-payload";
import { buildRunCertificatePayload } from "./build-run-payload";
import { hashCanonicalJson } from "./canonical-json";
import type { CertificatePayload, LotCertificatePayload, RunCertificatePayload } from "./certificate-payload";
import type { LotCertificateBasis } from "./lot-certificate-basis";
import { loadLabSigningKey } from "./lab-signing-key";
import { renderCertificatePdf } from "./render-certificate";
import type { RunCertificateBasis } from "./run-certificate-basis";
import { signPdf } from "./sign-pdf";
import type { DischargeCurve } from "./vq-plot";

/** A certificate made and stored, waiting for the transaction that issues it. */
export interface ProducedCertificate<P extends CertificatePayload = CertificatePayload> {
  id: string;
  number: string;
  issuedAt: Date;
  payload: P;
  payloadSha256: string;
  pdf: Buffer;
  pdfSha256: string;
  storageKey: string;
}

/**
 * Takes the number, builds the payload, renders and signs the PDF and stores it, all before the
 * issuing transaction (rendering and signing take a moment; the transaction stays short). The
 * approval's printed time is the issue time, and the signature row is written with that same time.
 */
async function produceCertificate<P extends CertificatePayload>(input: {
  actor: SignedInUser;
  build: (number: string, issuedAt: Date) => P;
  curves: DischargeCurve[];
}): Promise<ProducedCertificate<P>> {
  const [number, key] = await Promise.all([takeCertificateNumber(getDb()), loadLabSigningKey()]);
  const id = randomUUID();
  const issuedAt = new Date();
  const payload = input.build(number, issuedAt);
  const payloadSha256 = hashCanonicalJson(payload);
  const checkUrl = publicUrl(`/check/${number}`);
  const unsigned = await renderCertificatePdf({ payload, payloadSha256, curves: input.curves, checkUrl, signingSubject: key.commonName });
  const pdf = await signPdf(unsigned, key, {
    reason: `${payload.title} ${number} approved for issue by ${input.actor.displayName}`,
    name: key.commonName,
    location: payload.lab.address,
    contactInfo: checkUrl,
    signingTime: issuedAt,
  });
  const storageKey = `certificates/${id}/${number}.pdf`;
  const stored = await putObject(storageKey, pdf, "application/pdf");
  return { id, number, issuedAt, payload, payloadSha256, pdf, pdfSha256: stored.sha256, storageKey };
}

/** A run certificate made and stored (produceCertificate). */
export function produceRunCertificate(input: {
  actor: SignedInUser;
  basis: RunCertificateBasis;
  curves: DischargeCurve[];
  replaces: { number: string; reason: string } | null;
}): Promise<ProducedCertificate<RunCertificatePayload>> {
  return produceCertificate({
    actor: input.actor,
    curves: input.curves,
    build: (number, issuedAt) =>
      buildRunCertificatePayload({ ...input.basis, number, issuedAt, replaces: input.replaces, approval: { printedName: input.actor.displayName, signedAt: issuedAt } }),
  });
}

/** A lot certificate made and stored (produceCertificate); it draws no curves. */
export function produceLotCertificate(input: {
  actor: SignedInUser;
  basis: LotCertificateBasis;
  replaces: { number: string; reason: string } | null;
}): Promise<ProducedCertificate<LotCertificatePayload>> {
  return produceCertificate({
    actor: input.actor,
    curves: [],
    build: (number, issuedAt) =>
      buildLotCertificatePayload({ ...input.basis.records, number, issuedAt, replaces: input.replaces, approval: { printedName: input.actor.displayName, signedAt: issuedAt } }),
  });
}

/**
 * Runs the issuing transaction: the caller's checks (locks taken, nothing moved), the stored-file
 * row, the approval signature, the certificate row, then the caller's records (run status, audit
 * events, mail). If it fails, the stored PDF is removed again so nothing is half-kept; the
 * certificate number taken stays unused (a gap in the sequence, as with any sequence).
 */
export async function issueProducedCertificate(
  actor: SignedInUser,
  produced: ProducedCertificate,
  subject: { runId: string | null; lotId: string | null; replacesId: string | null; amendmentReason: string | null },
  steps: { check: (tx: Executor) => Promise<void>; record: (tx: Executor) => Promise<void> },
): Promise<void> {
  try {
    await getDb()
      .transaction()
      .execute(async (tx) => {
        await steps.check(tx);
        const file = await insertStoredFile(tx, {
          storageKey: produced.storageKey,
          originalName: `${produced.number}.pdf`,
          contentType: "application/pdf",
          sizeBytes: produced.pdf.byteLength,
          sha256: produced.pdfSha256,
          purpose: "certificate",
          uploadedBy: actor.id,
        });
        const signature = await insertApprovalSignature(tx, {
          signerId: actor.id,
          printedName: actor.displayName,
          certificateId: produced.id,
          recordSha256: produced.payloadSha256,
          signedAt: produced.issuedAt,
        });
        await insertCertificate(tx, {
          id: produced.id,
          number: produced.number,
          ...subject,
          payload: produced.payload,
          payloadSha256: produced.payloadSha256,
          pdfFileId: file.id,
          pdfSha256: produced.pdfSha256,
          issuedBy: actor.id,
          issuedAt: produced.issuedAt,
          signatureId: signature.id,
        });
        await steps.record(tx);
      });
  } catch (error) {
    await deleteObject(produced.storageKey).catch((e: unknown) => console.error(`could not remove the orphaned ${produced.storageKey}`, e));
    throw error;
  }
}
