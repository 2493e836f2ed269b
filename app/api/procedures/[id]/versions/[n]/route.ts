import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { canSeeVersion } from "@/lib/procedures/read-access";
import { versionParamsSchema } from "@/lib/procedures/version-params";

export const GET = apiRoute("/api/procedures/[id]/versions/[n]", "GET", async (_req, { user, params }) => {
  const { id, n } = versionParamsSchema.parse(params);
  const version = await getProcedureVersion(getDb(), id, n);
  if (!version || !canSeeVersion(user, version.status)) throw new DomainError("not-found", "No such procedure version.");
  return Response.json({ version });
});
