import {
  evaluateCapacityUncertainty,
  evaluateDcResistanceUncertainty,
  extendCapacityBudget,
  type DischargeLogDetail,
  evaluateEnergyUncertainty,
  type AnalysisResult,
  type DcResistancePulse,
  type StepResults,
  type UncertaintyBudget,
} from "@/lib/analysis";
import { listUncertaintySources, toChannelAccuracy } from "@/lib/instruments/accuracy-tolerance";
import type { ResolvedCriterion, ResolvedStep } from "@/protocols";
import type { RunInstrument } from "./run-evaluation-input";

export type UncertaintyQuantity = "capacity" | "energy" | "dc-resistance";

/** The uncertainty budget of one result of one step on one cycle (GUM 8), listed in RunEvaluation.uncertainty. */
export interface StepUncertainty {
  stepId: string;
  cycle: number;
  quantity: UncertaintyQuantity;
  budget: UncertaintyBudget;
}

/** A result of a step whose budget could not be made, and why. */
export interface UncertaintyNotEvaluated {
  stepId: string;
  cycle: number;
  quantity: UncertaintyQuantity;
  reason: string;
}

/** What a step's evaluation gives the budgets: its log results and, for a pulse, its two readings. */
export interface StepResultsForBudget {
  stepId: string;
  cycle: number;
  kind: ResolvedStep["kind"];
  results: StepResults | null;
  dcResistance: DcResistancePulse | null;
  /** The end of a logged discharge and the log's resolution, for the capacity budget's further terms. */
  log?: DischargeLogDetail | null;
}

/** The expanded uncertainty a criterion is judged with: its step's budget, or why there is none. */
export type CriterionUncertainty =
  | { evaluated: true; quantity: UncertaintyQuantity; budget: UncertaintyBudget }
  | { evaluated: false; reason: string };

export interface StepUncertainties {
  budgets: StepUncertainty[];
  notEvaluated: UncertaintyNotEvaluated[];
}

/** The inputs of each result's model (definitions: Q = I·t, E = U·I·t, Rdc = ΔU / ΔI). */
const INPUTS: Record<UncertaintyQuantity, readonly ("current" | "voltage" | "time")[]> = {
  capacity: ["current", "time"],
  energy: ["voltage", "current", "time"],
  "dc-resistance": ["voltage", "current"],
};

/** The run's cycler channels, by identifier: the log's current, voltage and time come from one of them. */
function listLogChannels(instruments: readonly RunInstrument[]): RunInstrument[] {
  return instruments
    .filter((instrument) => instrument.kind === "cycler-channel")
    .sort((a, b) => (a.identifier < b.identifier ? -1 : a.identifier > b.identifier ? 1 : 0));
}

/** Why the channels cannot give this result's budget, or null when each states every input's accuracy. */
function explainMissingAccuracy(channels: readonly RunInstrument[], quantity: UncertaintyQuantity): string | null {
  if (channels.length === 0) return "no cycler channel is among the run's instruments, so no accuracy applies to the log's readings";
  for (const channel of channels) {
    const missing = INPUTS[quantity].filter((input) => channel.accuracy[input] === undefined);
    if (missing.length > 0) return `the cycler channel ${channel.identifier} states no ${missing.join(" or ")} accuracy in the instrument register`;
  }
  return null;
}

/**
 * Why a channel's stated accuracy does not apply to this result, or null: a reading beyond the range
 * the accuracy is stated for has no stated accuracy, so no budget is made for it.
 */
