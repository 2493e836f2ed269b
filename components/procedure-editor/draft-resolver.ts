import { toNestErrors } from "@hookform/resolvers";
import type { FieldErrors, Resolver } from "react-hook-form";
import { procedureDraftSchema, type ProcedureDraftInput } from "@/lib/procedures/procedure-input";
import type { DraftFormValues } from "./draft-values";
import { groupProblemsByPath, listSchemaProblems } from "./schema-problems";

/**
 * The editor's resolver: the server's own schema (procedureDraftSchema), with union problems
 * narrowed to the form the value is written in (see listSchemaProblems). zodResolver would list
 * the problems of every form a current may take against a single blank field.
 */
export const draftResolver: Resolver<DraftFormValues, unknown, ProcedureDraftInput> = async (values, _context, options) => {
  const result = procedureDraftSchema.safeParse(values);
  if (result.success) return { values: result.data, errors: {} };
  const flat = groupProblemsByPath(listSchemaProblems(result.error.issues)) as FieldErrors;
  return { values: {}, errors: toNestErrors(flat, options) };
};
