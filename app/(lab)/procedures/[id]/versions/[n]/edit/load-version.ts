import "server-only";
import { cache } from "react";
import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { versionParamsSchema } from "@/lib/procedures/version-params";

/** The version the edit page is about, read once per request (by the layout and the page). */
export const loadVersionForEdit = cache(async (id: string, n: string) => {
  const parsed = versionParamsSchema.safeParse({ id, n });
  if (!parsed.success) return null;
  return getProcedureVersion(getDb(), parsed.data.id, parsed.data.n);
});
