import { pdflibAddPlaceholder } from "@signpdf/placeholder-pdf-lib";
import { P12Signer } from "@signpdf/signer-p12";
import { SignPdf } from "@signpdf/signpdf";
import { PDFDocument } from "pdf-lib";

export interface PdfSigningIdentity {
  p12: Buffer;
  passphrase: string;
}

export interface PdfSignatureInfo {
  /** Printed by PDF readers beside the signature, e.g. "Certificate C-00001 issued". */
  reason: string;
  /** The signer's name as readers show it. */
  name: string;
  location: string;
  contactInfo: string;
  signingTime: Date;
}

/**
 * Embeds a PKCS#7 detached signature (adbe.pkcs7.detached, SHA-256) over the whole file but the
 * signature itself: pdf-lib adds the signature field and placeholder, @signpdf fills /ByteRange and
 * /Contents with the lab's key. Nothing may be written to the file afterwards.
 */
export async function signPdf(pdf: Uint8Array, identity: PdfSigningIdentity, info: PdfSignatureInfo): Promise<Buffer> {
  const document = await PDFDocument.load(pdf, { updateMetadata: false });
  pdflibAddPlaceholder({
    pdfDoc: document,
    reason: info.reason,
    name: info.name,
    location: info.location,
    contactInfo: info.contactInfo,
    signingTime: info.signingTime,
    appName: "Cellwright",
  });
  // Object streams would hide the signature dictionary from the byte search that places the signature.
  const prepared = Buffer.from(await document.save({ useObjectStreams: false }));
  const signer = new P12Signer(identity.p12, { passphrase: identity.passphrase });
  return new SignPdf().sign(prepared, signer, info.signingTime);
}
