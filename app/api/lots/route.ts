import { getDb } from "@/db";
import { listLots } from "@/db/lots";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { createLot, lotInputSchema } from "@/lib/lots/lot-records";

export const GET = apiRoute("/api/lots", "GET", async (req) => {
  const q = new URL(req.url).searchParams.get("q")?.slice(0, 100) || undefined;
  return Response.json({ lots: await listLots(getDb(), { q }) });
});

export const POST = apiRoute("/api/lots", "POST", async (req, { user }) => {
  const input = await readJson(req, lotInputSchema);
  const id = await createLot(user, input);
  return Response.json({ id }, { status: 201 });
});
