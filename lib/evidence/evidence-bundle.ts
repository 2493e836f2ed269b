import "server-only";
import { createHash } from "node:crypto";
import { PassThrough, Readable } from "node:stream";
import { ZipArchive } from "archiver";
import { getDb } from "@/db";
import { listAuditEvents, type AuditEventView } from "@/db/audit";
import { listStepRecords } from "@/db/runs";
import { getCertificateByNumber, listLotCertificates, type CertificateView } from "@/db/certificates";
import { getReviewedEvaluation, listRunCertificateIds, listRunLogFiles } from "@/db/evidence";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { DomainError } from "@/lib/errors";
import { formatResultsCsv, listExportedResults, toFileName } from "@/lib/lots/results/export-results";
import { readLotResults } from "@/lib/lots/results/read-results";
import { readVerifiedFile, type Reader } from "@/lib/integrity/read-verified-file";
import { formatPartTime } from "@/lib/runs/log-parts/part-sequence";
import { formatAuditTrailCsv } from "./audit-trail-csv";

interface BundleFile {
  name: string;
  bytes: Uint8Array;
  what: string;
  /** For a stored file: the SHA-256 recorded when it was stored (its bytes were checked against it). */
  recordedSha256?: string;
}

const AUDIT_LIMIT = 100_000;

const sortEvents = (trails: AuditEventView[][]) => trails.flat().sort((a, b) => a.at.getTime() - b.at.getTime() || Number(a.id) - Number(b.id));

/** A run certificate's files: its PDF, every raw log as uploaded, the reviewed findings, the audit trail of the run and its certificates. */
async function gatherRunEvidence(certificate: CertificateView, runId: string, pdf: { fileName: string; bytes: Uint8Array; sha256: string }, reader?: Reader): Promise<{ files: BundleFile[]; events: AuditEventView[]; about: string }> {
  const db = getDb();
  const [logs, evaluation, certificateIds] = await Promise.all([listRunLogFiles(db, runId), getReviewedEvaluation(db, runId), listRunCertificateIds(db, runId)]);
  const events = sortEvents(
    await Promise.all([
      listAuditEvents(db, { entityType: "run", entityId: runId, limit: AUDIT_LIMIT }),
      ...certificateIds.map((id) => listAuditEvents(db, { entityType: "certificate", entityId: id, limit: AUDIT_LIMIT })),
    ]),
  );
  const files: BundleFile[] = [{ name: pdf.fileName, bytes: pdf.bytes, recordedSha256: pdf.sha256, what: "the certificate as issued, with its embedded signature" }];
  for (const [i, log] of logs.entries()) {
    const { bytes, file } = await readVerifiedFile(log.storedFileId, reader, `evidence bundle of certificate ${certificate.number}`);
    const name = `logs/${String(i + 1).padStart(2, "0")}-${log.fileName.replace(/[^\w.\- ]/g, "_")}`;
    const what = log.part
      ? `part ${log.part.number} of the data log, samples from ${formatPartTime(log.part.firstTimeS, log.part.timeForm)} to ${formatPartTime(log.part.lastTimeS, log.part.timeForm)}, received from ${log.uploadedBy} on ${log.uploadedAt.toISOString()}${log.current ? "" : " (its log was replaced by a later upload)"}`
      : `data log as uploaded by ${log.uploadedBy} on ${log.uploadedAt.toISOString()}${log.current ? " (the one evaluated)" : " (replaced by a later upload)"}`;
    files.push({ name, bytes, recordedSha256: file.sha256, what });
  }
  if (evaluation) {
    files.push({
      name: "findings.json",
      bytes: new TextEncoder().encode(JSON.stringify({ evaluationId: evaluation.id, evaluatedAt: evaluation.evaluatedAt, reviewed: evaluation.reviewed, evaluation: evaluation.evaluation }, null, 2)),
      what: evaluation.reviewed ? "findings, results and verdict of the evaluation the reviewer signed for" : "findings of the latest evaluation (no accepted review on record)",
    });
  }
  // The step records as kept: struck readings and replaced values stay in them, with who, when and why.
  const records = await listStepRecords(db, runId);
  files.push({
    name: "step-records.json",
    bytes: new TextEncoder().encode(JSON.stringify(records, null, 2)),
    what: "what the operator recorded for each step; entries struck as errors and corrected values are kept, marked with who, when and why",
  });
  return { files, events, about: `Run ${certificate.runNumber ?? ""}, specimen ${certificate.specimenIdentifier ?? ""}.` };
}

