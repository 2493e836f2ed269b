import { ZodError } from "zod";
import { planSampling, type InspectionLevel, type InspectionSeverity, type SamplingPlan } from "@/lib/lots/sampling";

/** A refusal tied to one input, answered like any invalid field: 422 from the API, an error beside the field in a form. */
export function fieldRefusal(field: string, message: string): ZodError {
  return new ZodError([{ code: "custom", path: [field], message, input: undefined }]);
}

/** "1.0" or 1 → 1; text that is no number is refused here, a number that is no column by planSampling. */
export function readAql(aql: number | string): number {
  const value = typeof aql === "number" ? aql : Number(aql.trim().replace(",", "."));
  if (typeof aql === "string" && (aql.trim() === "" || !Number.isFinite(value))) {
    throw fieldRefusal("aql", `The AQL is a percentage from the table, such as 0.65 or 1.0 (got "${aql}").`);
  }
  return value;
}

/** planSampling for a lot, its refusal thrown as a field error. */
export function computeSamplingPlan(input: { lotSize: number; inspectionLevel: string; aql: number | string; severity?: string }): SamplingPlan {
  const result = planSampling({
    lotSize: input.lotSize,
    // planSampling checks both against its lists and names the choices when they are not on them.
    inspectionLevel: input.inspectionLevel as InspectionLevel,
    aql: readAql(input.aql),
    severity: (input.severity ?? "normal") as InspectionSeverity,
  });
  if (!result.ok) throw fieldRefusal(result.error.field, result.error.message);
  return result.plan;
}