function explainOutsideRange(channel: RunInstrument, quantity: UncertaintyQuantity, step: StepResultsForBudget): string | null {
  const { current, voltage } = channel.accuracy;
  const currents: number[] = [];
  const voltages: number[] = [];
  if ((quantity === "capacity" || quantity === "energy") && step.results !== null) {
    currents.push((step.results.capacityAh * 3600) / step.results.durationS);
    voltages.push(step.results.maxVoltageV);
  }
  if (quantity === "dc-resistance" && step.dcResistance !== null) {
    currents.push(Math.abs(step.dcResistance.i1A), Math.abs(step.dcResistance.i2A));
    voltages.push(Math.abs(step.dcResistance.u1V), Math.abs(step.dcResistance.u2V));
  }
  const show = (x: number, unit: string) => `${Number(x.toPrecision(4))} ${unit}`;
  const beyondCurrent = current === undefined ? undefined : currents.find((i) => i > current.range);
  if (current !== undefined && beyondCurrent !== undefined) {
    return `the current of ${show(beyondCurrent, "A")} is outside the range of ${channel.identifier} (${show(current.range, "A")}), for which its accuracy is stated`;
  }
  const beyondVoltage = voltage === undefined ? undefined : voltages.find((v) => v > voltage.range);
  if (voltage !== undefined && beyondVoltage !== undefined) {
    return `the voltage of ${show(beyondVoltage, "V")} is outside the range of ${channel.identifier} (${show(voltage.range, "V")}), for which its accuracy is stated`;
  }
  return null;
}

function budgetFor(channel: RunInstrument, quantity: UncertaintyQuantity, step: StepResultsForBudget, repeated: readonly number[]): AnalysisResult<UncertaintyBudget> | null {
  const { results, dcResistance } = step;
  const sources = listUncertaintySources({ accuracy: channel.accuracy, instrument: channel.identifier }).filter((source) =>
    INPUTS[quantity].includes(source.quantity),
  );
  switch (quantity) {
    case "capacity":
    case "energy": {
      if (results === null) return null;
      // The time-weighted mean current Ī = Q / t, so that Q = Ī·t holds exactly for the budget's model.
      const currentA = (results.capacityAh * 3600) / results.durationS;
      if (quantity === "capacity") {
        const made = evaluateCapacityUncertainty({ capacityAh: results.capacityAh, currentA, durationS: results.durationS, sources });
        if (!made.ok) return made;
        const voltage = sources.find((source) => source.quantity === "voltage") ?? listUncertaintySources({ accuracy: channel.accuracy, instrument: channel.identifier }).find((s) => s.quantity === "voltage");
        const log = step.log ?? null;
        return {
          ok: true,
          value: extendCapacityBudget(made.value, {
            ...(log !== null && voltage !== undefined && log.endSlopeAhPerV !== null && {
              endVoltage: { source: voltage.source, tolerance: voltage.tolerance, ...(voltage.statedLimit !== undefined && { statedLimit: voltage.statedLimit }), endVoltageV: log.endVoltageV, slopeAhPerV: log.endSlopeAhPerV },
            }),
            ...(log?.currentResolutionA != null && { currentResolutionA: { value: log.currentResolutionA, currentA } }),
            ...(log?.timeResolutionS != null && { timeResolutionS: { value: log.timeResolutionS, durationS: results.durationS } }),
            ...(repeated.length >= 2 && { repeatedCycles: { capacitiesAh: repeated } }),
          }),
        };
      }
      return evaluateEnergyUncertainty({
            energyWh: results.energyWh,
            meanVoltageV: results.meanVoltageV ?? Number.NaN,
            currentA,
            durationS: results.durationS,
            sources,
          });
    }
    case "dc-resistance": {
      const { voltage, current } = channel.accuracy;
      if (dcResistance === null || voltage === undefined || current === undefined) return null;
      // One channel reads both levels seconds apart: its gain error is common to both readings (GUM 5.2.2).
      return evaluateDcResistanceUncertainty({
        readings: dcResistance,
        voltage: toChannelAccuracy(voltage),
        current: toChannelAccuracy(current),
        correlation: "same-channel",
      });
    }
    default: {
      const unknown: never = quantity;
      throw new Error(`Unknown quantity ${String(unknown)}`);
    }
  }
}

function quantitiesOf(step: StepResultsForBudget): UncertaintyQuantity[] {
  if (step.kind === "discharge" && step.results !== null) return ["capacity", "energy"];
  if (step.kind === "pulse" && step.dcResistance !== null) return ["dc-resistance"];
  return [];
}

/**
 * Uncertainty budgets (JCGM 100:2008) of every discharge step's capacity and energy and every pulse
 * step's DC resistance, from the accuracy the instrument register states for the run's cycler
 * channel (the widest budget when the run names several): each stated limit rectangular (a/√3,
 * GUM 4.3.7), relative uncertainties combined in quadrature (GUM 5.1.6), expanded with k = 2
 * (GUM 6.2.1). A step without log results has no result and so no budget; a result whose inputs
 * lack a stated accuracy is listed with the reason.
 */
