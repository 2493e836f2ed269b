import { getDb } from "@/db";
import { listCertificates } from "@/db/certificates";
import { apiRoute } from "@/lib/auth/guards";
import { parseCertificateFilter, toCertificateQuery } from "@/lib/certificate-list/certificate-filter";
import { toCertificateJson } from "@/lib/certificate-list/certificate-json";

/** Issued certificates, newest first; ?lot=&spec=&from=YYYY-MM-DD&to=&verdict= as on the list page. */
export const GET = apiRoute("/api/certificates", "GET", async (req) => {
  const filter = parseCertificateFilter(new URL(req.url).searchParams);
  const certificates = await listCertificates(getDb(), toCertificateQuery(filter));
  return Response.json({ certificates: certificates.map(toCertificateJson) });
});
