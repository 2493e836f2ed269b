import type { RepeatRule } from "@/protocols";
import type { ConformityOutcome } from "./decision-rule";
import type { AcceptanceResult } from "./evaluate-acceptance";
import { createRunFinding, type Finding, type FindingOutcome } from "./finding";
import { citeProcedure } from "./format-value";

export type RepeatStatus = "met" | "not met in any cycle" | "stopped early" | "not decided";

export interface RepeatOutcome {
  label: string;
  criterionId: string;
  maxCycles: number;
  cyclesRun: number;
  status: RepeatStatus;
  /** The first cycle whose result met the criterion. */
  metInCycle: number | null;
  /** The cycle the block's criteria are judged on. */
  decisiveCycle: number | null;
  /** What the repeat rule makes of the specimen for its criterion. */
  specimenOutcome: ConformityOutcome;
  statement: string;
}

interface Judgement {
  status: RepeatStatus;
  metInCycle: number | null;
  decisiveCycle: number | null;
  specimenOutcome: ConformityOutcome;
  statement: string;
  followed: { outcome: FindingOutcome; text: string };
}

function judge({ rule, cyclesRun, considered }: { rule: RepeatRule; cyclesRun: number; considered: AcceptanceResult[] }): Judgement {
  const beyond = cyclesRun > rule.maxCycles ? `; ${cyclesRun} cycles ran where at most ${rule.maxCycles} are allowed` : "";
  // Under the non-binary rule (ILAC-G8:09/2019 4.2.3) a conditional pass is a pass with its condition stated.
  const met = considered.find((result) => result.outcome === "conforms" || result.outcome === "conditional pass");
  if (met) {
    const extra = cyclesRun - met.cycle;
    return {
      status: "met",
      metInCycle: met.cycle,
      decisiveCycle: met.cycle,
      specimenOutcome: met.outcome,
      statement: `Met in cycle ${met.cycle} of up to ${rule.maxCycles}${met.outcome === "conforms" ? "" : ` (${met.outcome})`}.`,
      followed:
        extra > 0
          ? { outcome: "deviates", text: `met in cycle ${met.cycle}, yet ${extra} more cycle${extra === 1 ? "" : "s"} ran` }
          : { outcome: "meets", text: `met in cycle ${met.cycle}; the block stopped there` },
    };
  }
  const last = considered[considered.length - 1];
  const undecided = considered.find((result) => result.outcome === "not decided");
  if (undecided || last === undefined) {
    const why = undecided ? `cycle ${undecided.cycle} is not decided` : "no cycle of the block was judged";
    return {
      status: "not decided",
      metInCycle: null,
      decisiveCycle: last?.cycle ?? null,
      specimenOutcome: "not decided",
      statement: `Not decided: ${why}.`,
      followed: beyond
        ? { outcome: "deviates", text: `${why}${beyond}` }
        : { outcome: "not assessable", text: `whether the block should have gone on cannot be told: ${why}` },
    };
  }
  if (cyclesRun >= rule.maxCycles) {
    return {
      status: "not met in any cycle",
      metInCycle: null,
      decisiveCycle: rule.maxCycles,
      specimenOutcome: last.outcome === "conditional fail" ? "conditional fail" : "does not conform",
      statement: `Not met in any of the ${rule.maxCycles} cycles allowed${last.outcome === "conditional fail" ? " (the last one a conditional fail)" : ""}.`,
      followed: { outcome: beyond ? "deviates" : "meets", text: `all ${rule.maxCycles} cycles ran without meeting the criterion${beyond}` },
    };
  }
  return {
    status: "stopped early",
    metInCycle: null,
    decisiveCycle: last.cycle,
    specimenOutcome: "not decided",
    statement: `Not decided: the block stopped after ${cyclesRun} of up to ${rule.maxCycles} cycles without meeting the criterion.`,
    followed: { outcome: "deviates", text: `stopped after ${cyclesRun} of ${rule.maxCycles} cycles without meeting the criterion` },
  };
}

/**
 * The repeat rule: the block runs up to maxCycles times and stops at the first cycle whose result
 * meets the named criterion (IEC 61960-3 7.3.1: up to five cycles, docs/references.md §2, held in the
 * template as a recalled value). The specimen meets the requirement when a cycle met it, fails when
 * every allowed cycle ran and none did, and is not decided when the block stopped too soon.
 */
export function evaluateRepeatRule({
  rule,
  cyclesRun,
  results,
  citation,
}: {
  rule: RepeatRule;
  cyclesRun: number;
  /** The stop criterion's results, one per cycle run. */
  results: readonly AcceptanceResult[];
  citation: string | null;
}): { outcome: RepeatOutcome; finding: Finding } {
  const considered = results
    .filter((result) => result.criterionId === rule.stopWhenMet && result.cycle <= rule.maxCycles)
    .sort((a, b) => a.cycle - b.cycle);
  const judgement = judge({ rule, cyclesRun, considered });
  const finding = createRunFinding({
    rule: "repeat-rule-followed",
    title: `Repeat rule followed: ${rule.label}`,
    expected: {
      text: `the block repeats until criterion "${rule.stopWhenMet}" is met, at most ${rule.maxCycles} cycles, and stops at the first cycle that meets it`,
      max: rule.maxCycles,
    },
    observed: { text: `${cyclesRun} cycle${cyclesRun === 1 ? "" : "s"} recorded; ${judgement.followed.text}`, value: cyclesRun },
    outcome: judgement.followed.outcome,
    clause: citeProcedure(citation, "repeat rule"),
  });
  return {
    outcome: {
      label: rule.label,
      criterionId: rule.stopWhenMet,
      maxCycles: rule.maxCycles,
      cyclesRun,
      status: judgement.status,
      metInCycle: judgement.metInCycle,
      decisiveCycle: judgement.decisiveCycle,
      specimenOutcome: judgement.specimenOutcome,
      statement: judgement.statement,
    },
    finding,
  };
}
