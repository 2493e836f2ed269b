import "server-only";
import { createHash } from "node:crypto";
import { PassThrough, Readable } from "node:stream";
import { ZipArchive } from "archiver";
import { getDb } from "@/db";
import { listAuditEvents, type AuditEventView } from "@/db/audit";
import { getCertificateByNumber } from "@/db/certificates";
import { getReviewedEvaluation, listRunCertificateIds, listRunLogFiles } from "@/db/evidence";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { DomainError } from "@/lib/errors";
import { getObjectBytes } from "@/lib/storage";
import { formatAuditTrailCsv } from "./audit-trail-csv";

interface BundleFile {
  name: string;
  bytes: Uint8Array;
  what: string;
}

const AUDIT_LIMIT = 100_000;

/**
 * Everything an assessor needs to check one certificate without our software: the signed PDF, every
 * raw log as uploaded, the findings the reviewer signed for, the payload whose SHA-256 the certificate
 * states, the audit trail as CSV, and a manifest with the SHA-256 of each file. Read-only.
 */
export async function buildEvidenceBundle(number: string): Promise<{ fileName: string; stream: ReadableStream<Uint8Array> }> {
  const db = getDb();
  const certificate = await getCertificateByNumber(db, number);
  if (!certificate) throw new DomainError("not-found", `No certificate ${number}.`);
  if (!certificate.runId) throw new DomainError("invalid", `Certificate ${number} is a lot certificate; its evidence is in the certificates of its runs.`);
  const pdf = await readCertificatePdf(number);
  if (!pdf) throw new DomainError("not-found", `The PDF of certificate ${number} is missing from storage.`);

  const runId = certificate.runId;
  const [logs, evaluation, certificateIds] = await Promise.all([listRunLogFiles(db, runId), getReviewedEvaluation(db, runId), listRunCertificateIds(db, runId)]);
  const trails = await Promise.all([
    listAuditEvents(db, { entityType: "run", entityId: runId, limit: AUDIT_LIMIT }),
    ...certificateIds.map((id) => listAuditEvents(db, { entityType: "certificate", entityId: id, limit: AUDIT_LIMIT })),
  ]);
  const events: AuditEventView[] = trails.flat().sort((a, b) => a.at.getTime() - b.at.getTime() || Number(a.id) - Number(b.id));

  const files: BundleFile[] = [{ name: pdf.fileName, bytes: pdf.bytes, what: "the certificate as issued, with its embedded signature" }];
  for (const [i, log] of logs.entries()) {
    const bytes = await getObjectBytes(log.storageKey);
    const name = `logs/${String(i + 1).padStart(2, "0")}-${log.fileName.replace(/[^\w.\- ]/g, "_")}`;
    files.push({ name, bytes, what: `data log as uploaded by ${log.uploadedBy} on ${log.uploadedAt.toISOString()}${log.current ? " (the one evaluated)" : " (replaced by a later upload)"}` });
  }
  const encoder = new TextEncoder();
  if (evaluation) {
    files.push({
      name: "findings.json",
      bytes: encoder.encode(JSON.stringify({ evaluationId: evaluation.id, evaluatedAt: evaluation.evaluatedAt, reviewed: evaluation.reviewed, evaluation: evaluation.evaluation }, null, 2)),
      what: evaluation.reviewed ? "findings, results and verdict of the evaluation the reviewer signed for" : "findings of the latest evaluation (no accepted review on record)",
    });
  }
  files.push({ name: "certificate-payload.json", bytes: encoder.encode(JSON.stringify(certificate.payload, null, 2)), what: `what the certificate states; its canonical form hashes to ${certificate.payloadSha256}` });
  files.push({ name: "audit-trail.csv", bytes: encoder.encode(formatAuditTrailCsv(events)), what: `${events.length} audit events of the run and its certificates, oldest first` });

  const manifest = [
    `Evidence for certificate ${certificate.number} (${certificate.status}), ${certificate.labName}`,
    `Run ${certificate.runNumber ?? ""}, specimen ${certificate.specimenIdentifier ?? ""}. Bundle made ${new Date().toISOString()}.`,
    `SHA-256 of the certificate PDF as issued: ${certificate.pdfSha256}`,
    "",
    "file\tSHA-256\tbytes\twhat it is",
    ...files.map((f) => `${f.name}\t${createHash("sha256").update(f.bytes).digest("hex")}\t${f.bytes.byteLength}\t${f.what}`),
    "",
    "Check a file with `sha256sum <file>`; check the PDF's signature with any PDF signature tool (e.g. pdfsig).",
  ].join("\n");

  const archive = new ZipArchive({ zlib: { level: 6 } });
  const out = new PassThrough();
  archive.on("error", (error: Error) => out.destroy(error));
  archive.pipe(out);
  archive.append(manifest, { name: "MANIFEST.txt" });
  for (const f of files) archive.append(Buffer.from(f.bytes.buffer, f.bytes.byteOffset, f.bytes.byteLength), { name: f.name });
  void archive.finalize();
  return { fileName: `evidence-${certificate.number}.zip`, stream: Readable.toWeb(out) as ReadableStream<Uint8Array> };
}
