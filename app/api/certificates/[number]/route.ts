import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { apiRoute } from "@/lib/auth/guards";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { toCertificateJson } from "@/lib/certificate-list/certificate-json";
import { DomainError } from "@/lib/errors";

export const GET = apiRoute("/api/certificates/[number]", "GET", async (_req, { params }) => {
  const number = certificateNumberSchema.parse(params.number);
  const certificate = await getCertificateByNumber(getDb(), number);
  if (!certificate) throw new DomainError("not-found", `No certificate ${number}.`);
  return Response.json({ certificate: toCertificateJson(certificate) });
});
