import { fieldRefusal } from "./compute-sampling-plan";
import { lotSampleDrawInputSchema, lotSamplingPlanInputSchema, type LotSampleDrawInput, type LotSamplingPlanInput } from "./sampling-plan-input";

const reader = (form: FormData) => (k: string) => String(form.get(k) ?? "").trim();

/** The sampling plan form: level, AQL as the table heads it, and the acceptance procedure ("" = any). */
export function readSamplingPlanForm(form: FormData): LotSamplingPlanInput {
  const text = reader(form);
  return lotSamplingPlanInputSchema.parse({
    inspectionLevel: text("inspectionLevel"),
    aql: text("aql"),
    acceptanceProcedureId: text("acceptanceProcedureId") || null,
  });
}

/** Positions typed as "3, 17 42;58": any mix of commas, semicolons and spaces between whole numbers. */
export function readPositionList(text: string): number[] {
  const parts = text.split(/[\s,;]+/).filter((p) => p !== "");
  if (parts.length === 0) throw fieldRefusal("positions", "List the drawn tray positions, separated by commas or spaces.");
  const notNumbers = parts.filter((p) => !/^\d+$/.test(p));
  if (notNumbers.length > 0) throw fieldRefusal("positions", `Tray positions are whole numbers; ${notNumbers.map((p) => `"${p}"`).join(", ")} is not.`);
  return parts.map(Number);
}

/** The draw forms: "random" with an optional seed, or "chosen" with the positions typed in. */
export function readDrawForm(form: FormData): LotSampleDrawInput {
  const text = reader(form);
  if (text("method") === "chosen") return lotSampleDrawInputSchema.parse({ method: "chosen", positions: readPositionList(text("positions")) });
  const seed = text("seed");
  if (seed !== "" && !/^\d+$/.test(seed)) throw fieldRefusal("seed", "The seed is a whole number from 0 to 4 294 967 295, or empty.");
  return lotSampleDrawInputSchema.parse({ method: "random", ...(seed !== "" && { seed: Number(seed) }) });
}
