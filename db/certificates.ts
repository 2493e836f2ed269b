import "server-only";
import { sql } from "kysely";
import type { CertificatePayload } from "@/lib/certificates/certificate-payload";
import type { SignatureManifestation } from "@/lib/signatures/sign-record";
import type { SortDirection } from "@/lib/lists/list-params";
import type { Executor } from "./index";
import { readPage, type Page } from "./paginate";

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

/** Newest first. Every filter narrows; dates are UTC calendar days. */
export async function listCertificates(db: Executor, filter: CertificateFilter = {}): Promise<CertificateView[]> {
  const q = filteredCertificates(db, filter).orderBy("c.issued_at", "desc").orderBy("c.number", "desc").limit(500);
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
  const r = await db
    .selectFrom("certificate as c")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .select("c.number")
    .where("c.run_id", "=", runId)
    .where("c.revoked_at", "is", null)
    .where("next.id", "is", null)
    .orderBy("c.issued_at", "desc")
    .executeTakeFirst();
  return r?.number ?? null;
}

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

/** Adds the revocation, once (the database refuses a second one and any other change). */
export async function setCertificateRevoked(db: Executor, id: string, r: { by: string; at: Date; reason: string }): Promise<void> {
  await db.updateTable("certificate").set({ revoked_at: r.at, revoked_by: r.by, revocation_reason: r.reason }).where("id", "=", id).executeTakeFirstOrThrow();
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

/** A run's latest review, with the signature of an acceptance. */
export interface RunReviewRecord {
  id: string;
  decision: "returned" | "accepted";
  runEvaluationId: string | null;
  acknowledgedDeviations: unknown;
  comments: string;
  signature: SignatureManifestation | null;
  createdAt: Date;
}

export async function getLatestRunReview(db: Executor, runId: string): Promise<RunReviewRecord | null> {
  const r = await db
    .selectFrom("run_review as rv")
    .leftJoin("electronic_signature as sig", "sig.id", "rv.signature_id")
    .select(["rv.id", "rv.decision", "rv.run_evaluation_id", "rv.acknowledged_deviations", "rv.comments", "rv.created_at", "sig.id as sig_id", "sig.printed_name", "sig.meaning", "sig.signed_at"])
    .where("rv.run_id", "=", runId)
    .orderBy("rv.created_at", "desc")
    .orderBy("rv.id", "desc")
    .executeTakeFirst();
  if (!r) return null;
  return {
    id: r.id,
    decision: r.decision,
    runEvaluationId: r.run_evaluation_id,
    acknowledgedDeviations: r.acknowledged_deviations,
    comments: r.comments,
    signature: r.sig_id && r.printed_name && r.meaning && r.signed_at ? { id: r.sig_id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at } : null,
    createdAt: r.created_at,
  };
}

/** One stored evaluation with the log it was made from. */
export async function getRunEvaluationRecord(db: Executor, id: string): Promise<{ id: string; runId: string; runLogId: string | null; evaluatedAt: Date; evaluation: unknown } | null> {
  const r = await db.selectFrom("run_evaluation").select(["id", "run_id", "run_log_id", "evaluated_at", "evaluation"]).where("id", "=", id).executeTakeFirst();
  return r ? { id: r.id, runId: r.run_id, runLogId: r.run_log_id, evaluatedAt: r.evaluated_at, evaluation: r.evaluation } : null;
}

/** Ids of the run's evaluations made after the given one (a newer evaluation than the one reviewed). */
export async function countEvaluationsAfter(db: Executor, runId: string, evaluation: { id: string; evaluatedAt: Date }): Promise<number> {
  const r = await db
    .selectFrom("run_evaluation")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("run_id", "=", runId)
    .where("id", "<>", evaluation.id)
    .where("evaluated_at", ">=", evaluation.evaluatedAt)
    .executeTakeFirstOrThrow();
  return Number(r.n);
}

/** The data log an evaluation was made from, with its stored file's hash. */
export async function getEvaluatedLog(db: Executor, runLogId: string): Promise<{ fileName: string; sha256: string; sizeBytes: number; samples: number; uploadedAt: Date; current: boolean } | null> {
  const r = await db
    .selectFrom("run_log as l")
    .innerJoin("stored_file as f", "f.id", "l.stored_file_id")
    .select(["f.original_name", "f.sha256", "f.size_bytes", "l.sample_count", "l.uploaded_at", "l.current"])
    .where("l.id", "=", runLogId)
    .executeTakeFirst();
  return r ? { fileName: r.original_name, sha256: r.sha256, sizeBytes: Number(r.size_bytes), samples: r.sample_count, uploadedAt: r.uploaded_at, current: r.current } : null;
}

/** The customer of a lot (7.8.2.1 d); null for in-house work. */
export async function getLotCustomer(db: Executor, lotId: string): Promise<string | null> {
  const r = await db.selectFrom("lot").select("customer").where("id", "=", lotId).executeTakeFirst();
  return r?.customer ?? null;
}

/** Instruments by id (chosen for the run) or by identifier (named by an ambient reading). */
export async function listCertificateInstruments(
  db: Executor,
  q: { ids: readonly string[]; identifiers: readonly string[] },
): Promise<{ id: string; identifier: string; kind: string; serial: string; calibrationCertificate: string; calibratedOn: string; dueOn: string }[]> {
  if (q.ids.length === 0 && q.identifiers.length === 0) return [];
  const rows = await db
    .selectFrom("instrument")
    .select(["id", "identifier", "kind", "serial", "calibration_certificate", sql<string>`calibrated_on::text`.as("calibrated_on"), sql<string>`due_on::text`.as("due_on")])
    .where((eb) =>
      eb.or([
        ...(q.ids.length > 0 ? [eb("id", "in", [...q.ids])] : []),
        ...(q.identifiers.length > 0 ? [eb("identifier", "in", [...q.identifiers])] : []),
      ]),
    )
    .orderBy("identifier")
    .execute();
  return rows.map((r) => ({
    id: r.id,
    identifier: r.identifier,
    kind: r.kind,
    serial: r.serial,
    calibrationCertificate: r.calibration_certificate,
    calibratedOn: r.calibrated_on,
    dueOn: r.due_on,
  }));
}

/** The lot certificate of a lot that is neither revoked nor replaced, if any. */
export async function findValidLotCertificate(db: Executor, lotId: string): Promise<string | null> {
  const r = await db
    .selectFrom("certificate as c")
    .leftJoin("certificate as next", "next.replaces_id", "c.id")
    .select("c.number")
    .where("c.lot_id", "=", lotId)
    .where("c.revoked_at", "is", null)
    .where("next.id", "is", null)
    .orderBy("c.issued_at", "desc")
    .executeTakeFirst();
  return r?.number ?? null;
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
