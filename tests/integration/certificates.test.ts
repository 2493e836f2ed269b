import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sql } from "kysely";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { getCertificateByNumber, listCertificates } from "@/db/certificates";
import { upsertLab } from "@/db/lab";
import { closePool } from "@/db/pool";
import { getRun, setRunStatus } from "@/db/runs";
import { formatLogCsv } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { amendCertificate, revokeCertificate } from "@/lib/certificates/amend-certificate";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { checkCertificatePdf } from "@/lib/certificates/check-pdf";
import { issueRunCertificate } from "@/lib/certificates/issue-certificate";
import { describeLabSigningKey } from "@/lib/certificates/lab-signing-key";
import { issueProducedCertificate, produceRunCertificate } from "@/lib/certificates/produce-certificate";
import { gatherRunCertificateBasis } from "@/lib/certificates/run-certificate-basis";
import { createSelfSignedP12 } from "@/lib/certificates/self-signed-p12";
import { signPdf } from "@/lib/certificates/sign-pdf";
import { listFindings, parseStoredEvaluation } from "@/lib/conformance";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { buildEvidenceBundle } from "@/lib/evidence/evidence-bundle";
import { INTEGRITY_FAULT_ACTION } from "@/lib/integrity/read-verified-file";
import { verifyStoredFiles } from "@/lib/integrity/verify-stored-files";
import { deleteObject, listObjectKeys, putObject, readObjectOrNull } from "@/lib/storage";
import { buildRatedCapacityRun, inventedCell } from "@/scenarios/rated-capacity-run";
import { adminUrl } from "../support/test-database";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, chunksOf, setPassword, releaseRatedCapacityProcedure } from "./fixtures";
import { forgeAsOwner, withOwnerClient } from "../support/test-database";

// Each test database gets its own generated lab key, in a folder of this file's own.
const signingDir = mkdtempSync(join(tmpdir(), "cellwright-signing-"));
process.env.CELLWRIGHT_SIGNING_DIR = signingDir;
afterAll(async () => {
  rmSync(signingDir, { recursive: true, force: true });
  // pg's pool.end() resolves before its sockets close; the database is dropped (with force) right
  // after this hook, so let the server see the connections go first.
  await closePool();
  await new Promise((resolve) => setTimeout(resolve, 300));
});

const PASSWORD = "correct horse battery staple";
const TODAY = "2026-12-01";
const withPassword = (user: SignedInUser) => setPassword(user, PASSWORD);

