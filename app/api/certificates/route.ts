import { getDb } from "@/db";
import { listCertificatesPage } from "@/db/certificates";
import { apiRoute } from "@/lib/auth/guards";
import { parseCertificateFilter, toCertificateQuery } from "@/lib/certificate-list/certificate-filter";
import { toCertificateJson } from "@/lib/certificate-list/certificate-json";
import { API_PAGE_SIZE, parsePageNumber } from "@/lib/lists/list-params";

/**
 * Issued certificates, newest first, a page at a time (`page`, `pageCount` and `total` say where it stands);
 * ?lot=&spec=&from=YYYY-MM-DD&to=&verdict= as on the list page, &page=N for the next.
 */
export const GET = apiRoute("/api/certificates", "GET", async (req) => {
  const params = new URL(req.url).searchParams;
  const filter = parseCertificateFilter(params);
  const found = await listCertificatesPage(getDb(), toCertificateQuery(filter), {
    page: parsePageNumber({ page: params.get("page") ?? undefined }),
    pageSize: API_PAGE_SIZE,
    sort: "issued",
    direction: "desc",
  });
  return Response.json({ certificates: found.rows.map(toCertificateJson), page: found.page, pageCount: found.pageCount, total: found.total });
});
