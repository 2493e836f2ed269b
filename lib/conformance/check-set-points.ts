import {
  assertNever,
  roundSignificant,
  type ResolvedSetPoint,
  type ResolvedStep,
  type ResolvedTemperatureRange,
  type ResolvedTolerance,
  type ResolvedValue,
} from "@/protocols";
import type { Finding, FindingDraft, FindingUnit } from "./finding";
import { citeProcedure, citeTolerance, formatPercent, formatRange, formatValue } from "./format-value";
import { createFinding, noRecordReason, type StepContext } from "./step-context";
import type { ProgrammedField } from "./step-record";
import { createBand, isInsideBand, type Band } from "./tolerance-band";

type Target =
  /** The resolved value ± a relative tolerance. */
  | { kind: "value"; resolved: ResolvedSetPoint; tolerance: ResolvedTolerance }
  /** Between a shortest and a longest time, widened by the time tolerance. */
  | { kind: "span"; min: ResolvedValue; max?: ResolvedValue; tolerance: ResolvedTolerance }
  /** Inside a temperature range. */
  | { kind: "temperature"; range: ResolvedTemperatureRange };

interface SetPoint {
  field: ProgrammedField;
  words: string;
  unit: FindingUnit;
  target: Target;
}

/** The set-points an operator programs for each kind of step, with what each must equal. */
function listSetPoints(step: ResolvedStep): SetPoint[] {
  const { currentPercent: current, voltagePercent: voltage, timePercent: time } = step.tolerances;
  const value = (field: ProgrammedField, words: string, unit: FindingUnit, resolved: ResolvedSetPoint, tolerance: ResolvedTolerance): SetPoint => ({
    field,
    words,
    unit,
    target: { kind: "value", resolved, tolerance },
  });
  const timeLimit = (limit: ResolvedValue | undefined) => (limit ? [value("maxDuration", "time limit", "s", limit, time)] : []);
  switch (step.kind) {
    case "charge": {
      const termination =
        step.termination.kind === "current"
          ? value("terminationCurrent", "termination current", "A", step.termination.current, current)
          : value("terminationDuration", "termination time", "s", step.termination.duration, time);
      return [
        value("current", "charge current", "A", step.current, current),
        value("voltage", "charge voltage", "V", step.voltage, voltage),
        termination,
        ...timeLimit(step.maxDuration),
      ];
    }
    case "discharge":
      return [
        value("current", "discharge current", "A", step.current, current),
        value("endVoltage", "end voltage", "V", step.endVoltage, voltage),
        ...timeLimit(step.maxDuration),
      ];
    case "rest":
    case "soak": {
      const span: SetPoint = {
        field: "duration",
        words: `${step.kind} duration`,
        unit: "s",
        target: { kind: "span", min: step.minDuration, ...(step.maxDuration && { max: step.maxDuration }), tolerance: time },
      };
      if (step.kind === "rest") return [span];
      return [span, { field: "temperature", words: "chamber temperature", unit: "°C", target: { kind: "temperature", range: step.temperature } }];
    }
    case "pulse":
      return [
        value("baseCurrent", "base current", "A", step.baseCurrent, current),
        value("baseDuration", "base duration", "s", step.baseDuration, time),
        value("pulseCurrent", "pulse current", "A", step.pulseCurrent, current),
        value("pulseDuration", "pulse duration", "s", step.pulseDuration, time),
      ];
    case "measure":
      // The frequency of an AC measurement has no tolerance in the procedure to judge it by.
      return [];
    case "observe":
      return [];
    case "cycle-block":
      // The operator programs the cycle once on the cycler; the block's cycles are judged from the log (evaluate-endurance.ts).
      return [];
    default:
      return assertNever(step);
  }
}

/** The allowed band of a target and its words, or the reason there is none. */
function describeTarget(target: Target, unit: FindingUnit): { band: Partial<Band>; text: string; clause: string } | { reason: string } {
  switch (target.kind) {
    case "value": {
      if (target.resolved === null) return { reason: "the cell specification does not supply the value, so there is nothing to compare with" };
      const band = createBand(target.resolved.value, target.tolerance.value);
      return {
        band,
        text: `${formatValue(target.resolved.value, unit)} ${formatPercent(target.tolerance.value)} (${formatRange(band, unit)}); ${target.resolved.explanation}`,
        clause: citeTolerance(target.tolerance),
      };
    }
    case "span": {
      const share = target.tolerance.value / 100;
      const band = {
        min: roundSignificant(target.min.value * (1 - share)),
        ...(target.max && { max: roundSignificant(target.max.value * (1 + share)) }),
      };
      const words = target.max ? `${target.min.explanation} to ${target.max.explanation}` : `at least ${target.min.explanation}`;
      return { band, text: `${words}, time tolerance ${formatPercent(target.tolerance.value)}`, clause: citeTolerance(target.tolerance) };
    }
    case "temperature":
      return {
        band: { min: target.range.minC, max: target.range.maxC },
        text: `within ${target.range.explanation}`,
        clause: "no tolerance beyond the range",
      };
    default:
      return assertNever(target);
  }
}

function checkSetPoint(context: StepContext, setPoint: SetPoint): Finding {
  const target = describeTarget(setPoint.target, setPoint.unit);
  const programmed = context.record?.programmed[setPoint.field];
  const expectedValue = setPoint.target.kind === "value" && setPoint.target.resolved ? { value: setPoint.target.resolved.value } : {};
  const draft: Omit<FindingDraft, "observed" | "outcome"> = {
    rule: "set-point-matches",
    field: setPoint.field,
    title: `Programmed ${setPoint.words} as in the procedure`,
    expected:
      "reason" in target
        ? { text: target.reason, unit: setPoint.unit }
        : {
            text: target.text,
            ...expectedValue,
            ...target.band,
            unit: setPoint.unit,
          },
    clause: `${citeProcedure(context.citation, setPoint.words)}${"reason" in target ? "" : `; ${target.clause}`}`,
  };
  if (context.record === null || programmed === undefined) {
    const reason = context.record === null ? noRecordReason : `the programmed ${setPoint.words} was not recorded`;
    return createFinding(context, { ...draft, observed: { text: reason }, outcome: "not assessable" });
  }
  const observed = { text: `${formatValue(programmed, setPoint.unit)} programmed`, value: programmed, unit: setPoint.unit };
  if ("reason" in target) return createFinding(context, { ...draft, observed, outcome: "not assessable" });
  return createFinding(context, { ...draft, observed, outcome: isInsideBand(programmed, target.band) ? "meets" : "deviates" });
}

/**
 * Each programmed set-point equals the resolved one within its tolerance (IEC 61960-3 clause 4:
 * current and voltage ±1 %, time ±0.1 %, docs/references.md §3, unless the procedure sets its own); a
 * programmed rest or soak time lies within the step's limits.
 */
export function checkSetPoints(context: StepContext): Finding[] {
  return listSetPoints(context.step).map((setPoint) => checkSetPoint(context, setPoint));
}