async function setUpLab() {
  const issuer = await withPassword(await makeUser("engineer", "Ida Issuer"));
  const reviewer = await makeUser("engineer", "Rex Reviewer");
  const operator = await withPassword(await makeUser("operator", "Oda Operator"));
  const auditor = await makeUser("auditor", "Aud Auditor");
  await upsertLab(getDb(), { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere", accreditation: null });
  const specId = await createCellSpecification(issuer, { maker: "Testmoor Cells", model: "TM-CERT", data: inventedCell });
  const { versionId } = await releaseRatedCapacityProcedure(issuer, reviewer, "T-CERT");
  const register = async (kind: "cycler-channel" | "thermometer", identifier: string, accuracy: object) =>
    (
      await getDb()
        .insertInto("instrument")
        .values({ kind, identifier, serial: `S-${identifier}`, accuracy: JSON.stringify(accuracy), calibration_certificate: `CAL-${identifier}`, calibrated_on: "2026-01-10", due_on: "2027-01-10", created_by: issuer.id })
        .returning("id")
        .executeTakeFirstOrThrow()
    ).id;
  // docs/references.md §6 Example B accuracy, so the evaluation carries an uncertainty budget.
  const channel = await register("cycler-channel", "CH-C1", {
    current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
    voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
    time: { ppm: 100 },
  });
  await register("thermometer", "TH-07", { temperature: { halfWidth: 0.3 } });
  const lot = (
    await getDb()
      .insertInto("lot")
      .values({ identifier: "L-CERT", cell_specification_id: specId, supplier: "Larkfield Supply", quantity_received: 20, received_on: "2026-02-20", created_by: issuer.id, customer: "Quayside Packs Ltd" })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  return { issuer, reviewer, operator, auditor, specId, versionId, channel, lot };
}

type Lab = Awaited<ReturnType<typeof setUpLab>>;
let labPromise: Promise<Lab> | null = null;
const lab = () => (labPromise ??= setUpLab());

/** A run carried out, logged, evaluated and submitted; `ambientOnRest` puts one rest outside 20 °C ± 5 °C. */
async function runToSubmitted(tag: string, options: { ambientOnRest?: number } = {}) {
  const l = await lab();
  const specimen = (
    await getDb()
      .insertInto("specimen")
      .values({ identifier: `SP-${tag}`, cell_specification_id: l.specId, lot_id: l.lot, received_on: "2026-02-26", condition_on_receipt: "intact, 3.48 V", created_by: l.issuer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  const run = await startRun(l.operator, { procedureVersionId: l.versionId, specimenId: specimen, instrumentIds: [l.channel] }, TODAY);
  const built = buildRatedCapacityRun({
    sampleIntervalS: 10,
    ...(options.ambientOnRest !== undefined && { ambient: (stepId: string) => (stepId === "rest" ? [22.5, options.ambientOnRest as number] : [22.5, 22.5]) }),
  });
  for (const record of built.input.stepRecords) await recordStep(l.operator, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(l.operator, run.id, { name: `${tag}.csv`, chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  const evaluation = await evaluateStoredRun(l.operator, run.id, { columns: ingested.columns });
  // The operator confirms the deviations by their count, as the step sheet asks.
  const deviations = listFindings(evaluation).filter((f) => f.outcome === "deviates").length;
  await submitRun(l.operator, run.id, { confirmedDeviations: deviations });
  return { runId: run.id, number: run.number, evaluation, csv: csv.value };
}

/** The accepting review as the review screen writes it: a 'reviewed' signature and the review row, then the run accepted. */
async function accept(runId: string, notes: "all" | "none" = "all") {
  const l = await lab();
  const latest = await getDb().selectFrom("run_evaluation").select(["id", "evaluation"]).where("run_id", "=", runId).orderBy("evaluated_at", "desc").executeTakeFirstOrThrow();
  const deviating = listFindings(parseStoredEvaluation(latest.evaluation)).filter((f) => f.outcome === "deviates");
  const acknowledged = notes === "all" ? deviating.map((f) => ({ findingId: f.id, note: "Cabinet door open for a minute; the rest lasted far beyond its minimum." })) : [];
  const signature = await getDb()
    .insertInto("electronic_signature")
    .values({ signer_id: l.reviewer.id, printed_name: l.reviewer.displayName, meaning: "reviewed", entity_type: "run", entity_id: runId, record_sha256: hashCanonicalJson(latest.evaluation) })
    .returning("id")
    .executeTakeFirstOrThrow();
  await getDb()
    .insertInto("run_review")
    .values({ run_id: runId, reviewer_id: l.reviewer.id, decision: "accepted", comments: "Records complete.", run_evaluation_id: latest.id, acknowledged_deviations: JSON.stringify(acknowledged), signature_id: signature.id })
    .execute();
  await setRunStatus(getDb(), runId, "accepted");
  return deviating;
}

async function countWrites() {
  const db = getDb();
  const [certificates, signatures, files, objects, mail] = await Promise.all([
    db.selectFrom("certificate").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow(),
    db.selectFrom("electronic_signature").select((eb) => eb.fn.countAll<string>().as("n")).where("meaning", "=", "approved").executeTakeFirstOrThrow(),
    db.selectFrom("stored_file").select((eb) => eb.fn.countAll<string>().as("n")).where("purpose", "=", "certificate").executeTakeFirstOrThrow(),
    listObjectKeys("certificates/"),
    db.selectFrom("mail_message").select((eb) => eb.fn.countAll<string>().as("n")).where("kind", "=", "certificate-issued").executeTakeFirstOrThrow(),
  ]);
  return { certificates: Number(certificates.n), signatures: Number(signatures.n), files: Number(files.n), objects: objects.length, mail: Number(mail.n) };
}

function pdfsig(bytes: Uint8Array): string {
  const dir = mkdtempSync(join(tmpdir(), "cellwright-pdfsig-"));
  try {
    const file = join(dir, "c.pdf");
    writeFileSync(file, bytes);
    try {
      return execFileSync("pdfsig", [file], { encoding: "utf8" });
    } catch (error) {
      return String((error as { stdout?: string }).stdout ?? error);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe("run certificates", () => {
  it("issues a signed certificate for an accepted run: certified, stored, audited, auditors told, the hashes recompute", async () => {
    const l = await lab();
    const run = await runToSubmitted("ISSUE");
    expect(run.evaluation.verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "conforms" });
    await accept(run.runId);
    const before = await countWrites();

    const { number } = await issueRunCertificate(l.issuer, run.runId, { password: PASSWORD });
    expect(number).toMatch(/^C-\d{5}$/);
    expect((await getRun(getDb(), run.runId))?.status).toBe("certified");
    expect(await countWrites()).toEqual({ ...before, certificates: before.certificates + 1, signatures: before.signatures + 1, files: before.files + 1, objects: before.objects + 1, mail: before.mail + 1 });

    const view = await getCertificateByNumber(getDb(), number);
    expect(view).toMatchObject({
      number,
      subject: "run",
      runId: run.runId,
      runNumber: run.number,
      lotId: l.lot,
      lotIdentifier: "L-CERT",
      specimenIdentifier: "SP-ISSUE",
      cellSpecificationId: l.specId,
      cellLabel: "Testmoor Cells TM-CERT (INR22/71)",
      verdict: "conforms",
      status: "valid",
      issuedByName: "Ida Issuer",
      replacesNumber: null,
      replacedByNumber: null,
      labName: "Harbourside Cell Test Laboratory",
      signature: { printedName: "Ida Issuer", meaning: "approved" },
    });
    // The approval's time on the record is the issue time the PDF prints.
    expect(view?.signature.signedAt.toISOString()).toBe(view?.issuedAt.toISOString());
    if (view?.payload.subject !== "run") throw new Error("a run certificate states a run");
    // What it states, read back from jsonb, hashes to the stored hash (canonical JSON, sorted keys).
    expect(hashCanonicalJson(view?.payload)).toBe(view?.payloadSha256);
    expect(view?.payload.customer).toBe("Quayside Packs Ltd");
    expect(view?.payload.uncertainty.map((u) => u.quantity)).toEqual(expect.arrayContaining(["capacity", "energy"]));
    expect(view?.payload.instruments.map((i) => [i.identifier, i.calibratedForTesting])).toEqual([
      ["CH-C1", true],
      ["TH-07", true],
    ]);
    const log = await getDb().selectFrom("run_log as rl").innerJoin("stored_file as f", "f.id", "rl.stored_file_id").select("f.sha256").where("rl.run_id", "=", run.runId).executeTakeFirstOrThrow();
    expect(view?.payload.evidence.logs.map((x) => x.sha256)).toEqual([log.sha256]);

    const pdf = await readCertificatePdf(number);
    if (!pdf) throw new Error("the issued PDF must be readable");
    expect(pdf.fileName).toBe(`${number}.pdf`);
    expect(pdfsig(pdf.bytes)).toMatch(/Signature Validation: Signature is Valid\./);
    const check = await checkCertificatePdf(number, pdf.bytes);
    expect(check).toMatchObject({ known: true, byteIdentical: true, signature: { present: true, valid: true, signedByLab: true, signer: "Harbourside Cell Test Laboratory" } });
    const key = await describeLabSigningKey();
    expect(key).toMatchObject({ commonName: "Harbourside Cell Test Laboratory", source: "generated" });
    expect(key.fingerprintSha256).toMatch(/^[0-9a-f]{64}$/);
    writeFileSync("/tmp/cert-integration.pdf", pdf.bytes);

    const mail = await getDb().selectFrom("mail_message").select(["recipients", "subject", "body", "entity_id"]).where("kind", "=", "certificate-issued").where("entity_id", "=", view!.id).executeTakeFirstOrThrow();
    expect(mail.recipients).toEqual([l.auditor.email]);
    expect(mail.subject).toContain(number);
    expect(mail.body).toContain(`/check/${number}`);

    const actions = (await listAuditEvents(getDb(), { entityType: "certificate", entityId: view!.id })).map((e) => e.action);
    expect(actions).toContain("certificate.issue");
    expect((await listAuditEvents(getDb(), { entityType: "run", entityId: run.runId })).map((e) => e.action)).toContain("run.certify");
    expect((await listCertificates(getDb(), { runId: run.runId })).map((c) => c.number)).toEqual([number]);
    expect(await listCertificates(getDb(), { lotId: l.lot, verdict: "does not conform" })).toEqual([]);
    const today = new Date().toISOString().slice(0, 10);
    expect((await listCertificates(getDb(), { cellSpecificationId: l.specId, issuedFrom: today, issuedTo: today })).map((c) => c.number)).toContain(number);
    expect(await listCertificates(getDb(), { issuedTo: "2000-01-01" })).toEqual([]);

    // Signing twice is refused, and changes nothing.
    const after = await countWrites();
    await expect(issueRunCertificate(l.issuer, run.runId, { password: PASSWORD })).rejects.toThrow(/already certified/);
    expect(await countWrites()).toEqual(after);
    // What an issued certificate states and its PDF never change.
    await expect(sql`update certificate set pdf_sha256 = ${"0".repeat(64)} where number = ${number}`.execute(getDb())).rejects.toThrow(/never change/);
    await expect(sql`delete from certificate where number = ${number}`.execute(getDb())).rejects.toThrow(/permission denied/);
    await withOwnerClient((owner) => expect(owner.query(`delete from certificate where number = $1`, [number])).rejects.toThrow(/cannot be deleted/));
  });

  it("refuses the run's operator, a wrong password (audited), and a run that is not accepted, writing nothing", async () => {
    const l = await lab();
    const run = await runToSubmitted("REFUSE");
    const before = await countWrites();
    await expect(issueRunCertificate(l.issuer, run.runId, { password: PASSWORD })).rejects.toThrow(/submitted for review: only an accepted run gets a certificate/);
    await accept(run.runId);
    // An operator has no signing role; the operator of this very run is refused even as an engineer.
    await expect(issueRunCertificate(l.operator, run.runId, { password: PASSWORD })).rejects.toThrow(/Only an engineer/);
    await expect(issueRunCertificate({ ...l.operator, role: "engineer" }, run.runId, { password: PASSWORD })).rejects.toThrow(/You took part in run/);
    await expect(issueRunCertificate(l.issuer, run.runId, { password: "not my password" })).rejects.toThrow(/password is not right/);
    const refused = await listAuditEvents(getDb(), { action: "signature.refused" });
    expect(refused[0]).toMatchObject({ actorLabel: expect.stringContaining("Ida Issuer"), detail: { what: `certificate of run ${run.number}`, reason: "wrong password" } });
    expect(await countWrites()).toEqual(before);
    expect((await getRun(getDb(), run.runId))?.status).toBe("accepted");

    // A transaction that fails after the PDF was stored removes the stored PDF again.
    const { basis, curves } = await gatherRunCertificateBasis(l.issuer, run.runId, "accepted");
    const produced = await produceRunCertificate({ actor: l.issuer, basis, curves, replaces: null });
    expect(await listObjectKeys(`certificates/${produced.id}/`)).toHaveLength(1);
    const failing = { check: async () => {}, record: async () => Promise.reject(new Error("the mail table is gone")) };
    await expect(issueProducedCertificate(l.issuer, produced, { runId: run.runId, lotId: null, replacesId: null, amendmentReason: null }, failing)).rejects.toThrow(/mail table is gone/);
    expect(await listObjectKeys(`certificates/${produced.id}/`)).toEqual([]);
    expect(await countWrites()).toEqual(before);
  });

  it("refuses when the accepted review left a deviation without a note, or a newer evaluation exists than the one reviewed", async () => {
    const l = await lab();
    const unnoted = await runToSubmitted("UNNOTED", { ambientOnRest: 27.5 });
    expect(unnoted.evaluation.verdict.procedureFollowed).toBe("no");
    const deviating = await accept(unnoted.runId, "none");
    expect(deviating.map((f) => f.rule)).toContain("ambient-in-range");
    const before = await countWrites();
    await expect(issueRunCertificate(l.issuer, unnoted.runId, { password: PASSWORD })).rejects.toThrow(/does not note this deviation/);

    const reevaluated = await runToSubmitted("REEVALUATED", { ambientOnRest: 27.5 });
    await accept(reevaluated.runId, "all");
    // The service no longer evaluates an accepted run again; a newer evaluation written past it is still caught.
    await expect(evaluateStoredRun(l.issuer, reevaluated.runId)).rejects.toThrow(/is final and is not evaluated again/);
    const newer = sql`insert into run_evaluation (run_id, run_log_id, procedure_version_id, evaluation, procedure_followed, specimen_conforms, evaluated_at)
      select run_id, run_log_id, procedure_version_id, evaluation, procedure_followed, specimen_conforms, evaluated_at + interval '1 second'
      from run_evaluation where run_id = ${reevaluated.runId} order by evaluated_at desc limit 1`.compile(getDb());
    // The database refuses it (the accepted run is frozen); forged past the trigger, the issuer's check still catches it.
    await expect(getDb().executeQuery(newer)).rejects.toThrow(/has been accepted: its records, logs and evaluations are frozen/);
    await forgeAsOwner("run_evaluation", "run_evaluation_frozen_with_run", newer.sql, [...newer.parameters]);
    await expect(issueRunCertificate(l.issuer, reevaluated.runId, { password: PASSWORD })).rejects.toThrow(/evaluated again after its review/);
    expect(await countWrites()).toEqual(before);
    expect((await getRun(getDb(), unnoted.runId))?.status).toBe("accepted");

    // Each deviation noted by the reviewer: the certificate states them, with the notes.
    const noted = await runToSubmitted("NOTED", { ambientOnRest: 27.5 });
    await accept(noted.runId, "all");
    const { number } = await issueRunCertificate(l.issuer, noted.runId, { password: PASSWORD });
    const view = await getCertificateByNumber(getDb(), number);
    expect(view?.procedureFollowed).toBe("no");
    if (view?.payload.subject !== "run") throw new Error("a run certificate states a run");
    expect(view?.payload.deviations.length).toBe(deviating.length);
    expect(view?.payload.deviations.every((d) => d.reviewerNote?.startsWith("Cabinet door"))).toBe(true);
  });

  it("amends (the old one superseded, the new one names it) and revokes only with a reason and the password", async () => {
    const l = await lab();
    const run = await runToSubmitted("AMEND");
    await accept(run.runId);
    const first = await issueRunCertificate(l.issuer, run.runId, { password: PASSWORD });
    await expect(amendCertificate(l.issuer, first.number, { password: PASSWORD, reason: "   " })).rejects.toThrow(/Say why/);
    await expect(amendCertificate(l.issuer, first.number, { password: "wrong", reason: "Customer name corrected" })).rejects.toThrow(/password is not right/);
    await expect(amendCertificate(l.issuer, "C-99999", { password: PASSWORD, reason: "x" })).rejects.toThrow(/No certificate C-99999/);

    await getDb().updateTable("lot").set({ customer: "Quayside Packs Limited" }).where("id", "=", l.lot).execute();
    const second = await amendCertificate(l.issuer, first.number, { password: PASSWORD, reason: "Customer's legal name corrected" });
    const old = await getCertificateByNumber(getDb(), first.number);
    const replacement = await getCertificateByNumber(getDb(), second.number);
    expect(old).toMatchObject({ status: "superseded", replacedByNumber: second.number });
    expect(replacement).toMatchObject({ status: "valid", replacesNumber: first.number, amendmentReason: "Customer's legal name corrected" });
    expect(replacement?.payload.replaces).toEqual({ number: first.number, reason: "Customer's legal name corrected" });
    expect(replacement?.payload.customer).toBe("Quayside Packs Limited");
    await expect(amendCertificate(l.issuer, first.number, { password: PASSWORD, reason: "again" })).rejects.toThrow(new RegExp(`already replaced by ${second.number}`));
    expect((await listAuditEvents(getDb(), { entityType: "certificate", entityId: old!.id })).map((e) => e.action)).toContain("certificate.supersede");

    await expect(revokeCertificate(l.issuer, second.number, { password: PASSWORD, reason: "" })).rejects.toThrow(/Say why/);
    await expect(revokeCertificate({ ...l.operator, role: "engineer" }, second.number, { password: PASSWORD, reason: "no" })).rejects.toThrow(/You took part in run/);
    await expect(revokeCertificate(l.issuer, second.number, { password: "wrong", reason: "Channel found out of tolerance" })).rejects.toThrow(/password is not right/);
    expect((await getCertificateByNumber(getDb(), second.number))?.status).toBe("valid");
    await revokeCertificate(l.issuer, second.number, { password: PASSWORD, reason: "Cycler channel found out of tolerance at its next calibration" });
    const revoked = await getCertificateByNumber(getDb(), second.number);
    expect(revoked).toMatchObject({ status: "revoked", revokedByName: "Ida Issuer", revocationReason: "Cycler channel found out of tolerance at its next calibration" });
    await expect(revokeCertificate(l.issuer, second.number, { password: PASSWORD, reason: "twice" })).rejects.toThrow(/is revoked/);
    expect((await listAuditEvents(getDb(), { entityType: "certificate", entityId: revoked!.id })).map((e) => e.action)).toContain("certificate.revoke");
    // The revoked PDF is still served exactly as issued.
    expect((await readCertificatePdf(second.number))?.bytes.byteLength).toBeGreaterThan(10_000);
  });

  it("checks a PDF: tampered and foreign files are told apart from the one issued; an unknown number is unknown", async () => {
    const l = await lab();
    const run = await runToSubmitted("CHECK");
    await accept(run.runId);
    const { number } = await issueRunCertificate(l.issuer, run.runId, { password: PASSWORD });
    const pdf = (await readCertificatePdf(number))!.bytes;

    const tampered = Buffer.from(pdf);
    tampered[Math.floor(tampered.length / 3)]! ^= 0x01;
    const tamperedCheck = await checkCertificatePdf(number, tampered);
    expect(tamperedCheck).toMatchObject({ known: true, byteIdentical: false, signature: { present: true, valid: false, signedByLab: false } });
    expect(tamperedCheck.signature.reason).toMatch(/changed after it was signed/);

    const foreignKey = createSelfSignedP12("Harbourside Cell Test Laboratory", "pw");
    const foreign = await signPdf(await import("pdf-lib").then(async ({ PDFDocument }) => PDFDocument.create().then(async (d) => (d.addPage(), d.save()))), { p12: foreignKey, passphrase: "pw" }, {
      reason: "look-alike",
      name: "someone",
      location: "elsewhere",
      contactInfo: "",
      signingTime: new Date(),
    });
    const foreignCheck = await checkCertificatePdf(number, foreign);
    expect(foreignCheck).toMatchObject({ known: true, byteIdentical: false, signature: { present: true, valid: true, signedByLab: false } });
    expect(foreignCheck.signature.reason).toMatch(/not signed by the lab/);

    const unknown = await checkCertificatePdf("C-99999", pdf);
    expect(unknown).toMatchObject({ known: false, byteIdentical: false, signature: { valid: true, signedByLab: true } });
    expect(await readCertificatePdf("C-99999")).toBeNull();
    expect(await getCertificateByNumber(getDb(), "C-99999")).toBeNull();
    const unsigned = await checkCertificatePdf(number, new TextEncoder().encode("%PDF-1.7\n%%EOF\n"));
    expect(unsigned.signature).toMatchObject({ present: false, valid: false, signedByLab: false });
  });

  it("hands out the log and the PDF byte for byte (bundle included, manifest with the recorded hashes), and refuses them once changed or missing", async () => {
    const l = await lab();
    const run = await runToSubmitted("BYTES");
    await accept(run.runId);
    const { number } = await issueRunCertificate(l.issuer, run.runId, { password: PASSWORD });
    const sent = Buffer.from(run.csv);
    const log = await getDb().selectFrom("run_log as rl").innerJoin("stored_file as f", "f.id", "rl.stored_file_id").select(["f.id", "f.sha256", "f.storage_key"]).where("rl.run_id", "=", run.runId).executeTakeFirstOrThrow();
    expect(sent.byteLength).toBeGreaterThan(64 * 1024);
    expect(Buffer.compare(Buffer.from((await readObjectOrNull(log.storage_key))!), sent)).toBe(0);
    const pdf = (await readCertificatePdf(number))!;
    // A two-page certificate is ≈ 48 KB, under one 64 KiB chunk; it is stored by the same putObject as a
    // datasheet, whose round trip above 64 KiB storage-integrity.test.ts checks.
    expect(pdf.bytes.byteLength).toBeGreaterThan(10_000);
    const certificate = await getDb().selectFrom("certificate").select(["pdf_sha256", "payload"]).where("number", "=", number).executeTakeFirstOrThrow();
    expect(pdf.sha256).toBe(certificate.pdf_sha256);

    // The bundle unzips to the very bytes sent; its manifest lists the hashes recorded at upload, which the
    // signed payload states too.
    const dir = mkdtempSync(join(tmpdir(), "cellwright-bundle-"));
    try {
      const zip = join(dir, "evidence.zip");
      const bundle = await buildEvidenceBundle(number, l.auditor);
      writeFileSync(zip, Buffer.from(await new Response(bundle.stream).arrayBuffer()));
      const unzipped = execFileSync("unzip", ["-p", zip, "logs/01-BYTES.csv"]);
      expect(Buffer.compare(unzipped, sent)).toBe(0);
      expect(Buffer.compare(execFileSync("unzip", ["-p", zip, `${number}.pdf`]), pdf.bytes)).toBe(0);
      const manifest = execFileSync("unzip", ["-p", zip, "MANIFEST.txt"], { encoding: "utf8" });
      expect(manifest).toContain(`logs/01-BYTES.csv\t${log.sha256}\t${sent.byteLength}\t`);
      expect(manifest).toContain(`${number}.pdf\t${certificate.pdf_sha256}\t`);
      expect((certificate.payload as { evidence: { logs: { sha256: string }[] } }).evidence.logs.map((x) => x.sha256)).toEqual([log.sha256]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }

    // One byte of the stored log changed: the bundle is refused, naming the log; the refusal is audited.
    const changed = Buffer.from(sent);
    changed[70_000] = changed[70_000] === 0x31 ? 0x32 : 0x31;
    await putObject(log.storage_key, changed, "text/csv");
    await expect(buildEvidenceBundle(number, l.auditor)).rejects.toMatchObject({
      code: "integrity",
      message: expect.stringContaining(`The stored copy of the data log “BYTES.csv” of run ${run.number} does not match the SHA-256 recorded`),
    });
    // The PDF missing from the store: the download is refused, naming the certificate.
    const pdfKey = (await getDb().selectFrom("stored_file").select("storage_key").where("sha256", "=", certificate.pdf_sha256).executeTakeFirstOrThrow()).storage_key;
    await deleteObject(pdfKey);
    await expect(readCertificatePdf(number, l.auditor)).rejects.toThrow(`The stored copy of the PDF of certificate ${number} is missing from the file store.`);
    const faults = await listAuditEvents(getDb(), { action: INTEGRITY_FAULT_ACTION, limit: 10 });
    expect(faults.map((f) => [f.actorLabel.startsWith("Aud Auditor"), (f.detail as { record: string }).record])).toEqual([
      [true, `the PDF of certificate ${number}`],
      [true, `the data log “BYTES.csv” of run ${run.number}`],
    ]);
    // Put the recorded bytes back: both are handed out again.
    await putObject(log.storage_key, sent, "text/csv");
    await putObject(pdfKey, pdf.bytes, "application/pdf");
    expect((await readCertificatePdf(number))?.sha256).toBe(certificate.pdf_sha256);

    // The owner rewrites the file record's hash (its triggers off): verify says the two records disagree.
    const pdfFileId = (await getDb().selectFrom("certificate").select("pdf_file_id").where("number", "=", number).executeTakeFirstOrThrow()).pdf_file_id;
    const owner = new pg.Client({ connectionString: adminUrl(process.env.TEST_DATABASE_URL!, new URL(process.env.DATABASE_URL!).pathname.slice(1)) });
    await owner.connect();
    try {
      const rewrite = async (sha256: string) => {
        await owner.query("begin");
        await owner.query("alter table stored_file disable trigger user");
        await owner.query("update stored_file set sha256 = $1 where id = $2", [sha256, pdfFileId]);
        await owner.query("alter table stored_file enable trigger user");
        await owner.query("commit");
      };
      await rewrite("0".repeat(64));
      expect((await verifyStoredFiles(getDb())).faults.map((f) => f.message)).toContain(`The file record of certificate ${number} states another SHA-256 than the certificate itself: one of the two records was changed.`);
      await rewrite(certificate.pdf_sha256);
      expect((await verifyStoredFiles(getDb())).faults).toEqual([]);
    } finally {
      await owner.end();
    }
  }, 60_000);

  // Issue 11 row 2: a 150 MiB chunked body with no Content-Length was read whole before it was refused.
  it("stops reading a public check upload at its limit, whatever the body's length", async () => {
    const l = await lab();
    const run = await runToSubmitted("HUGE");
    await accept(run.runId);
    const { number } = await issueRunCertificate(l.issuer, run.runId, { password: PASSWORD });
    const { POST } = await import("@/app/api/check/[number]/route");
    const MiB = 1024 * 1024;
    let pulled = 0;
    let cancelled = false;
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (pulled >= 150 * MiB) return controller.close();
        pulled += MiB;
        controller.enqueue(new Uint8Array(MiB));
      },
      cancel() {
        cancelled = true;
      },
    }, { highWaterMark: 0 });
    const req = new Request(`http://localhost/api/check/${number}`, { method: "POST", body, headers: { "content-type": "application/pdf" }, duplex: "half" } as RequestInit);
    const res = await POST(req, { params: Promise.resolve({ number }) });
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toMatch(/larger than 20 MB/);
    expect(pulled).toBeLessThanOrEqual(22 * MiB);
    expect(cancelled).toBe(true);
  });
});
