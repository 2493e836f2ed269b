import { createHash } from "node:crypto";
import forge from "node-forge";
import { fingerprintCertificate, readCommonName } from "./x509-names";

/** What the embedded signature of a PDF says, checked by our own reading of it. */
export interface PdfSignatureReading {
  present: boolean;
  /** The signed ranges hash to the signed digest, the RSA signature verifies, and the ranges cover the whole file. */
  valid: boolean;
  reason: string;
  signer?: string;
  /** The signer certificate's SHA-256 fingerprint, to compare with the lab's. */
  signerFingerprintSha256?: string;
  /** The signing time the signature states (ISO), if it states one. */
  signedAt?: string;
}

const OID = {
  contentType: "1.2.840.113549.1.9.3",
  messageDigest: "1.2.840.113549.1.9.4",
  signingTime: "1.2.840.113549.1.9.5",
  signedData: "1.2.840.113549.1.7.2",
} as const;

const DIGESTS: Record<string, { node: string; forge: () => forge.md.MessageDigest }> = {
  "2.16.840.1.101.3.4.2.1": { node: "sha256", forge: () => forge.md.sha256.create() },
  "2.16.840.1.101.3.4.2.2": { node: "sha384", forge: () => forge.md.sha384.create() },
  "2.16.840.1.101.3.4.2.3": { node: "sha512", forge: () => forge.md.sha512.create() },
  "1.3.14.3.2.26": { node: "sha1", forge: () => forge.md.sha1.create() },
};

const invalid = (reason: string, extra: Partial<PdfSignatureReading> = {}): PdfSignatureReading => ({ present: true, valid: false, reason, ...extra });

/** The last /ByteRange [a b c d] of the file (the signature that covers the most). */
function findByteRange(text: string): number[] | null {
  const pattern = /\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g;
  let last: RegExpExecArray | null = null;
  for (let m = pattern.exec(text); m !== null; m = pattern.exec(text)) last = m;
  return last ? last.slice(1, 5).map(Number) : null;
}

type Asn1 = forge.asn1.Asn1;
const children = (node: Asn1 | undefined): Asn1[] => (node && Array.isArray(node.value) ? (node.value as Asn1[]) : []);
const bytesOf = (node: Asn1 | undefined): string => (node && typeof node.value === "string" ? node.value : "");
const oidOf = (node: Asn1 | undefined): string => forge.asn1.derToOid(bytesOf(node));

/** DER that may be followed by padding: node-forge's options object, which its type declarations leave out. */
const readDer = forge.asn1.fromDer as unknown as (bytes: string, options: { strict: boolean; parseAllBytes: boolean }) => Asn1;
const readDerLenient = (bytes: string) => readDer(bytes, { strict: false, parseAllBytes: false });

/** The authenticated attributes of a SignerInfo, by OID, each with its first value. */
function readAttributes(attributes: Asn1): Map<string, Asn1 | undefined> {
  const map = new Map<string, Asn1 | undefined>();
  for (const attribute of children(attributes)) {
    const [type, values] = children(attribute);
    map.set(oidOf(type), children(values)[0]);
  }
  return map;
}

function readTime(node: Asn1 | undefined): string | undefined {
  if (!node) return undefined;
  try {
    const date = node.type === forge.asn1.Type.UTCTIME ? forge.asn1.utcTimeToDate(bytesOf(node)) : forge.asn1.generalizedTimeToDate(bytesOf(node));
    return date.toISOString();
  } catch {
    return undefined;
  }
}

/**
 * Reads and checks the embedded PKCS#7 signature of a PDF without trusting its producer: finds
 * /ByteRange and /Contents, hashes the two signed ranges, compares the hash with the signed
 * messageDigest attribute, and verifies the RSA signature over the attributes with the signer
 * certificate's public key (RFC 5652 5.4: the attributes are hashed as a SET OF). Changing any
 * byte of the file outside the signature value, or adding bytes, makes it invalid.
 */
