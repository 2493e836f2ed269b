import { compareNumbers, formatNumber, isCapacityCheckCycle, nameDecisionRule, readEnduranceLimits, type DecisionRule, type ProcedureResolution } from "@/protocols";
import type { LoggedCycleBlock } from "./analyse-run-log";
import type { CriterionConformity } from "./decide-verdict";
import { citeStatementOfConformity, evaluateConformity, usesGuardBand, type ConformityOutcome } from "./decision-rule";

/** One cycle of an endurance block as the log shows it. Capacities in Ah (Q = ∫|I| dt, docs/design.md §6). */
export interface EnduranceCycle {
  cycle: number;
  /** This cycle's discharge is a capacity check (or every cycle counts, when the block has no separate check). */
  capacityCheck: boolean;
  chargeCapacityAh: number | null;
  dischargeCapacityAh: number | null;
  /** Discharge capacity / rated capacity × 100; null without a discharge. */
  percentOfRated: number | null;
}

export type EnduranceStatus = "stopped" | "completed" | "in progress";

/** The endurance block of a run: its cycles, where the stop criterion was met, and the acceptance statement. */
export interface EnduranceResult {
  stepId: string;
  label: string;
  ratedCapacityAh: number;
  maxCycles: number;
  /** Cycles between capacity checks; null when every cycle's capacity counts. */
  checkEveryCycles: number | null;
  stopBelowPercentOfRated: number;
  acceptAtLeastPercentOfRated: number;
  /** Every cycle found in the log, in order. */
  cycles: EnduranceCycle[];
  /** The highest cycle whose discharge the log shows; 0 when none. */
  cyclesLogged: number;
  status: EnduranceStatus;
  stop: { met: boolean; cycle: number | null; statement: string };
  acceptance: {
    outcome: ConformityOutcome;
    /** The cycle the statement rests on; null when none could be judged. */
    cycle: number | null;
    measuredAh: number | null;
    limitAh: number;
    decisionRule: DecisionRule;
    /** The rule and its clause, and the measured value with its outcome, in words. */
    statement: string;
    clause: string;
  };
  /** "IEC 61960-3:2017 7.6 (endurance in cycles)" as the procedure cites it, or null. */
  source: string | null;
}

const percent = (value: number) => `${formatNumber(value, { maxDecimals: 1 })} %`;
const ah = (value: number) => `${formatNumber(value * 1000, { maxDecimals: 0 })} mAh`;

function listCycles(block: LoggedCycleBlock | undefined, checkEvery: number, ratedAh: number): EnduranceCycle[] {
  return (block?.cycles ?? []).map((logged) => {
    const discharge = logged.discharge?.capacityAh ?? null;
    return {
      cycle: logged.cycle,
      capacityCheck: isCapacityCheckCycle({ checkEveryCycles: checkEvery }, logged.cycle),
      chargeCapacityAh: logged.charge?.capacityAh ?? null,
      dischargeCapacityAh: discharge,
      // A share of the rated capacity, by definition.
      percentOfRated: discharge === null ? null : (discharge / ratedAh) * 100,
    };
  });
}

/**
 * The endurance block's results from the whole log: each cycle's discharge capacity; the stop criterion,
 * met at the first capacity check (every cycle, without separate checks) below the stop share of the
 * rated capacity; and the acceptance criterion, the capacity after the last cycle at least the acceptance
 * share, stated under the procedure's decision rule (ISO/IEC 17025:2017 7.8.6, ILAC-G8:09/2019 4.2).
 * A cell stopped early does not reach the last cycle: it is judged on the cycle that stopped it, whose
 * capacity is below the stop share and so below the acceptance share (the schema keeps stop ≤ accept).
 */
