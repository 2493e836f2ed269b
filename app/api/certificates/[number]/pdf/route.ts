import { apiRoute } from "@/lib/auth/guards";
import { readCertificatePdf } from "@/lib/certificates/certificate-pdf";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { DomainError } from "@/lib/errors";
import { sha256Hex } from "@/lib/storage";

/** The certificate's PDF exactly as issued and signed. */
export const GET = apiRoute<{ number: string }>("certificate.read", async (_req, { params }) => {
  const number = certificateNumberSchema.parse(params.number);
  const pdf = await readCertificatePdf(number);
  if (!pdf) throw new DomainError("not-found", `No certificate ${number}.`);
  return new Response(Buffer.from(pdf.bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${pdf.fileName}"`,
      "x-content-sha256": sha256Hex(pdf.bytes),
    },
  });
});
