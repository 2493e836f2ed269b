import { apiRoute } from "@/lib/auth/guards";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { buildEvidenceBundle } from "@/lib/evidence/evidence-bundle";
import { withFileRefusalPage } from "@/lib/integrity/file-refusal-page";

/** A zip for an assessor: certificate, raw logs, findings, payload, audit trail, manifest of hashes. */
export const GET = apiRoute("/api/certificates/[number]/evidence", "GET", withFileRefusalPage(async (_req, { user, params }) => {
  const number = certificateNumberSchema.parse(params.number);
  const bundle = await buildEvidenceBundle(number, user);
  return new Response(bundle.stream, {
    headers: { "content-type": "application/zip", "content-disposition": `attachment; filename="${bundle.fileName}"` },
  });
}));
