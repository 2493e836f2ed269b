import { z } from "zod";
import { getDb } from "@/db";
import { listSpecimens } from "@/db/specimens";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { createSpecimen, specimenInputSchema } from "@/lib/specimens/specimens";

const querySchema = z.object({
  q: z.string().trim().max(100).optional(),
  lot: z.uuid({ error: "lot is a lot's id" }).optional(),
});

export const GET = apiRoute("/api/specimens", "GET", async (req) => {
  const { q, lot } = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return Response.json({ specimens: await listSpecimens(getDb(), { q: q || undefined, lotId: lot }) });
});

export const POST = apiRoute("/api/specimens", "POST", async (req, { user }) => {
  const input = await readJson(req, specimenInputSchema);
  const id = await createSpecimen(user, input);
  return Response.json({ id }, { status: 201 });
});
