import { readJson } from "@/lib/api/read-json";
import { apiRoute } from "@/lib/auth/guards";
import { computeSamplingPlan } from "@/lib/lots/sampling/compute-sampling-plan";
import { samplingPlanRequestSchema } from "@/lib/lots/sampling/sampling-plan-input";

/**
 * The ISO 2859-1 single sampling plan (normal inspection) for a lot size, inspection level and AQL,
 * for tools outside the workbench. Nothing is stored. An impossible plan answers 422 naming the field.
 */
export const POST = apiRoute("/api/sampling-plan", "POST", async (req) => {
  const request = await readJson(req, samplingPlanRequestSchema);
  return Response.json({ plan: computeSamplingPlan(request) });
});