export function evaluateStepUncertainties({
  steps,
  instruments,
}: {
  steps: readonly StepResultsForBudget[];
  instruments: readonly RunInstrument[];
}): StepUncertainties {
  const channels = listLogChannels(instruments);
  const budgets: StepUncertainty[] = [];
  const notEvaluated: UncertaintyNotEvaluated[] = [];
  // Capacities of each discharge step over its cycles: a Type A term when there are several.
  const capacitiesByStep = new Map<string, number[]>();
  for (const step of steps) {
    if (step.kind !== "discharge" || step.results === null) continue;
    capacitiesByStep.set(step.stepId, [...(capacitiesByStep.get(step.stepId) ?? []), step.results.capacityAh]);
  }
  for (const step of steps) {
    for (const quantity of quantitiesOf(step)) {
      const where = { stepId: step.stepId, cycle: step.cycle, quantity };
      const missing = explainMissingAccuracy(channels, quantity);
      if (missing !== null) {
        notEvaluated.push({ ...where, reason: missing });
        continue;
      }
      // Issue 13, 4 (budget side): never a budget for a reading outside the range the accuracy is stated for.
      const outside = channels.map((channel) => explainOutsideRange(channel, quantity, step)).find((reason) => reason !== null);
      if (outside) {
        notEvaluated.push({ ...where, reason: outside });
        continue;
      }
      const made = channels.map((channel) => budgetFor(channel, quantity, step, capacitiesByStep.get(step.stepId) ?? []));
      if (made.some((budget) => budget === null)) continue;
      const failed = made.find((budget) => budget !== null && !budget.ok);
      if (failed && !failed.ok) {
        notEvaluated.push({ ...where, reason: `the budget cannot be made: ${failed.error.message.replace(/\.$/, "")}` });
        continue;
      }
      // With several channels named on the run, the log may come from any: the widest budget is kept,
      // so U is never understated (the first by identifier on a tie).
      const widest = made
        .flatMap((budget) => (budget?.ok ? [budget.value] : []))
        .reduce<UncertaintyBudget | null>((wide, budget) => (wide === null || budget.relativeExpandedUncertainty > wide.relativeExpandedUncertainty ? budget : wide), null);
      if (widest !== null) budgets.push({ ...where, budget: widest });
    }
  }
  return { budgets, notEvaluated };
}

/** Which budget judges a criterion: a capacity criterion its step's capacity, a pulse's resistance criterion its DC resistance. */
function budgetQuantityOf(criterion: ResolvedCriterion, step: ResolvedStep): UncertaintyQuantity | { reason: string } {
  switch (criterion.kind) {
    case "capacity":
      return "capacity";
    case "resistance":
      return step.kind === "pulse" ? "dc-resistance" : { reason: "no uncertainty budget is made for a recorded AC resistance" };
    case "discharge-duration":
      return { reason: "no uncertainty budget is made for a discharge duration" };
    default: {
      const unknown: never = criterion;
      throw new Error(`Unknown criterion ${JSON.stringify(unknown)}`);
    }
  }
}

/** The budget of the criterion's step on this cycle, or why there is none. */
export function findCriterionUncertainty({
  criterion,
  step,
  cycle,
  uncertainties,
}: {
  criterion: ResolvedCriterion;
  step: ResolvedStep;
  cycle: number;
  uncertainties: StepUncertainties;
}): CriterionUncertainty {
  const quantity = budgetQuantityOf(criterion, step);
  if (typeof quantity !== "string") return { evaluated: false, reason: quantity.reason };
  const here = (entry: { stepId: string; cycle: number; quantity: UncertaintyQuantity }) =>
    entry.stepId === step.id && entry.cycle === cycle && entry.quantity === quantity;
  const found = uncertainties.budgets.find(here);
  if (found) return { evaluated: true, quantity, budget: found.budget };
  return { evaluated: false, reason: uncertainties.notEvaluated.find(here)?.reason ?? "the step has no logged result to make a budget for" };
}
