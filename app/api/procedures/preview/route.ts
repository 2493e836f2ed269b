import { z } from "zod";
import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { resolveAgainstSpecification } from "@/lib/procedures/preview";
import { procedureSchema } from "@/protocols";

const previewSchema = z.object({
  specId: z.uuid("Choose a cell specification."),
  definition: procedureSchema,
  acknowledgedCautions: z.array(z.string().max(200)).max(200).default([]),
});

/** Resolves unsaved editor content, so the engineer sees set-points and cautions while writing. */
export const POST = apiRoute("/api/procedures/preview", "POST", async (req) => {
  const { specId, definition, acknowledgedCautions } = await readJson(req, previewSchema);
  return Response.json(await resolveAgainstSpecification({ procedure: definition, specId, acknowledgedCautions }));
});
