import "server-only";
import { z } from "zod";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { DomainError } from "@/lib/errors";
import { resolveProcedure, type Procedure, type ResolveProcedureResult } from "@/protocols";

export const resolveRequestSchema = z.object({ specId: z.uuid("Choose a cell specification.") });

/** Resolves a procedure against a stored cell specification: the preview an engineer checks. */
export async function resolveAgainstSpecification(input: {
  procedure: Procedure;
  specId: string;
  acknowledgedCautions: readonly string[];
}): Promise<{ specification: { id: string; maker: string; model: string; designation: string }; result: ResolveProcedureResult }> {
  const spec = await getCellSpecification(getDb(), input.specId);
  if (!spec) throw new DomainError("not-found", "No such cell specification.");
  const result = resolveProcedure({ procedure: input.procedure, cellSpecification: spec.data, acknowledgedCautions: input.acknowledgedCautions });
  return { specification: { id: spec.id, maker: spec.maker, model: spec.model, designation: spec.designation }, result };
}