export function evaluateEndurance({
  resolution,
  cycleBlocks,
  decisionRule,
  citation,
}: {
  resolution: ProcedureResolution;
  cycleBlocks: readonly LoggedCycleBlock[];
  decisionRule: DecisionRule;
  citation: string | null;
}): EnduranceResult | undefined {
  const limits = readEnduranceLimits(resolution);
  if (limits === null) return undefined;
  const step = resolution.steps.find((candidate) => candidate.id === limits.stepId);
  const ratedAh = limits.ratedCapacityMAh / 1000;
  const cycles = listCycles(
    cycleBlocks.find((block) => block.stepId === limits.stepId),
    limits.checkEveryCycles,
    ratedAh,
  );
  const withDischarge = cycles.filter((cycle) => cycle.dischargeCapacityAh !== null);
  const cyclesLogged = withDischarge.reduce((highest, cycle) => Math.max(highest, cycle.cycle), 0);
  const stopAh = (limits.stopBelowPercentOfRated / 100) * ratedAh;
  const limitAh = (limits.acceptAtLeastPercentOfRated / 100) * ratedAh;
  const counted = limits.checkEveryCycles > 1 ? "capacity check" : "cycle";

  const stopCycle = withDischarge.find(
    (cycle) => cycle.capacityCheck && compareNumbers(cycle.dischargeCapacityAh as number, stopAh) === "lower",
  );
  const status: EnduranceStatus = stopCycle ? "stopped" : cyclesLogged >= limits.maxCycles ? "completed" : "in progress";
  const stop = stopCycle
    ? {
        met: true,
        cycle: stopCycle.cycle,
        statement: `Met at cycle ${stopCycle.cycle}: ${ah(stopCycle.dischargeCapacityAh as number)} is ${percent(stopCycle.percentOfRated as number)} of the rated capacity, below ${percent(limits.stopBelowPercentOfRated)} (${ah(stopAh)}).`,
      }
    : {
        met: false,
        cycle: null,
        statement:
          status === "completed"
            ? `Not met: every ${counted} of the ${limits.maxCycles} cycles stayed at or above ${percent(limits.stopBelowPercentOfRated)} of the rated capacity (${ah(stopAh)}).`
            : `Not met so far: the log shows ${cyclesLogged} of ${limits.maxCycles} cycles, every ${counted} at or above ${percent(limits.stopBelowPercentOfRated)} of the rated capacity (${ah(stopAh)}).`,
      };

  const judged = stopCycle ?? (status === "completed" ? withDischarge.find((cycle) => cycle.cycle === limits.maxCycles) : undefined);
  const criterion = `Capacity after ${limits.maxCycles} cycles at least ${percent(limits.acceptAtLeastPercentOfRated)} of the rated capacity (${ah(limitAh)})`;
  const clause = `${citation ? `${citation}; ` : ""}${citeStatementOfConformity(decisionRule)}`;
  const undecided = (why: string) => ({
    outcome: "not decided" as const,
    cycle: null,
    measuredAh: null,
    limitAh,
    decisionRule,
    statement: `${criterion}: not decided — ${why}. Decision rule: ${nameDecisionRule(decisionRule)}.`,
    clause,
  });
  let acceptance: EnduranceResult["acceptance"];
  if (judged === undefined || judged.dischargeCapacityAh === null) {
    acceptance = undecided(
      status === "in progress" ? `the log shows ${cyclesLogged} of ${limits.maxCycles} cycles and the stop criterion is not met` : "the log shows no discharge for the last cycle",
    );
  } else if (usesGuardBand(decisionRule)) {
    // A guard band needs U of each cycle's capacity; the endurance block has no budget per cycle yet.
    acceptance = undecided(`the decision rule needs the expanded uncertainty of cycle ${judged.cycle}'s capacity, which is not evaluated for endurance cycles`);
  } else {
    const statement = evaluateConformity({ measured: judged.dischargeCapacityAh, limit: { side: "lower", value: limitAh }, rule: decisionRule, unit: "Ah" });
    acceptance = statement.ok
      ? {
          outcome: statement.value.outcome,
          cycle: judged.cycle,
          measuredAh: judged.dischargeCapacityAh,
          limitAh,
          decisionRule,
          statement: `${criterion}, judged on cycle ${judged.cycle}${stopCycle ? " (the stop criterion ended the test there)" : ""}: ${statement.value.statement}`,
          clause,
        }
      : undecided(statement.error.message);
  }
  return {
    stepId: limits.stepId,
    label: step?.label ?? limits.stepId,
    ratedCapacityAh: ratedAh,
    maxCycles: limits.maxCycles,
    checkEveryCycles: limits.checkEveryCycles > 1 ? limits.checkEveryCycles : null,
    stopBelowPercentOfRated: limits.stopBelowPercentOfRated,
    acceptAtLeastPercentOfRated: limits.acceptAtLeastPercentOfRated,
    cycles,
    cyclesLogged,
    status,
    stop,
    acceptance,
    source: citation,
  };
}

/** The endurance acceptance as a criterion of the specimen's statement. */
export function toEnduranceConformity(result: EnduranceResult | undefined): CriterionConformity[] {
  if (result === undefined) return [];
  return [
    {
      criterionId: `capacity after the cycles of "${result.label}"`,
      outcome: result.acceptance.outcome,
      cycle: result.acceptance.cycle,
      statement: result.acceptance.statement,
    },
  ];
}

/** The cycles a summary shows: the first, every K-th (the capacity checks), the stop cycle and the last. */
export function summariseEnduranceCycles(result: Pick<EnduranceResult, "cycles" | "checkEveryCycles" | "stop">, every = result.checkEveryCycles ?? 10): EnduranceCycle[] {
  const cycles = result.cycles;
  const last = cycles[cycles.length - 1]?.cycle;
  return cycles.filter((cycle, index) => index === 0 || cycle.cycle % every === 0 || cycle.cycle === result.stop.cycle || cycle.cycle === last);
}
