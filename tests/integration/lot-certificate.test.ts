import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listAuditEvents } from "@/db/audit";
import { getCertificateByNumber, listCertificates } from "@/db/certificates";
import { upsertLab } from "@/db/lab";
import { closePool } from "@/db/pool";
import { setRunStatus } from "@/db/runs";
import { formatLogCsv } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { amendCertificate, revokeCertificate } from "@/lib/certificates/amend-certificate";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { checkCertificatePdf } from "@/lib/certificates/check-pdf";
import { issueRunCertificate } from "@/lib/certificates/issue-certificate";
import { issueLotCertificate } from "@/lib/certificates/issue-lot-certificate";
import { buildEvidenceBundle } from "@/lib/evidence/evidence-bundle";
import { addDays } from "@/lib/instruments/calendar-date";
import { readLabToday } from "@/lib/instruments/lab-today";
import { drawLotSample, setLotSamplingPlan } from "@/lib/lots";
import { evaluateStoredRun } from "@/lib/runs/evaluate-stored-run";
import { ingestLog } from "@/lib/runs/ingest-log";
import { recordStep } from "@/lib/runs/record-step";
import { startRun } from "@/lib/runs/start-run";
import { submitRun } from "@/lib/runs/submit-run";
import { createLot, lotInputSchema } from "@/lib/lots/lot-records";
import { createSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";
import { createCellSpecification } from "@/lib/specs/cell-specifications";
import { listObjectKeys } from "@/lib/storage";
import { buildRatedCapacityRun, inventedCell, type BuiltRun } from "@/scenarios/rated-capacity-run";
import { makeUser, ELAPSED_LOG_MAPPING as MAPPING, chunksOf, setPassword, releaseRatedCapacityProcedure } from "./fixtures";

// Each test database gets its own generated lab key, in a folder of this file's own.
const signingDir = mkdtempSync(join(tmpdir(), "cellwright-signing-"));
process.env.CELLWRIGHT_SIGNING_DIR = signingDir;
const scratch = mkdtempSync(join(tmpdir(), "cellwright-lot-certificate-"));
afterAll(async () => {
  rmSync(signingDir, { recursive: true, force: true });
  rmSync(scratch, { recursive: true, force: true });
  // pg's pool.end() resolves before its sockets close; the database is dropped (with force) right after.
  await closePool();
  await new Promise((resolve) => setTimeout(resolve, 300));
});

const PASSWORD = "correct horse battery staple";
const today = readLabToday();
const withPassword = (user: SignedInUser) => setPassword(user, PASSWORD);

async function setUpLab() {
  const issuer = await withPassword(await makeUser("engineer", "Ida Issuer"));
  const reviewer = await makeUser("engineer", "Rex Reviewer");
  const operator = await withPassword(await makeUser("operator", "Oda Operator"));
  const auditor = await makeUser("auditor", "Aud Auditor");
  await upsertLab(getDb(), { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere", accreditation: null });
  const specId = await createCellSpecification(issuer, { maker: "Testmoor Cells", model: "TM-LOTC", data: inventedCell });
  const { procedureId, versionId } = await releaseRatedCapacityProcedure(issuer, reviewer, "T-LOTC");
  const channel = (
    await getDb()
      .insertInto("instrument")
      .values({ kind: "cycler-channel", identifier: "CH-LOTC", serial: "S-LOTC", accuracy: JSON.stringify({}), calibration_certificate: "CAL-LOTC", calibrated_on: addDays(today, -100), due_on: addDays(today, 200), created_by: issuer.id })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
  return { issuer, reviewer, operator, auditor, specId, procedureId, versionId, channel };
}

type Lab = Awaited<ReturnType<typeof setUpLab>>;
let labPromise: Promise<Lab> | null = null;
const lab = () => (labPromise ??= setUpLab());
let counter = 0;

/** A lot of `size` cells with the plan II / AQL 1.0 of the acceptance procedure; with `draw`, its sample drawn. */
async function makeLot(size: number, options: { plan?: boolean; draw?: boolean } = {}) {
  const l = await lab();
  const identifier = `IT-LC-${++counter}`;
  const id = await createLot(
    l.operator,
    lotInputSchema.parse({ identifier, cellSpecificationId: l.specId, supplier: "Fernhollow Components", quantityReceived: size, receivedOn: addDays(today, -5), customer: "Quayside Packs Ltd" }),
  );
  if (options.plan !== false) await setLotSamplingPlan(l.issuer, id, { inspectionLevel: "II", aql: "1.0", acceptanceProcedureId: l.procedureId });
  const positions = options.plan !== false && options.draw !== false ? (await drawLotSample(l.issuer, id, { method: "random", seed: 7 })).positions : [];
  return { id, identifier, positions };
}

async function registerAt(lotId: string, position: number): Promise<string> {
  const l = await lab();
  return createSpecimen(
    l.operator,
    specimenInputSchema.parse({ identifier: `IT-LC-CELL-${++counter}`, cellSpecificationId: l.specId, lotId, lotPosition: position, receivedOn: addDays(today, -5), conditionOnReceipt: "as received" }),
  );
}

// A cell above its rated 3 000 mAh, and one below its 2 900 mAh minimum that fails all five cycles (IEC 61960-3 7.3.1).
const good = buildRatedCapacityRun({ sampleIntervalS: 20 });
const weak = buildRatedCapacityRun({ sampleIntervalS: 20, cycles: 5, cellModel: { capacityMAh: 2700 } });

/** A run carried out by `operator`, logged, evaluated, submitted and accepted by the reviewer. */
async function testCell(specimenId: string, built: BuiltRun, operator?: SignedInUser) {
  const l = await lab();
  const by = operator ?? l.operator;
  const run = await startRun(by, { procedureVersionId: l.versionId, specimenId, instrumentIds: [l.channel] }, today);
  for (const record of built.input.stepRecords) await recordStep(by, run.id, record);
  const csv = formatLogCsv(built.log.columns, { columns: ["time", "voltage", "current"] });
  if (!csv.ok) throw new Error(csv.error.message);
  const ingested = await ingestLog(by, run.id, { name: "log.csv", chunks: chunksOf(csv.value), mapping: MAPPING });
  if (!ingested.ok) throw new Error(ingested.error.message);
  await evaluateStoredRun(by, run.id, { columns: ingested.columns });
  await submitRun(by, run.id);
  const latest = await getDb().selectFrom("run_evaluation").select(["id", "evaluation"]).where("run_id", "=", run.id).orderBy("evaluated_at", "desc").executeTakeFirstOrThrow();
  const signature = await getDb()
    .insertInto("electronic_signature")
    .values({ signer_id: l.reviewer.id, printed_name: l.reviewer.displayName, meaning: "reviewed", entity_type: "run", entity_id: run.id, record_sha256: hashCanonicalJson(latest.evaluation) })
    .returning("id")
    .executeTakeFirstOrThrow();
  await getDb()
    .insertInto("run_review")
    .values({ run_id: run.id, reviewer_id: l.reviewer.id, decision: "accepted", comments: "Records complete.", run_evaluation_id: latest.id, acknowledged_deviations: "[]", signature_id: signature.id })
    .execute();
  await setRunStatus(getDb(), run.id, "accepted");
  return { runId: run.id, number: run.number };
}

async function countWrites() {
  const db = getDb();
  const [certificates, signatures, objects, mail, lotEvents] = await Promise.all([
    db.selectFrom("certificate").select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow(),
    db.selectFrom("electronic_signature").select((eb) => eb.fn.countAll<string>().as("n")).where("meaning", "=", "approved").executeTakeFirstOrThrow(),
    listObjectKeys("certificates/"),
    db.selectFrom("mail_message").select((eb) => eb.fn.countAll<string>().as("n")).where("kind", "=", "certificate-issued").executeTakeFirstOrThrow(),
    db.selectFrom("audit_event").select((eb) => eb.fn.countAll<string>().as("n")).where("action", "=", "lot.certify").executeTakeFirstOrThrow(),
  ]);
  return { certificates: Number(certificates.n), signatures: Number(signatures.n), objects: objects.length, mail: Number(mail.n), lotEvents: Number(lotEvents.n) };
}

function pdfsig(bytes: Uint8Array): string {
  const file = join(scratch, `sig-${++counter}.pdf`);
  writeFileSync(file, bytes);
  try {
    return execFileSync("pdfsig", [file], { encoding: "utf8" });
  } catch (error) {
    return String((error as { stdout?: string }).stdout ?? error);
  }
}

async function readStream(stream: ReadableStream<Uint8Array>): Promise<Buffer> {
  const parts: Uint8Array[] = [];
  for await (const part of stream as unknown as AsyncIterable<Uint8Array>) parts.push(part);
  return Buffer.concat(parts);
}

/** A lot of 3 (ISO 2859-1 II, AQL 1.0: A, arrow down to E, n = 13 ≥ 3, so all 3 inspected, Ac 0, Re 1), every cell tested and conforming. */
async function acceptedLot() {
  const lot = await makeLot(3);
  expect(lot.positions).toHaveLength(3);
  const runs = [];
  for (const position of lot.positions) runs.push(await testCell(await registerAt(lot.id, position), good));
  return { ...lot, runs };
}

describe("lot certificates", () => {
  it("issues the certificate of an accepted lot: signed, stored, audited on the certificate and the lot, auditors told, checkable", async () => {
    const l = await lab();
    const lot = await acceptedLot();
    // One sampled run already has its own certificate: the lot certificate names it.
    const runCertificate = await issueRunCertificate(l.issuer, lot.runs[0]!.runId, { password: PASSWORD });
    const before = await countWrites();

    const { number } = await issueLotCertificate(l.issuer, lot.id, { password: PASSWORD });
    expect(number).toMatch(/^C-\d{5}$/);
    expect(await countWrites()).toEqual({ certificates: before.certificates + 1, signatures: before.signatures + 1, objects: before.objects + 1, mail: before.mail + 1, lotEvents: before.lotEvents + 1 });

    const view = await getCertificateByNumber(getDb(), number);
    expect(view).toMatchObject({
      subject: "lot",
      runId: null,
      runNumber: null,
      lotId: lot.id,
      lotIdentifier: lot.identifier,
      specimenIdentifier: null,
      cellLabel: "Testmoor Cells TM-LOTC (INR22/71)",
      verdict: "lot accepted",
      procedureFollowed: null,
      status: "valid",
      signature: { printedName: "Ida Issuer", meaning: "approved" },
    });
    expect(hashCanonicalJson(view?.payload)).toBe(view?.payloadSha256);
    const payload = view!.payload;
    if (payload.subject !== "lot") throw new Error("a lot certificate states a lot");
    expect(payload.samplingPlan).toMatchObject({ initialCodeLetter: "A", codeLetter: "E", tableSampleSize: 13, sampleSize: 3, acceptanceNumber: 0, rejectionNumber: 1, hundredPercent: true });
    expect(payload.samplingPlan.hundredPercentNote).toMatch(/every cell of the lot is inspected/);
    expect(payload.lotDecision).toMatchObject({ verdict: "accept", words: "lot accepted" });
    expect(payload.customer).toBe("Quayside Packs Ltd");
    expect(payload.lot).toMatchObject({ identifier: lot.identifier, quantityReceived: 3, supplier: "Fernhollow Components" });
    expect(payload.sample.map((c) => c.run)).toEqual(lot.runs.map((r) => r.number));
    expect(payload.sample.map((c) => c.runCertificate)).toEqual([runCertificate.number, null, null]);
    expect(payload.sample.every((c) => c.result === "conforms" && c.capacityMAh !== null && c.capacityMAh > 3000)).toBe(true);
    expect(payload.statistics).toMatchObject({ count: 3, countAtOrAboveRated: 3, minimumCapacityMAh: 2900 });
    expect(payload.cellDecisionRules).toEqual(["simple acceptance"]);
    expect(payload.testing.from).not.toBeNull();
    expect(payload.approval).toMatchObject({ printedName: "Ida Issuer", meaning: "approved" });

    const pdf = await readCertificatePdf(number);
    if (!pdf) throw new Error("the issued PDF must be readable");
    expect(pdfsig(pdf.bytes)).toMatch(/Signature Validation: Signature is Valid\./);
    expect(await checkCertificatePdf(number, pdf.bytes)).toMatchObject({ known: true, byteIdentical: true, signature: { valid: true, signedByLab: true } });
    const file = join(scratch, "lot.pdf");
    writeFileSync(file, pdf.bytes);
    const text = execFileSync("pdftotext", ["-raw", file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    expect(text).toContain(`Lot ${lot.identifier}`);
    expect(text).toContain("Lot accepted");

    expect((await listAuditEvents(getDb(), { entityType: "certificate", entityId: view!.id })).map((e) => e.action)).toContain("certificate.issue");
    const certify = (await listAuditEvents(getDb(), { entityType: "lot", entityId: lot.id })).find((e) => e.action === "lot.certify");
    expect(certify).toMatchObject({ after: { certificate: number, decision: "accept" } });
    const mail = await getDb().selectFrom("mail_message").select(["recipients", "subject", "body"]).where("kind", "=", "certificate-issued").where("entity_id", "=", view!.id).executeTakeFirstOrThrow();
    expect(mail.recipients).toEqual([l.auditor.email]);
    expect(mail.body).toContain(`for lot ${lot.identifier}: lot accepted`);
    // The list's lot filter finds it; its conformity filter (run statements) does not.
    expect((await listCertificates(getDb(), { lotId: lot.id })).map((c) => c.number)).toContain(number);
    expect((await listCertificates(getDb(), { verdict: "conforms" })).map((c) => c.number)).not.toContain(number);

    // The evidence bundle: the lot certificate, the sampled run's certificate, the lot's results, the payload, the trail.
    const bundle = await buildEvidenceBundle(number);
    const zip = join(scratch, "evidence.zip");
    writeFileSync(zip, await readStream(bundle.stream));
    const listing = execFileSync("unzip", ["-Z1", zip], { encoding: "utf8" }).trim().split("\n");
    expect(listing).toEqual(
      expect.arrayContaining(["MANIFEST.txt", `${number}.pdf`, `run-certificates/${runCertificate.number}.pdf`, `lot-${lot.identifier}-results.csv`, "certificate-payload.json", "audit-trail.csv"]),
    );
    const trail = execFileSync("unzip", ["-p", zip, "audit-trail.csv"], { encoding: "utf8" });
    expect(trail).toContain("lot.certify");
    expect(trail).toContain("lot.draw-sample");
    const csv = execFileSync("unzip", ["-p", zip, `lot-${lot.identifier}-results.csv`], { encoding: "utf8" });
    expect(csv.trim().split("\n")).toHaveLength(1 + 3);

    // A second issue is refused, and changes nothing.
    const after = await countWrites();
    await expect(issueLotCertificate(l.issuer, lot.id, { password: PASSWORD })).rejects.toThrow(new RegExp(`already has certificate ${number}\\. To correct it, amend it`));
    expect(await countWrites()).toEqual(after);

    // Amended from the lot as it is now; the old one superseded. Revoked only by someone who ran none of the sample.
    await getDb().updateTable("lot").set({ customer: "Quayside Packs Limited" }).where("id", "=", lot.id).execute();
    const amended = await amendCertificate(l.issuer, number, { password: PASSWORD, reason: "Customer's legal name corrected" });
    expect(await getCertificateByNumber(getDb(), number)).toMatchObject({ status: "superseded", replacedByNumber: amended.number });
    const replacement = await getCertificateByNumber(getDb(), amended.number);
    expect(replacement).toMatchObject({ subject: "lot", lotId: lot.id, verdict: "lot accepted", replacesNumber: number });
    expect(replacement?.payload).toMatchObject({ customer: "Quayside Packs Limited", replaces: { number, reason: "Customer's legal name corrected" } });
    await expect(revokeCertificate({ ...l.operator, role: "engineer" }, amended.number, { password: PASSWORD, reason: "no" })).rejects.toThrow(/You took part in run .*counted in the sample/);
    await revokeCertificate(l.issuer, amended.number, { password: PASSWORD, reason: "Channel found out of tolerance" });
    expect((await getCertificateByNumber(getDb(), amended.number))?.status).toBe("revoked");
  });

  it("refuses without a plan, without a draw, with a pending decision, with a wrong password, and for a signer who ran a sampled cell; nothing written", async () => {
    const l = await lab();
    const before = await countWrites();
    const noPlan = await makeLot(3, { plan: false });
    await expect(issueLotCertificate(l.issuer, noPlan.id, { password: PASSWORD })).rejects.toThrow(/has no sampling plan/);
    const noDraw = await makeLot(3, { draw: false });
    await expect(issueLotCertificate(l.issuer, noDraw.id, { password: PASSWORD })).rejects.toThrow(/sample of lot .* is not drawn yet/);
    const pending = await makeLot(3);
    await testCell(await registerAt(pending.id, pending.positions[0]!), good);
    await expect(issueLotCertificate(l.issuer, pending.id, { password: PASSWORD })).rejects.toThrow(/decision on lot .* is pending \(0 nonconforming of 1 tested; 2 still to test: pending\.\)/);
    await expect(issueLotCertificate(l.operator, pending.id, { password: PASSWORD })).rejects.toThrow(/Only an engineer/);
    await expect(issueLotCertificate(l.issuer, "00000000-0000-4000-8000-000000000000", { password: PASSWORD })).rejects.toThrow(/No such lot/);

    const decided = await acceptedLot();
    await expect(issueLotCertificate(l.issuer, decided.id, { password: "not my password" })).rejects.toThrow(/password is not right/);
    const refused = await listAuditEvents(getDb(), { action: "signature.refused" });
    expect(refused[0]).toMatchObject({ detail: { what: `certificate of lot ${decided.identifier}`, reason: "wrong password" } });
    // The operator of the sampled runs, even with a signing role, may not certify the lot.
    await expect(issueLotCertificate({ ...l.operator, role: "engineer" }, decided.id, { password: PASSWORD })).rejects.toThrow(
      new RegExp(`You took part in runs ${decided.runs.map((r) => r.number).join(", ")}, counted in the sample of lot ${decided.identifier}`),
    );
    expect(await countWrites()).toEqual(before);
  });

  it("certifies a rejected lot as rejected: Re reached before the whole sample is tested", async () => {
    const l = await lab();
    const lot = await makeLot(3);
    await testCell(await registerAt(lot.id, lot.positions[0]!), weak);
    const { number } = await issueLotCertificate(l.issuer, lot.id, { password: PASSWORD });
    const view = await getCertificateByNumber(getDb(), number);
    expect(view?.verdict).toBe("lot rejected");
    if (view?.payload.subject !== "lot") throw new Error("a lot certificate states a lot");
    expect(view.payload.lotDecision.statement).toBe("1 nonconforming of 1 tested reaches the rejection number 1: reject.");
    expect(view.payload.sample.map((c) => c.result)).toEqual(["does not conform", "not tested", "not tested"]);
    expect(view.payload.statistics).toBeNull();
    expect(view.payload.statisticsNote).toMatch(/only one/);
  });
});
