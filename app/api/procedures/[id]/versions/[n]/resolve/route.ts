import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { resolveAgainstSpecification, resolveRequestSchema } from "@/lib/procedures/preview";
import { canSeeVersion } from "@/lib/procedures/read-access";
import { versionParamsSchema } from "@/lib/procedures/version-params";

export const POST = apiRoute("/api/procedures/[id]/versions/[n]/resolve", "POST", async (req, { user, params }) => {
  const { id, n } = versionParamsSchema.parse(params);
  const { specId } = await readJson(req, resolveRequestSchema);
  const version = await getProcedureVersion(getDb(), id, n);
  if (!version || !canSeeVersion(user, version.status)) throw new DomainError("not-found", "No such procedure version.");
  const resolved = await resolveAgainstSpecification({ procedure: version.definition, specId, acknowledgedCautions: version.acknowledgedCautions });
  return Response.json(resolved);
});
