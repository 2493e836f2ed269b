// Certificates as the list, the detail page and the public check read them.
import "server-only";
import { sql } from "kysely";
import type { CertificatePayload } from "@/lib/certificates/certificate-payload";
import type { SignatureManifestation } from "@/lib/signatures/sign-record";
import type { SortDirection } from "@/lib/lists/list-params";
import type { Executor } from "../index";
import { readPage, type Page } from "../paginate";

/** A certificate's state: valid, replaced by an amendment (7.8.8), or withdrawn with a reason. */
export type CertificateStatus = "valid" | "superseded" | "revoked";

export interface CertificateView {
  id: string;
  number: string;
  subject: "run" | "lot";
  runId: string | null;
  runNumber: string | null;
  /** The lot of a lot certificate, or the lot the specimen of a run certificate came from. */
  lotId: string | null;
  lotIdentifier: string | null;
  specimenIdentifier: string | null;
  cellSpecificationId: string | null;
  /** "Maker Model (designation)". */
  cellLabel: string | null;
  /**
   * Run certificates: the statement of conformity (conforms / does not conform / not decided). Lot
   * certificates: the lot decision, "lot accepted" or "lot rejected" (ISO 2859-1 accepts or rejects a
   * lot; it does not state conformity), so the list's conformity filter matches run certificates only.
   */
  verdict: string;
  /** Was the procedure followed: yes / no / not decided (run certificates). */
  procedureFollowed: string | null;
  status: CertificateStatus;
  issuedAt: Date;
  issuedByName: string;
  pdfSha256: string;
  payloadSha256: string;
  replacesNumber: string | null;
  replacedByNumber: string | null;
  amendmentReason: string | null;
  revokedAt: Date | null;
  revokedByName: string | null;
  revocationReason: string | null;
  /** The approval signature (21 CFR 11.50: printed name, date and time, meaning). */
  signature: SignatureManifestation;
  /** The laboratory as the certificate names it. */
  labName: string;
  /** What the certificate states; its canonical JSON hashes to payloadSha256. */
  payload: CertificatePayload;
}

export interface CertificateFilter {
  lotId?: string;
  cellSpecificationId?: string;
  /** YYYY-MM-DD, UTC calendar day, inclusive. */
  issuedFrom?: string;
  issuedTo?: string;
  verdict?: string;
  runId?: string;
}

function base(db: Executor) {
  return db
    .selectFrom("certificate as c")
    .innerJoin("app_user as issuer", "issuer.id", "c.issued_by")
    .innerJoin("electronic_signature as sig", "sig.id", "c.signature_id")
    .leftJoin("app_user as revoker", "revoker.id", "c.revoked_by")
    .leftJoin("certificate as old", "old.id", "c.replaces_id")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .leftJoin("run as r", "r.id", "c.run_id")
    .leftJoin("specimen as sp", "sp.id", "r.specimen_id")
    .leftJoin("lot as l", (j) => j.on(sql`l.id`, "=", sql`coalesce(c.lot_id, sp.lot_id)`))
    .leftJoin("cell_specification as cs", (j) => j.on(sql`cs.id`, "=", sql`coalesce(sp.cell_specification_id, l.cell_specification_id)`))
    .select([
      "c.id",
      "c.number",
      "c.run_id",
      "r.number as run_number",
      "l.id as lot_id",
      "l.identifier as lot_identifier",
      "sp.identifier as specimen_identifier",
      "cs.id as spec_id",
      "cs.maker",
      "cs.model",
      "cs.designation",
      "c.payload",
      "c.payload_sha256",
      "c.pdf_sha256",
      "c.issued_at",
      "issuer.display_name as issued_by_name",
      "c.amendment_reason",
      "old.number as replaces_number",
      "next.number as replaced_by_number",
      "c.revoked_at",
      "revoker.display_name as revoked_by_name",
      "c.revocation_reason",
      "sig.id as signature_id",
      "sig.printed_name",
      "sig.meaning",
      "sig.signed_at",
    ]);
}

type Row = Awaited<ReturnType<ReturnType<typeof base>["executeTakeFirstOrThrow"]>>;

