import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { cellSpecificationInputSchema, createCellSpecification } from "@/lib/specs/cell-specifications";

export const GET = apiRoute("/api/specs", "GET", async (req) => {
  const q = new URL(req.url).searchParams.get("q")?.slice(0, 100) || undefined;
  return Response.json({ specifications: await listCellSpecifications(getDb(), { q }) });
});

export const POST = apiRoute("/api/specs", "POST", async (req, { user }) => {
  const input = await readJson(req, cellSpecificationInputSchema);
  const id = await createCellSpecification(user, input);
  return Response.json({ id }, { status: 201 });
});
