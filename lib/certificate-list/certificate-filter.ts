import { z } from "zod";

const day = z.iso.date("Use a date as YYYY-MM-DD.");

/** The filters of the certificate list, from a URL's query (page or API); unknown values are dropped. */
export const certificateFilterSchema = z.object({
  lot: z.uuid().optional().catch(undefined),
  spec: z.uuid().optional().catch(undefined),
  from: day.optional().catch(undefined),
  to: day.optional().catch(undefined),
  verdict: z.enum(["conforms", "conditional pass", "conditional fail", "does not conform", "not decided"]).optional().catch(undefined),
});

export type CertificateFilter = z.infer<typeof certificateFilterSchema>;

export function parseCertificateFilter(params: Record<string, string | string[] | undefined> | URLSearchParams): CertificateFilter {
  const get = (k: string) => (params instanceof URLSearchParams ? (params.get(k) ?? undefined) : [params[k]].flat()[0]) || undefined;
  return certificateFilterSchema.parse({ lot: get("lot"), spec: get("spec"), from: get("from"), to: get("to"), verdict: get("verdict") });
}

/** The filter as the db query takes it. */
export function toCertificateQuery(f: CertificateFilter) {
  return { lotId: f.lot, cellSpecificationId: f.spec, issuedFrom: f.from, issuedTo: f.to, verdict: f.verdict };
}
