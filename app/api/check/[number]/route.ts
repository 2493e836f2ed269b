import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { readLimitedBody, readLimitedForm } from "@/lib/api/limited-body";
import { checkCertificatePdf } from "@/lib/certificates/check-pdf";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { toPublicCertificate } from "@/lib/certificate-list/public-certificate";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";

export const dynamic = "force-dynamic";

/** A certificate PDF is a few hundred kB; anything far larger is not one of ours. */
const MAX_PDF_BYTES = 20 * 1024 * 1024;

async function findCertificate(params: { number: string }) {
  const number = certificateNumberSchema.parse(params.number);
  const certificate = await getCertificateByNumber(getDb(), number);
  if (!certificate) throw new DomainError("not-found", `No certificate ${number} was issued by this laboratory.`);
  return certificate;
}

/** Public (no sign-in): the certificate's state and what it states. */
export const GET = apiRoute("/api/check/[number]", "GET", async (_req, { params }) => {
  return Response.json({ certificate: toPublicCertificate(await findCertificate(params)) });
});

/**
 * Public (no sign-in), changes nothing: is this PDF byte-identical to the one issued, and does its
 * embedded signature verify? Body: the PDF itself, or a form with the file in field "pdf".
 */
export const POST = apiRoute("/api/check/[number]", "POST", async (req, { params }) => {
  const certificate = await findCertificate(params);
  const bytes = await readPdf(req);
  if (bytes.byteLength === 0) throw new DomainError("invalid", "Choose a PDF file to check.");
  const result = await checkCertificatePdf(certificate.number, bytes);
  return Response.json({ certificate: toPublicCertificate(certificate), check: result });
});

const tooLarge = () => "That file is larger than 20 MB; a certificate PDF is much smaller.";

/** Read as it arrives and never past the limit: this route is public, so nobody may make the server hold more. */
async function readPdf(req: Request): Promise<Uint8Array> {
  const type = req.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) {
    // A form carries its field headers and boundaries around the file.
    const form = await readLimitedForm(req, MAX_PDF_BYTES + 64 * 1024, tooLarge);
    const file = form.get("pdf");
    if (!(file instanceof File)) throw new DomainError("invalid", "Choose a PDF file to check.");
    return new Uint8Array(await file.arrayBuffer());
  }
  if (type.startsWith("application/pdf") || type.startsWith("application/octet-stream")) return readLimitedBody(req, MAX_PDF_BYTES, tooLarge);
  throw new DomainError("invalid", "Send the PDF itself (content-type application/pdf) or a form with the file in field \"pdf\".");
}
