// One certificate as the services that amend or revoke it need it, and the valid certificate of a run or lot.
import "server-only";
import type { Executor } from "../index";

/** What the certificate services need of one certificate, its row locked when asked. */
export interface CertificateRecord {
  id: string;
  number: string;
  runId: string | null;
  lotId: string | null;
  pdfSha256: string;
  pdfStorageKey: string;
  revokedAt: Date | null;
  replacedByNumber: string | null;
  pdfFileId: string;
}

export async function getCertificateRecord(db: Executor, number: string, options: { forUpdate?: boolean } = {}): Promise<CertificateRecord | null> {
  if (options.forUpdate) await db.selectFrom("certificate").select("id").where("number", "=", number).forUpdate().execute();
  const r = await db
    .selectFrom("certificate as c")
    .innerJoin("stored_file as f", "f.id", "c.pdf_file_id")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .select(["c.id", "c.number", "c.run_id", "c.lot_id", "c.pdf_sha256", "f.storage_key", "c.revoked_at", "next.number as replaced_by_number", "c.pdf_file_id"])
    .where("c.number", "=", number)
    .executeTakeFirst();
  return r
    ? {
        id: r.id,
        number: r.number,
        runId: r.run_id,
        lotId: r.lot_id,
        pdfSha256: r.pdf_sha256,
        pdfStorageKey: r.storage_key,
        revokedAt: r.revoked_at,
        replacedByNumber: r.replaced_by_number,
        pdfFileId: r.pdf_file_id,
      }
    : null;
}

/** The certificate of a run that is neither revoked nor replaced, if any. */
export async function findValidRunCertificate(db: Executor, runId: string): Promise<string | null> {
  return findValidCertificate(db, "c.run_id", runId);
}

/** The lot certificate of a lot that is neither revoked nor replaced, if any. */
export async function findValidLotCertificate(db: Executor, lotId: string): Promise<string | null> {
  return findValidCertificate(db, "c.lot_id", lotId);
}

async function findValidCertificate(db: Executor, of: "c.run_id" | "c.lot_id", id: string): Promise<string | null> {
  const r = await db
    .selectFrom("certificate as c")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .select("c.number")
    .where(of, "=", id)
    .where("c.revoked_at", "is", null)
    .where("next.id", "is", null)
    .orderBy("c.issued_at", "desc")
    .executeTakeFirst();
  return r?.number ?? null;
}

/** Adds the revocation, once (the database refuses a second one and any other change). */
export async function setCertificateRevoked(db: Executor, id: string, r: { by: string; at: Date; reason: string }): Promise<void> {
  await db.updateTable("certificate").set({ revoked_at: r.at, revoked_by: r.by, revocation_reason: r.reason }).where("id", "=", id).executeTakeFirstOrThrow();
}
