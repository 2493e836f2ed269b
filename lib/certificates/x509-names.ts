import forge from "node-forge";

const PRINTABLE = /^[A-Za-z0-9 '()+,\-./:=?]*$/;

/**
 * A name attribute in the ASN.1 string type that survives node-forge's round trip: PrintableString
 * when the text allows it, else BMPString (UCS-2). forge re-encodes a parsed UTF8String a second
 * time when it writes the signer's issuer into a PKCS#7 signature, which would garble non-ASCII
 * lab names; a BMPString's bytes are copied as they are.
 */
export function toNameAttribute(name: "commonName" | "organizationName", text: string): forge.pki.CertificateField {
  if (PRINTABLE.test(text)) return { name, value: text, valueTagClass: forge.asn1.Type.PRINTABLESTRING as unknown as forge.asn1.Class };
  let ucs2 = "";
  for (const char of text) {
    const code = char.codePointAt(0) as number;
    const unit = code > 0xffff ? 0xfffd : code;
    ucs2 += String.fromCharCode(unit >> 8, unit & 0xff);
  }
  return { name, value: ucs2, valueTagClass: forge.asn1.Type.BMPSTRING as unknown as forge.asn1.Class };
}

/** An attribute value as text, whatever string type the certificate used. */
export function readNameAttribute(field: { value?: unknown; valueTagClass?: unknown }): string {
  const raw = typeof field.value === "string" ? field.value : "";
  switch (field.valueTagClass) {
    case forge.asn1.Type.UTF8:
      try {
        return forge.util.decodeUtf8(raw);
      } catch {
        return raw;
      }
    case forge.asn1.Type.BMPSTRING: {
      let out = "";
      for (let i = 0; i + 1 < raw.length; i += 2) out += String.fromCharCode((raw.charCodeAt(i) << 8) | raw.charCodeAt(i + 1));
      return out;
    }
    default:
      return raw;
  }
}

/** "CN=…, O=…" of a certificate's subject, for people. */
export function describeSubject(certificate: forge.pki.Certificate): string {
  return certificate.subject.attributes
    .map((a) => `${a.shortName ?? a.name ?? a.type}=${readNameAttribute(a)}`)
    .join(", ");
}

/** The subject's common name, or the whole subject when it has none. */
export function readCommonName(certificate: forge.pki.Certificate): string {
  const cn = certificate.subject.getField("CN") as { value?: unknown; valueTagClass?: unknown } | null;
  return cn ? readNameAttribute(cn) : describeSubject(certificate);
}

/** SHA-256 of the certificate's DER encoding, hex: the fingerprint people compare. */
export function fingerprintCertificate(certificate: forge.pki.Certificate): string {
  const der = forge.asn1.toDer(forge.pki.certificateToAsn1(certificate)).getBytes();
  return forge.md.sha256.create().update(der).digest().toHex();
}
