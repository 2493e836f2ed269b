import { generateKeyPairSync, randomBytes } from "node:crypto";
import forge from "node-forge";
import { toNameAttribute } from "./x509-names";

const VALID_YEARS = 10;

/**
 * A self-signed X.509 certificate for the lab (RSA 2048, SHA-256, subject = lab name) in a PKCS#12
 * file. The key pair comes from Node's crypto (fast, native); node-forge builds the certificate.
 */
export function createSelfSignedP12(labName: string, passphrase: string, now = new Date()): Buffer {
  const pair = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const privateKey = forge.pki.privateKeyFromPem(pair.privateKey.export({ type: "pkcs1", format: "pem" }).toString());
  const certificate = forge.pki.createCertificate();
  certificate.publicKey = forge.pki.publicKeyFromPem(pair.publicKey.export({ type: "spki", format: "pem" }).toString());
  // A positive serial of 16 random bytes (RFC 5280 4.1.2.2: positive, at most 20 octets).
  certificate.serialNumber = `01${randomBytes(15).toString("hex")}`;
  certificate.validity.notBefore = new Date(now.getTime() - 60_000);
  certificate.validity.notAfter = new Date(now.getTime());
  certificate.validity.notAfter.setUTCFullYear(now.getUTCFullYear() + VALID_YEARS);
  const name = [toNameAttribute("commonName", labName), toNameAttribute("organizationName", labName)];
  certificate.setSubject(name);
  certificate.setIssuer(name);
  certificate.setExtensions([
    { name: "basicConstraints", cA: false },
    { name: "keyUsage", digitalSignature: true, nonRepudiation: true },
    { name: "subjectKeyIdentifier" },
  ]);
  certificate.sign(privateKey, forge.md.sha256.create());
  const asn1 = forge.pkcs12.toPkcs12Asn1(privateKey, [certificate], passphrase, { algorithm: "aes256", friendlyName: labName });
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), "binary");
}
