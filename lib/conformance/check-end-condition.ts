import type { StepResults } from "@/lib/analysis";
import { assertNever, type ResolvedChargeStep, type ResolvedDischargeStep, type ResolvedStep } from "@/protocols";
import { observeDuration } from "./check-durations";
import type { Finding } from "./finding";
import { citeProcedure, citeTolerance, formatPercent, formatRange, formatValue } from "./format-value";
import { createFinding, explainMissingLog, type StepContext } from "./step-context";
import { createBand, isInsideBand } from "./tolerance-band";

/** A discharge whose last logged voltage stayed above its end voltage plus tolerance: it stopped early. */
export function hasStoppedBeforeEndVoltage(step: ResolvedStep, results: StepResults): boolean {
  if (step.kind !== "discharge" || step.endVoltage === null) return false;
  const band = createBand(step.endVoltage.value, step.tolerances.voltagePercent.value);
  return !isInsideBand(results.endVoltageV, { max: band.max });
}

/**
 * A discharge ends at its end voltage (IEC 61960-3 7.3.1: to the end-of-discharge voltage,
 * docs/references.md §2) within the voltage tolerance (clause 4, ±1 %): the last logged voltage is not
 * above it (stopped early), and no logged voltage is below it (discharged too far).
 */
function checkEndVoltage(context: StepContext, step: ResolvedDischargeStep): Finding {
  const tolerance = step.tolerances.voltagePercent;
  const band = step.endVoltage === null ? null : createBand(step.endVoltage.value, tolerance.value);
  const draft = {
    rule: "end-voltage-reached" as const,
    title: "Discharge ended at the end voltage",
    expected:
      band === null || step.endVoltage === null
        ? { text: "the end voltage is not resolved, so there is nothing to compare with", unit: "V" as const }
        : {
            text: `last voltage ${formatValue(step.endVoltage.value, "V")} ${formatPercent(tolerance.value)} (${formatRange(band, "V")}), none below; ${step.endVoltage.explanation}`,
            value: step.endVoltage.value,
            ...band,
            unit: "V" as const,
          },
    clause: `${citeProcedure(context.citation, "end voltage")}; ${citeTolerance(tolerance)}`,
  };
  const missing = explainMissingLog(context.evidence);
  if (missing !== null || band === null || context.evidence.kind !== "found") {
    return createFinding(context, { ...draft, observed: { text: missing ?? "no set-point" }, outcome: "not assessable" });
  }
  const { endVoltageV, minVoltageV } = context.evidence.results;
  const stoppedEarly = !isInsideBand(endVoltageV, { max: band.max });
  const wentBelow = !isInsideBand(minVoltageV, { min: band.min });
  const words = stoppedEarly
    ? "; stopped before the end voltage"
    : wentBelow
      ? `; discharged below the end voltage, down to ${formatValue(minVoltageV, "V")}`
      : "";
  return createFinding(context, {
    ...draft,
    observed: { text: `last voltage ${formatValue(endVoltageV, "V")}, lowest ${formatValue(minVoltageV, "V")}${words}`, value: endVoltageV, unit: "V" },
    outcome: stoppedEarly || wentBelow ? "deviates" : "meets",
  });
}

/**
 * A CC-CV charge ends when the current falls to the termination current (the manufacturer's
 * declared method, common practice: docs/references.md §2, §12): the last current of the CV part is not
 * above it plus the current tolerance (clause 4, ±1 %). A charge ended by time lasts its time
 * within the time tolerance.
 */
function checkTermination(context: StepContext, step: ResolvedChargeStep): Finding {
  const { termination } = step;
  switch (termination.kind) {
    case "current": {
      const tolerance = step.tolerances.currentPercent;
      const band = termination.current === null ? null : createBand(termination.current.value, tolerance.value);
      const draft = {
        rule: "termination-reached" as const,
        title: "Charge ended at the termination current",
        expected:
          band === null || termination.current === null
            ? { text: "the termination current is not resolved, so there is nothing to compare with", unit: "A" as const }
            : {
                text: `constant-voltage part ending at or below ${formatValue(band.max, "A")} (${formatValue(termination.current.value, "A")} ${formatPercent(tolerance.value)}); ${termination.current.explanation}`,
                value: termination.current.value,
                max: band.max,
                unit: "A" as const,
              },
        clause: `${citeProcedure(context.citation, "termination current")}; ${citeTolerance(tolerance)}`,
      };
      const missing = explainMissingLog(context.evidence);
      if (missing !== null || band === null || context.evidence.kind !== "found") {
        return createFinding(context, { ...draft, observed: { text: missing ?? "no set-point" }, outcome: "not assessable" });
      }
      const last = context.evidence.results.cvTerminationCurrentA;
      if (last === null) {
        return createFinding(context, {
          ...draft,
          observed: { text: "the logged charge has no constant-voltage part, so it did not end on its termination current" },
          outcome: "deviates",
        });
      }
      return createFinding(context, {
        ...draft,
        observed: { text: `last current of the constant-voltage part ${formatValue(last, "A")}`, value: last, unit: "A" },
        outcome: isInsideBand(last, { max: band.max }) ? "meets" : "deviates",
      });
    }
    case "time": {
      const tolerance = step.tolerances.timePercent;
      const band = createBand(termination.duration.value, tolerance.value);
      const draft = {
        rule: "termination-reached" as const,
        title: "Charge ended after its time",
        expected: {
          text: `${termination.duration.explanation} ${formatPercent(tolerance.value)} (${formatRange(band, "s")})`,
          value: termination.duration.value,
          ...band,
          unit: "s" as const,
        },
        clause: `${citeProcedure(context.citation, "charge time")}; ${citeTolerance(tolerance)}`,
      };
      const duration = observeDuration(context);
      if ("reason" in duration) return createFinding(context, { ...draft, observed: { text: duration.reason }, outcome: "not assessable" });
      return createFinding(context, {
        ...draft,
        observed: { text: `${formatValue(duration.seconds, "s")} ${duration.source}`, value: duration.seconds, unit: "s" },
        outcome: isInsideBand(duration.seconds, band) ? "meets" : "deviates",
      });
    }
    default:
      return assertNever(termination);
  }
}

/** End voltage reached by a discharge; termination reached by a charge. */
export function checkEndCondition(context: StepContext): Finding[] {
  const { step } = context;
  switch (step.kind) {
    case "discharge":
      return [checkEndVoltage(context, step)];
    case "charge":
      return [checkTermination(context, step)];
    case "rest":
    case "soak":
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