/**
 * A lot certificate's files: its PDF, the PDFs of the sampled runs' certificates that were issued (each
 * with its own evidence bundle), the lot's reviewed discharge results as CSV, and the audit trail of the
 * lot and its certificates.
 */
async function gatherLotEvidence(certificate: CertificateView, lotId: string, pdf: { fileName: string; bytes: Uint8Array; sha256: string }, reader?: Reader): Promise<{ files: BundleFile[]; events: AuditEventView[]; about: string }> {
  const db = getDb();
  const payload = certificate.payload;
  const runCertificates = payload.subject === "lot" ? [...new Set(payload.sample.flatMap((c) => (c.runCertificate ? [c.runCertificate] : [])))] : [];
  const [lotCertificates, results] = await Promise.all([listLotCertificates(db, lotId), readLotResults(lotId)]);
  const events = sortEvents(
    await Promise.all([
      listAuditEvents(db, { entityType: "lot", entityId: lotId, limit: AUDIT_LIMIT }),
      ...lotCertificates.map((c) => listAuditEvents(db, { entityType: "certificate", entityId: c.id, limit: AUDIT_LIMIT })),
    ]),
  );
  const files: BundleFile[] = [{ name: pdf.fileName, bytes: pdf.bytes, recordedSha256: pdf.sha256, what: "the lot certificate as issued, with its embedded signature" }];
  for (const number of runCertificates) {
    const run = await readCertificatePdf(number, reader, `evidence bundle of certificate ${certificate.number}`);
    if (run) files.push({ name: `run-certificates/${run.fileName}`, bytes: run.bytes, recordedSha256: run.sha256, what: `certificate ${number} of a sampled run, as issued; its own evidence bundle holds the run's logs and findings` });
  }
  const csv = formatResultsCsv(listExportedResults(results.results, results.specification.data));
  files.push({
    name: `lot-${toFileName(results.lot.identifier)}-results.csv`,
    bytes: new TextEncoder().encode(csv),
    what: `every reviewed discharge result of lot ${results.lot.identifier} as it stands now (${results.results.length} rows), sampled cells and others`,
  });
  return { files, events, about: `Lot ${certificate.lotIdentifier ?? ""}.` };
}

/**
 * Everything an assessor needs to check one certificate without our software: the signed PDF and the
 * records behind it (for a run: every raw log as uploaded and the findings the reviewer signed for; for
 * a lot: the sampled runs' certificates and the lot's results), the payload whose SHA-256 the
 * certificate states, the audit trail as CSV, and a manifest with the SHA-256 of each file. Read-only.
 */
export async function buildEvidenceBundle(number: string, reader?: Reader): Promise<{ fileName: string; stream: ReadableStream<Uint8Array> }> {
  const certificate = await getCertificateByNumber(getDb(), number);
  if (!certificate) throw new DomainError("not-found", `No certificate ${number}.`);
  const pdf = await readCertificatePdf(number, reader, `evidence bundle of certificate ${number}`);
  if (!pdf) throw new DomainError("not-found", `The PDF of certificate ${number} is missing from storage.`);
  const gathered = certificate.runId
    ? await gatherRunEvidence(certificate, certificate.runId, pdf, reader)
    : certificate.lotId
      ? await gatherLotEvidence(certificate, certificate.lotId, pdf, reader)
      : null;
  if (!gathered) throw new DomainError("invalid", `Certificate ${number} names neither a run nor a lot.`);
  const { files, events } = gathered;
  const encoder = new TextEncoder();
  files.push({ name: "certificate-payload.json", bytes: encoder.encode(JSON.stringify(certificate.payload, null, 2)), what: `what the certificate states; its canonical form hashes to ${certificate.payloadSha256}` });
  files.push({
    name: "audit-trail.csv",
    bytes: encoder.encode(formatAuditTrailCsv(events)),
    what: `${events.length} audit events of the ${certificate.runId ? "run" : "lot"} and its certificates, oldest first`,
  });

  const manifest = [
    `Evidence for certificate ${certificate.number} (${certificate.status}), ${certificate.labName}`,
    `${gathered.about} Bundle made ${new Date().toISOString()}.`,
    `SHA-256 of the certificate PDF as issued: ${certificate.pdfSha256}`,
    "",
    "file\tSHA-256\tbytes\twhat it is",
    // A stored file is listed with the hash recorded when it arrived (its bytes were checked against it
    // above); only the files made for this bundle are hashed here.
    ...files.map((f) => `${f.name}\t${f.recordedSha256 ?? createHash("sha256").update(f.bytes).digest("hex")}\t${f.bytes.byteLength}\t${f.what}`),
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
