import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { judgeLabSignature } from "@/lib/certificates/judge-lab-signature";
import { renderCertificatePdf } from "@/lib/certificates/render-certificate";
import { createSelfSignedP12 } from "@/lib/certificates/self-signed-p12";
import { signPdf } from "@/lib/certificates/sign-pdf";
import { readPdfSignature } from "@/lib/certificates/verify-pdf-signature";
import { fingerprintCertificate } from "@/lib/certificates/x509-names";
import forge from "node-forge";
import { buildFixturePayload } from "@/scenarios/run-certificate";

// The embedded signature is checked by an independent verifier: Debian's pdfsig (poppler-utils), which
// implements the PDF signature rules (ISO 32000-1 12.8: /ByteRange over the whole file but the
// signature value, a PKCS#7 detached signature, RFC 5652) [published]. Our own verifier must agree.
const dir = mkdtempSync(join(tmpdir(), "cellwright-signature-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function pdfsig(bytes: Uint8Array, name: string): string {
  const file = join(dir, `${name}.pdf`);
  writeFileSync(file, bytes);
  try {
    return execFileSync("pdfsig", [file], { encoding: "utf8" });
  } catch (error) {
    // pdfsig exits non-zero when a signature does not verify; its report is still on stdout.
    return String((error as { stdout?: string }).stdout ?? "");
  }
}

function labCertificateFingerprint(p12: Buffer, passphrase: string): string {
  const parsed = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(p12.toString("binary")), false, passphrase);
  const cert = parsed.getBags({ bagType: "1.2.840.113549.1.12.10.1.3" })["1.2.840.113549.1.12.10.1.3"]?.[0]?.cert;
  if (!cert) throw new Error("no certificate in the test key");
  return fingerprintCertificate(cert);
}

describe("the certificate's digital signature, checked by pdfsig and by our verifier", async () => {
  const labKey = createSelfSignedP12("Harbourside Cell Test Laboratory", "lab");
  const labFingerprint = labCertificateFingerprint(labKey, "lab");
  const { payload, curves } = buildFixturePayload({ uncertainty: false });
  const unsigned = await renderCertificatePdf({ payload, payloadSha256: hashCanonicalJson(payload), curves, checkUrl: "http://localhost:3000/check/C-00042", signingSubject: "Harbourside Cell Test Laboratory" });
  const info = { reason: "Test certificate C-00042 approved for issue", name: "Harbourside Cell Test Laboratory", location: "Portmere", contactInfo: "http://localhost:3000/check/C-00042", signingTime: new Date("2026-03-04T09:30:00Z") };
  const signed = await signPdf(unsigned, { p12: labKey, passphrase: "lab" }, info);

  it("is a valid PKCS#7 detached SHA-256 signature over the whole document", () => {
    const report = pdfsig(signed, "signed");
    expect(report).toContain("Signature Validation: Signature is Valid.");
    expect(report).toContain("Total document signed");
    expect(report).toContain("Signature Type: adbe.pkcs7.detached");
    expect(report).toContain("Signing Hash Algorithm: SHA-256");
    expect(report).toContain("Signer Certificate Common Name: Harbourside Cell Test Laboratory");
    const reading = readPdfSignature(signed);
    expect(reading).toMatchObject({ present: true, valid: true, signer: "Harbourside Cell Test Laboratory", signedAt: "2026-03-04T09:30:00.000Z" });
    expect(judgeLabSignature(reading, labFingerprint)).toMatchObject({ valid: true, signedByLab: true });
  });

  it("breaks when one byte inside the signed range changes: both verifiers say invalid", () => {
    const text = signed.toString("latin1");
    const [, a, b] = /\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)/.exec(text)!.map(Number) as number[];
    // A byte of page content well before the signature value: inside the first signed range [a, b).
    const at = Math.floor(((a ?? 0) + (b ?? 0)) / 2);
    const changed = Buffer.from(signed);
    changed[at] = changed[at] === 0x41 ? 0x42 : 0x41;
    const report = pdfsig(changed, "changed");
    expect(report).not.toContain("Signature is Valid");
    expect(report).toMatch(/Signature Validation: (Digest Mismatch|Signature is Invalid)/);
    const reading = readPdfSignature(changed);
    expect(reading).toMatchObject({ present: true, valid: false });
    expect(judgeLabSignature(reading, labFingerprint).signedByLab).toBe(false);
  });

  it("does not cover bytes appended after signing: pdfsig says so, and our verifier calls it invalid", () => {
    const appended = Buffer.concat([signed, Buffer.from("\n% appended after signing\n")]);
    expect(pdfsig(appended, "appended")).toContain("Not total document signed");
    expect(readPdfSignature(appended)).toMatchObject({ valid: false, reason: expect.stringMatching(/added to the file after it was signed/) });
  });

  it("tells a PDF validly signed with another key apart: valid, but not signed by the lab", async () => {
    const otherKey = createSelfSignedP12("Harbourside Cell Test Laboratory", "other");
    const foreign = await signPdf(unsigned, { p12: otherKey, passphrase: "other" }, info);
    expect(pdfsig(foreign, "foreign")).toContain("Signature is Valid");
    const judged = judgeLabSignature(readPdfSignature(foreign), labFingerprint);
    expect(judged).toMatchObject({ present: true, valid: true, signedByLab: false });
    expect(judged.reason).toMatch(/not signed by the lab/);
  });

  it("reports an unsigned PDF as carrying no signature", () => {
    expect(pdfsig(unsigned, "unsigned")).toMatch(/does not contain any signatures/);
    expect(readPdfSignature(unsigned)).toMatchObject({ present: false, valid: false });
  });

  it("keeps a non-ASCII lab name readable to pdfsig's signature check", async () => {
    const key = createSelfSignedP12("Prüflabor Größe & Söhne", "x");
    const s = await signPdf(unsigned, { p12: key, passphrase: "x" }, info);
    expect(pdfsig(s, "umlaut")).toContain("Signature is Valid");
    expect(readPdfSignature(s).signer).toBe("Prüflabor Größe & Söhne");
  });
});
