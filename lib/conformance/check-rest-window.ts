import { roundSignificant } from "@/protocols";
import type { PlacedStep } from "./check-order-and-gaps";
import type { Finding } from "./finding";
import { citeProcedure, citeTolerance, formatPercent, formatValue } from "./format-value";
import { createFinding } from "./step-context";

function nameStep(placed: PlacedStep): string {
  return `"${placed.context.step.label}"${placed.context.cycle > 1 ? ` (cycle ${placed.context.cycle})` : ""}`;
}

/**
 * A rest with a longest time (e.g. not more than 4 h after charge before the discharge, IEC 61960-3
 * 7.3.1, docs/references.md §2, held in the template as a recalled value) limits the whole window from the
 * end of the step before it to the start of the step after it: pauses before and after the rest
 * count inside that window, explained or not. The window's end is the next step's start, or the
 * rest's own end when no step follows. Widened by the time tolerance like the rest itself.
 */
export function checkRestWindow({ current, previous, next }: { current: PlacedStep; previous: PlacedStep | undefined; next: PlacedStep | undefined }): Finding[] {
  const { context } = current;
  const { step } = context;
  if ((step.kind !== "rest" && step.kind !== "soak") || step.maxDuration === undefined || previous === undefined) return [];
  const tolerance = step.tolerances.timePercent;
  const max = roundSignificant(step.maxDuration.value * (1 + tolerance.value / 100));
  const until = next ?? current;
  const draft = {
    rule: "rest-window-within-limit" as const,
    title: `Time from ${nameStep(previous)} to ${next ? nameStep(next) : "the end of this step"} within the longest ${step.kind}`,
    expected: {
      text: `at most ${step.maxDuration.explanation} from the end of ${nameStep(previous)} to ${next ? `the start of ${nameStep(next)}` : "the end of this step"}, pauses included, time tolerance ${formatPercent(tolerance.value)}: ≤ ${formatValue(max, "s")}`,
      max,
      unit: "s" as const,
    },
    clause: `${citeProcedure(context.citation, `longest ${step.kind}`)}; ${citeTolerance(tolerance)}`,
  };
  const notAssessable = (text: string) => [createFinding(context, { ...draft, observed: { text }, outcome: "not assessable" })];
  if ("reason" in previous.span) return notAssessable(`the end of ${nameStep(previous)} is unknown: ${previous.span.reason}`);
  if ("reason" in until.span) return notAssessable(`the start of ${nameStep(until)} is unknown: ${until.span.reason}`);
  if (previous.span.base !== until.span.base) {
    return notAssessable("one step's times come from the log and the other's from the wall clock; record when the log started to compare them");
  }
  const window = (next ? until.span.startS : until.span.endS) - previous.span.endS;
  const reasons = [current.context.record?.pauseReason, next?.context.record?.pauseReason].filter((r): r is string => r !== undefined);
  const restSpan = "reason" in current.span ? null : current.span.endS - current.span.startS;
  const parts = restSpan === null ? "" : `; the ${step.kind} itself ${formatValue(restSpan, "s")}, pauses ${formatValue(Math.max(window - restSpan, 0), "s")}`;
  return [
    createFinding(context, {
      ...draft,
      observed: {
        text: `${formatValue(window, "s")}${parts}${reasons.length > 0 ? `; pause reasons recorded: ${reasons.join("; ")}` : ""}`,
        value: window,
        unit: "s",
      },
      outcome: window <= max ? "meets" : "deviates",
    }),
  ];
}
