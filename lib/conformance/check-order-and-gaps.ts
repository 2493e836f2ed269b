import type { Finding } from "./finding";
import { citeProcedure, commonPractice, formatValue } from "./format-value";
import { createFinding, noRecordReason, type StepContext, type TimeSpan } from "./step-context";
import { readRecordTimes } from "./time-span";

/** The step has a record, ticked as carried out, whose end is not before its start. */
export function checkStepRecorded(context: StepContext): Finding {
  const { record } = context;
  const draft = {
    rule: "step-recorded" as const,
    title: "Step recorded and ticked as carried out",
    expected: { text: "a step record, ticked as carried out" },
    clause: citeProcedure(context.citation, "step list"),
  };
  if (record === null) return createFinding(context, { ...draft, observed: { text: noRecordReason }, outcome: "deviates" });
  if (!record.completed) {
    return createFinding(context, { ...draft, observed: { text: "recorded, but not ticked as carried out" }, outcome: "deviates" });
  }
  const times = readRecordTimes(record);
  if ("reason" in times && times.reason === "the recorded end is before the recorded start") {
    return createFinding(context, { ...draft, observed: { text: `ticked, but ${times.reason}` }, outcome: "deviates" });
  }
  return createFinding(context, { ...draft, observed: { text: "recorded and ticked" }, outcome: "meets" });
}

export interface PlacedStep {
  context: StepContext;
  span: TimeSpan | { reason: string };
}

function nameStep(context: StepContext): string {
  return `"${context.step.label}"${context.cycle > 1 ? ` (cycle ${context.cycle})` : ""}`;
}

/**
 * The step starts after the one before it ends (the procedure's order), with no pause longer than
 * the allowance (common practice; the allowance is a lab setting, not a value from a standard). A
 * longer pause is a deviation from the method even when its reason is recorded: the reason is
 * stated with it (ISO/IEC 17025:2017 7.8.2.1 n, deviations from the method), never read as "meets". Times come from the log when both steps
 * were found in it, else from the records; times from different clocks are not compared.
 */
export function checkOrderAndGap({ current, previous }: { current: PlacedStep; previous: PlacedStep }): Finding {
  const { context } = current;
  const allowance = context.settings.gapAllowanceS;
  const draft = {
    rule: "in-order-without-gap" as const,
    title: "In order after the previous step, with no unexplained pause",
    expected: {
      text: `starts after ${nameStep(previous.context)} ends, a pause of at most ${formatValue(allowance, "s")} unless its reason is recorded`,
      min: 0,
      max: allowance,
      unit: "s" as const,
    },
    clause: `${citeProcedure(context.citation, "step order")}; pauses: ${commonPractice}`,
  };
  const notAssessable = (text: string) => createFinding(context, { ...draft, observed: { text }, outcome: "not assessable" });
  if ("reason" in previous.span) return notAssessable(`the previous step's times are unknown: ${previous.span.reason}`);
  if ("reason" in current.span) return notAssessable(`this step's times are unknown: ${current.span.reason}`);
  if (previous.span.base !== current.span.base) {
    return notAssessable("one step's times come from the log and the other's from the wall clock; record when the log started to compare them");
  }
  const pause = current.span.startS - previous.span.endS;
  // Times from the log and from a hand-kept record may disagree by the time agreement; so may an overlap.
  const slack = previous.span.source === current.span.source ? 0 : context.settings.timeAgreementS;
  const observed = { value: pause, unit: "s" as const };
  if (pause < -slack) {
    return createFinding(context, {
      ...draft,
      observed: { ...observed, text: `started ${formatValue(-pause, "s")} before the previous step ended` },
      outcome: "deviates",
    });
  }
  const pauseText = `pause of ${formatValue(Math.max(pause, 0), "s")} (times ${current.span.source === "log" && previous.span.source === "log" ? "from the data log" : "from the records"})`;
  if (pause <= allowance) return createFinding(context, { ...draft, observed: { ...observed, text: pauseText }, outcome: "meets" });
  const reason = context.record?.pauseReason;
  if (reason !== undefined) {
    return createFinding(context, {
      ...draft,
      observed: { ...observed, text: `${pauseText}, reason recorded: ${reason}` },
      outcome: "deviates",
      note: `Pause explained by the operator: ${reason}`,
    });
  }
  return createFinding(context, { ...draft, observed: { ...observed, text: `${pauseText}, no reason recorded` }, outcome: "deviates" });
}