function toView(r: Row): CertificateView {
  // Written only by lib/certificates from a built payload.
  const payload = r.payload as CertificatePayload & { conformity?: { specimenConforms?: string; procedureFollowed?: string }; lotDecision?: { words?: string } };
  return {
    id: r.id,
    number: r.number,
    subject: r.run_id ? "run" : "lot",
    runId: r.run_id,
    runNumber: r.run_number,
    lotId: r.lot_id,
    lotIdentifier: r.lot_identifier,
    specimenIdentifier: r.specimen_identifier,
    cellSpecificationId: r.spec_id,
    cellLabel: r.maker ? `${r.maker} ${r.model} (${r.designation})` : null,
    verdict: payload.conformity?.specimenConforms ?? payload.lotDecision?.words ?? "not decided",
    procedureFollowed: payload.conformity?.procedureFollowed ?? null,
    status: r.revoked_at ? "revoked" : r.replaced_by_number ? "superseded" : "valid",
    issuedAt: r.issued_at,
    issuedByName: r.issued_by_name,
    pdfSha256: r.pdf_sha256,
    payloadSha256: r.payload_sha256,
    replacesNumber: r.replaces_number,
    replacedByNumber: r.replaced_by_number,
    amendmentReason: r.amendment_reason,
    revokedAt: r.revoked_at,
    revokedByName: r.revoked_by_name,
    revocationReason: r.revocation_reason,
    signature: { id: r.signature_id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at },
    labName: payload.lab?.name ?? "",
    payload,
  };
}

/** Every matching certificate, newest first (a list for people or the API reads a page: listCertificatesPage). Every filter narrows; dates are UTC calendar days. */
export async function listCertificates(db: Executor, filter: CertificateFilter = {}): Promise<CertificateView[]> {
  const q = filteredCertificates(db, filter).orderBy("c.issued_at", "desc").orderBy("c.number", "desc");
  return (await q.execute()).map(toView);
}

/** The columns the certificate list sorts by, and the column each stands for. */
export const CERTIFICATE_SORTS = ["number", "issued", "cell", "subject"] as const;
export type CertificateSort = (typeof CERTIFICATE_SORTS)[number];
const CERTIFICATE_SORT_COLUMNS = {
  number: "c.number",
  issued: "c.issued_at",
  cell: "cs.maker",
  subject: sql`coalesce(sp.identifier, l.identifier)`,
} as const;

/** One page of the certificate list, sorted in SQL; ties fall back to the newest number first. */
export async function listCertificatesPage(
  db: Executor,
  filter: CertificateFilter,
  list: { page: number; pageSize: number; sort: CertificateSort; direction: SortDirection },
): Promise<Page<CertificateView>> {
  const q = filteredCertificates(db, filter).orderBy(CERTIFICATE_SORT_COLUMNS[list.sort], list.direction).orderBy("c.number", "desc");
  return readPage(db, q, list, toView);
}

function filteredCertificates(db: Executor, filter: CertificateFilter) {
  let q = base(db);
  if (filter.lotId) q = q.where(sql<boolean>`coalesce(c.lot_id, sp.lot_id) = ${filter.lotId}::uuid`);
  if (filter.cellSpecificationId) q = q.where("cs.id", "=", filter.cellSpecificationId);
  if (filter.issuedFrom) q = q.where(sql<boolean>`(c.issued_at at time zone 'UTC')::date >= ${filter.issuedFrom}::date`);
  if (filter.issuedTo) q = q.where(sql<boolean>`(c.issued_at at time zone 'UTC')::date <= ${filter.issuedTo}::date`);
  if (filter.verdict) q = q.where(sql<boolean>`c.payload->'conformity'->>'specimenConforms' = ${filter.verdict}`);
  if (filter.runId) q = q.where("c.run_id", "=", filter.runId);
  return q;
}

export async function getCertificateByNumber(db: Executor, number: string): Promise<CertificateView | null> {
  const r = await base(db).where("c.number", "=", number).executeTakeFirst();
  return r ? toView(r) : null;
}

/** Every certificate of a lot (its lot certificates, not those of its runs), newest first. */
export async function listLotCertificates(db: Executor, lotId: string): Promise<{ id: string; number: string; issuedAt: Date; status: CertificateStatus }[]> {
  const rows = await db
    .selectFrom("certificate as c")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .select(["c.id", "c.number", "c.issued_at", "c.revoked_at", "next.number as replaced_by_number"])
    .where("c.lot_id", "=", lotId)
    .orderBy("c.issued_at", "desc")
    .orderBy("c.number", "desc")
    .execute();
  return rows.map((r) => ({ id: r.id, number: r.number, issuedAt: r.issued_at, status: r.revoked_at ? "revoked" : r.replaced_by_number ? "superseded" : "valid" }));
}