export function readPdfSignature(bytes: Uint8Array): PdfSignatureReading {
  const file = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const text = file.toString("latin1");
  if (!text.startsWith("%PDF-")) return { present: false, valid: false, reason: "This file is not a PDF." };
  const range = findByteRange(text);
  if (!range) return { present: false, valid: false, reason: "The file carries no digital signature." };
  const [a, b, c, d] = range as [number, number, number, number];
  if (a !== 0 || b <= a || c <= b || c + d > file.length || file[b] !== 0x3c || file[c - 1] !== 0x3e) {
    return invalid("The signature's byte range does not fit this file: it was changed after signing.");
  }
  if (c + d !== file.length) return invalid("Bytes were added to the file after it was signed: the signature does not cover all of it.");
  // The value is zero-padded to the placeholder's length; DER states its own length, so the padding is left unread.
  const hex = text.slice(b + 1, c - 1);
  if (!/^[0-9a-fA-F]+$/.test(hex) || hex.length % 2 !== 0) return invalid("The signature value is damaged.");

  let signedData: Asn1[];
  let certificates: forge.pki.Certificate[];
  try {
    const contentInfo = readDerLenient(forge.util.hexToBytes(hex));
    const [type, content] = children(contentInfo);
    if (oidOf(type) !== OID.signedData) return invalid("The signature is not a PKCS#7 signed-data structure.");
    signedData = children(children(content)[0]);
    const message = forge.pkcs7.messageFromAsn1(contentInfo) as forge.pkcs7.PkcsSignedData;
    certificates = message.certificates;
  } catch (error) {
    return invalid(`The signature cannot be read: ${(error as Error).message}.`);
  }
  const signerInfo = children(signedData.at(-1))[0];
  const parts = children(signerInfo);
  const issuerAndSerial = parts[1];
  const serial = forge.util.bytesToHex(bytesOf(children(issuerAndSerial)[1]));
  const digestOid = oidOf(children(parts[2])[0]);
  const attributesNode = parts[3]?.tagClass === forge.asn1.Class.CONTEXT_SPECIFIC && parts[3].type === 0 ? parts[3] : undefined;
  const signatureValue = bytesOf(parts.find((p) => p.tagClass === forge.asn1.Class.UNIVERSAL && p.type === forge.asn1.Type.OCTETSTRING));
  const certificate = certificates.find((cert) => cert.serialNumber.replace(/^0+/, "") === serial.replace(/^0+/, "")) ?? certificates[0];
  if (!certificate) return invalid("The signature carries no signer certificate.");
  const signer = readCommonName(certificate);
  const signerFingerprintSha256 = fingerprintCertificate(certificate);
  const digest = DIGESTS[digestOid];
  if (!digest) return invalid(`The signature uses a digest this check does not know (${digestOid}).`, { signer, signerFingerprintSha256 });

  const contentDigest = createHash(digest.node).update(file.subarray(a, b)).update(file.subarray(c, c + d)).digest("binary");
  const attributes = attributesNode ? readAttributes(attributesNode) : null;
  const signedAt = readTime(attributes?.get(OID.signingTime));
  const known = { signer, signerFingerprintSha256, ...(signedAt && { signedAt }) };
  let signedBytes: string;
  if (attributesNode && attributes) {
    if (bytesOf(attributes.get(OID.messageDigest)) !== contentDigest) return invalid("The file was changed after it was signed: its content no longer matches the signed digest.", known);
    const asSet = forge.asn1.create(forge.asn1.Class.UNIVERSAL, forge.asn1.Type.SET, true, children(attributesNode));
    signedBytes = digest.forge().update(forge.asn1.toDer(asSet).getBytes()).digest().getBytes();
  } else {
    signedBytes = contentDigest;
  }
  const publicKey = certificate.publicKey as forge.pki.rsa.PublicKey;
  let verified = false;
  try {
    verified = typeof publicKey.verify === "function" && publicKey.verify(signedBytes, signatureValue);
  } catch {
    verified = false;
  }
  if (!verified) return invalid("The signature value does not verify with the signer's certificate.", known);
  return { present: true, valid: true, reason: "The signature is intact: the file is exactly as signed.", ...known };
}
