import { getDb } from "@/db";
import { listProcedures, type ProcedureStatus } from "@/db/procedures";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { createProcedure } from "@/lib/procedures/lifecycle";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";

const STATUSES: ProcedureStatus[] = ["draft", "in_review", "released", "withdrawn"];

export const GET = apiRoute("/api/procedures", "GET", async (req, { user }) => {
  const url = new URL(req.url);
  const status = STATUSES.find((s) => s === url.searchParams.get("status"));
  const procedures = await listProcedures(getDb(), {
    q: url.searchParams.get("q")?.slice(0, 100) || undefined,
    status,
    releasedOnly: !can(user.role, "procedure.author"),
  });
  return Response.json({ procedures });
});

export const POST = apiRoute("/api/procedures", "POST", async (req, { user }) => {
  const input = await readJson(req, procedureDraftSchema);
  const created = await createProcedure(user, input);
  return Response.json(created, { status: 201 });
});
