import { apiRoute } from "@/lib/auth/guards";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { DomainError } from "@/lib/errors";
import { withFileRefusalPage } from "@/lib/integrity/file-refusal-page";

/** The certificate's PDF exactly as issued and signed (checked against its recorded SHA-256 first). */
export const GET = apiRoute("/api/certificates/[number]/pdf", "GET", withFileRefusalPage(async (_req, { user, params }) => {
  const number = certificateNumberSchema.parse(params.number);
  const pdf = await readCertificatePdf(number, user);
  if (!pdf) throw new DomainError("not-found", `No certificate ${number}.`);
  return new Response(Buffer.from(pdf.bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${pdf.fileName}"`,
      "x-content-sha256": pdf.sha256,
    },
  });
}));
