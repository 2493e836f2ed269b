import type { z } from "zod";
import { DomainError } from "@/lib/errors";

/** Parses a JSON request body with a zod schema; malformed JSON is a 422 like any invalid input. */
export async function readJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new DomainError("invalid", "The request body is not valid JSON.");
  }
  return schema.parse(body);
}
