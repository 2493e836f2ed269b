import { formatNumber } from "@/protocols";
import type { RunLogSummary } from "./analyse-run-log";
import { createRunFinding, type Finding } from "./finding";
import { citeProcedure, formatValue } from "./format-value";
import { createFinding, type StepContext } from "./step-context";
import { readRecordTimes } from "./time-span";

/**
 * The data log shows a phase for each step that moves current or rests, in the procedure's order
 * (lib/analysis matchSteps). Soak, measure and observe steps may leave no trace, so they are not looked for.
 */
export function checkLogPhaseFound(context: StepContext): Finding[] {
  const { step, evidence } = context;
  if (step.kind === "soak" || step.kind === "measure" || step.kind === "observe") return [];
  const draft = {
    rule: "log-phase-found" as const,
    title: "Step found in the data log",
    expected: { text: `a ${step.kind === "pulse" ? "discharge" : step.kind} phase in the data log, in the procedure's order` },
    clause: citeProcedure(context.citation, "step order"),
  };
  switch (evidence.kind) {
    case "no log":
      return [createFinding(context, { ...draft, observed: { text: evidence.reason }, outcome: "not assessable" })];
    case "not found":
      return [createFinding(context, { ...draft, observed: { text: evidence.reason }, outcome: "deviates" })];
    case "found": {
      const { phase } = evidence;
      const text = `${phase.kind} phase ${evidence.phaseIndex + 1}, ${formatValue(phase.startS, "s")} to ${formatValue(phase.endS, "s")} of the log`;
      return [createFinding(context, { ...draft, observed: { text }, outcome: "meets" })];
    }
    default: {
      const unknown: never = evidence;
      throw new Error(`Unknown log evidence ${JSON.stringify(unknown)}`);
    }
  }
}

/**
 * The recorded start and end of a step agree with its phase in the log within the time agreement
 * (a lab setting for hand-noted times), once the log's start time places the log on the clock. A
 * disagreement means the log, or the record, belongs to something else.
 */
export function checkRecordMatchesLog(context: StepContext): Finding[] {
  const { evidence, logStartMs } = context;
  if (evidence.kind !== "found") return [];
  const allowance = context.settings.timeAgreementS;
  const draft = {
    rule: "record-matches-log" as const,
    title: "Recorded times agree with the data log",
    expected: { text: `recorded start and end within ${formatValue(allowance, "s")} of the log phase's`, max: allowance, unit: "s" as const },
    clause: "record and log of the same run (lab setting for the time agreement)",
  };
  const times = readRecordTimes(context.record);
  if ("reason" in times || logStartMs === null) {
    const reason = "reason" in times ? times.reason : "the time the log started was not recorded";
    return [createFinding(context, { ...draft, observed: { text: reason }, outcome: "not assessable" })];
  }
  const startOffsetS = (times.startMs - logStartMs) / 1000 - evidence.phase.startS;
  const endOffsetS = (times.endMs - logStartMs) / 1000 - evidence.phase.endS;
  const largest = Math.max(Math.abs(startOffsetS), Math.abs(endOffsetS));
  // Offsets under 0.05 s print as 0 s, so they carry no sign.
  const signed = (seconds: number) => `${Math.abs(seconds) < 0.05 ? "" : seconds > 0 ? "+" : "−"}${formatValue(Math.abs(seconds), "s")}`;
  return [
    createFinding(context, {
      ...draft,
      observed: { text: `start ${signed(startOffsetS)}, end ${signed(endOffsetS)} from the log phase`, value: largest, unit: "s" },
      outcome: largest <= allowance ? "meets" : "deviates",
    }),
  ];
}

/**
 * No charge or discharge in the log that no step accounts for: current the procedure did not ask
 * for. Rests left over are pauses, judged by the step order rule.
 */
export function checkUnexplainedLogPhases(summary: RunLogSummary, citation: string | null): Finding {
  const draft = {
    rule: "no-unexplained-log-phase" as const,
    title: "No charge or discharge in the log beyond the procedure's",
    expected: { text: "every charge and discharge phase of the log belongs to a step" },
    clause: citeProcedure(citation, "step list"),
  };
  switch (summary.status) {
    case "no log":
    case "unusable":
      return createRunFinding({ ...draft, observed: { text: summary.reason }, outcome: "not assessable" });
    case "analysed": {
      const extra = summary.extraPhaseIndexes.flatMap((index) => {
        const phase = summary.phases[index];
        return phase !== undefined && phase.kind !== "rest" ? [phase] : [];
      });
      const list = extra.map((phase) => `${phase.kind} phase ${formatNumber(phase.index + 1)} at ${formatValue(phase.startS, "s")}`);
      return createRunFinding({
        ...draft,
        observed: { text: extra.length === 0 ? "none left over" : `left over: ${list.join("; ")}` },
        outcome: extra.length === 0 ? "meets" : "deviates",
      });
    }
    default: {
      const unknown: never = summary;
      throw new Error(`Unknown log summary ${JSON.stringify(unknown)}`);
    }
  }
}
