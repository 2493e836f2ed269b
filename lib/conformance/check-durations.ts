import { assertNever, roundSignificant, type ResolvedValue } from "@/protocols";
import type { Finding } from "./finding";
import { citeProcedure, citeTolerance, formatPercent, formatValue } from "./format-value";
import { createFinding, type StepContext } from "./step-context";
import { readRecordTimes } from "./time-span";
import { isInsideBand, type Band } from "./tolerance-band";

/** How long the step lasted: from its log phase (first to last sample) or, without one, from the recorded times. */
export function observeDuration(context: StepContext): { seconds: number; source: string } | { reason: string } {
  const { evidence } = context;
  if (evidence.kind === "found") return { seconds: evidence.results.durationS, source: "from the data log" };
  const times = readRecordTimes(context.record);
  if ("reason" in times) return { reason: `${evidence.reason}; ${times.reason}` };
  return { seconds: (times.endMs - times.startMs) / 1000, source: "from the recorded start and end" };
}

/**
 * The step lasted between its shortest and longest time, each widened by the time tolerance
 * (IEC 61960-3 clause 4: ±0.1 %, docs/references.md §3, unless the procedure sets its own). The limits
 * are the procedure's: e.g. a rest of 1 h to 4 h after charge for IEC 61960-3 7.3.1 (docs/references.md
 * §2, held in the template as a recalled value).
 */
function checkSpan(context: StepContext, limits: { min?: ResolvedValue; max?: ResolvedValue }): Finding {
  const tolerance = context.step.tolerances.timePercent;
  const share = tolerance.value / 100;
  // The tolerance widens the allowed span on both sides (definition of a ± tolerance).
  const band: Partial<Band> = {
    ...(limits.min && { min: roundSignificant(limits.min.value * (1 - share)) }),
    ...(limits.max && { max: roundSignificant(limits.max.value * (1 + share)) }),
  };
  const words = [limits.min && `at least ${limits.min.explanation}`, limits.max && `at most ${limits.max.explanation}`]
    .filter(Boolean)
    .join(" and ");
  const bandWords = [band.min !== undefined && `≥ ${formatValue(band.min, "s")}`, band.max !== undefined && `≤ ${formatValue(band.max, "s")}`]
    .filter(Boolean)
    .join(", ");
  const duration = observeDuration(context);
  const isLimitOnly = limits.min === undefined;
  const base = {
    rule: "duration-within-limits" as const,
    title: isLimitOnly ? "Duration within the step's time limit" : `${context.step.kind === "soak" ? "Soak" : "Rest"} duration within its limits`,
    expected: {
      text: `${words}, time tolerance ${formatPercent(tolerance.value)}: ${bandWords}`,
      ...band,
      unit: "s" as const,
    },
    clause: `${citeProcedure(context.citation, "step duration")}; ${citeTolerance(tolerance)}`,
  };
  if ("reason" in duration) {
    return createFinding(context, { ...base, observed: { text: duration.reason }, outcome: "not assessable" });
  }
  return createFinding(context, {
    ...base,
    observed: { text: `${formatValue(duration.seconds, "s")} ${duration.source}`, value: duration.seconds, unit: "s" },
    outcome: isInsideBand(duration.seconds, band) ? "meets" : "deviates",
  });
}

/** Rests and soaks between their shortest and longest time; charges and discharges within a time limit when one is set. */
export function checkDurations(context: StepContext): Finding[] {
  const { step } = context;
  switch (step.kind) {
    case "rest":
    case "soak":
      return [checkSpan(context, { min: step.minDuration, ...(step.maxDuration && { max: step.maxDuration }) })];
    case "charge":
    case "discharge":
      return step.maxDuration ? [checkSpan(context, { max: step.maxDuration })] : [];
    case "pulse":
    case "measure":
    case "observe":
    // A cycle block is judged cycle by cycle from the log in evaluate-endurance.ts.
    case "cycle-block":
      return [];
    default:
      return assertNever(step);
  }
}
