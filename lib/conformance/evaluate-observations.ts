import {
  compareNumbers,
  describeMassLossBand,
  findMassLossBand,
  formatNumber,
  VISUAL_OUTCOME_WORDS,
  visualOutcomes,
  type ResolvedObserveStep,
  type ResolvedStep,
  type VisualOutcome,
} from "@/protocols";
import type { CriterionConformity } from "./decide-verdict";
import type { ConformityOutcome } from "./decision-rule";
import type { ObservedValues, StepRecord } from "./step-record";

/** What one observation step's record shows, as the results and the certificate list it. */
export interface ObservationRecord {
  stepId: string;
  label: string;
  /** What the step asks for, in the procedure's order. */
  records: ResolvedObserveStep["records"];
  /** Null when the step has no record or records nothing yet. */
  observed: ObservedValues | null;
  /** Each visual outcome of the closed list: "none seen", "not confirmed", or null when no inspection is recorded. */
  visual: { outcome: VisualOutcome; words: string; noneSeen: boolean }[] | null;
}

export type ObservationCriterionKind = "mass loss" | "open-circuit voltage" | "visual state";

/** One criterion of one observation step, judged by simple acceptance on the recorded values. */
export interface ObservationCriterionResult {
  stepId: string;
  label: string;
  kind: ObservationCriterionKind;
  /** The rule with its numbers: "mass loss ≤ 0.1 % (cell above 75 g by its mass before)". */
  rule: string;
  /** The recorded numbers and the computed value: "80.000 g before, 79.960 g after: 0.050 %". */
  observed: string;
  /** The computed value (mass loss %, voltage share %), null for the visual state or when not computed. */
  value: number | null;
  limit: number | null;
  outcome: ConformityOutcome;
  /** The procedure's standard and clause, e.g. "UN Manual of Tests and Criteria 38.3.4"; null when it names none. */
  source: string | null;
}

export interface ObservationsResult {
  records: ObservationRecord[];
  criteria: ObservationCriterionResult[];
  /** How the criteria are decided. */
  decisionRule: string;
}

/** The observation criteria state conformity without a guard band; their instruments' uncertainty is not evaluated. */
export const OBSERVATION_DECISION_RULE =
  "Simple acceptance (ILAC-G8:09/2019 4.2.1, guard band w = 0) on the recorded values; the uncertainty of the balance and the voltmeter is not evaluated.";

const grams = (value: number) => `${formatNumber(value, { minDecimals: 3, maxDecimals: 3 })} g`;
const volts = (value: number) => `${formatNumber(value, { minDecimals: 3, maxDecimals: 3 })} V`;
const percent = (value: number) => `${formatNumber(value, { minDecimals: 3, maxDecimals: 3 })} %`;
const limitPercent = (value: number) => `${formatNumber(value, { maxDecimals: 3 })} %`;

/**
 * Mass loss in % of the mass before: (M1 − M2) / M1 × 100 (UN Manual of Tests and Criteria 38.3.4,
 * docs/references.md §14, recalled). A gain in mass is a negative loss.
 */
export function computeMassLossPercent(beforeG: number, afterG: number): number {
  return ((beforeG - afterG) / beforeG) * 100;
}

/** Open-circuit voltage after as a share of the voltage before, in % (same source). */
export function computeVoltageSharePercent(beforeV: number, afterV: number): number {
  return (afterV / beforeV) * 100;
}

/** At or under the limit (a relative difference below 1e-9 counts as equal: floating-point noise). */
const atMost = (value: number, limit: number) => compareNumbers(value, limit) !== "higher";
const atLeast = (value: number, limit: number) => compareNumbers(value, limit) !== "lower";

function readVisual(observed: ObservedValues | null): ObservationRecord["visual"] {
  if (observed?.visual === undefined) return null;
  const seen = new Set(observed.visual.noneSeen);
  return visualOutcomes.map((outcome) => ({ outcome, words: VISUAL_OUTCOME_WORDS[outcome], noneSeen: seen.has(outcome) }));
}

function judgeMassLoss(step: ResolvedObserveStep, before: ObservedValues | null, after: ObservedValues | null, source: string | null): ObservationCriterionResult | null {
  const bands = step.criteria?.massLoss?.bands;
  if (bands === undefined) return null;
  const base = { stepId: step.id, label: step.label, kind: "mass loss" as const, source };
  const m1 = before?.massG;
  const m2 = after?.massG;
  if (m1 === undefined || m2 === undefined) {
    const missing = m1 === undefined ? `no mass recorded on "${step.compareWith}"` : `no mass recorded on this step`;
    return { ...base, rule: "mass loss at most the limit of the cell's mass band", observed: missing, value: null, limit: null, outcome: "not decided" };
  }
  const found = findMassLossBand(bands, m1);
  if (found === null) {
    return { ...base, rule: "mass loss at most the limit of the cell's mass band", observed: `no band of the procedure takes a cell of ${grams(m1)}`, value: null, limit: null, outcome: "not decided" };
  }
  const loss = computeMassLossPercent(m1, m2);
  const limit = found.band.maxLossPercent;
  return {
    ...base,
    rule: `mass loss (M1 − M2) / M1 × 100 ≤ ${limitPercent(limit)} for a cell ${describeMassLossBand(bands, found.index)} (by its mass before, M1)`,
    observed: `${grams(m1)} before, ${grams(m2)} after: ${loss < 0 ? `a gain of ${percent(-loss)}` : `a loss of ${percent(loss)}`}`,
    value: loss,
    limit,
    outcome: atMost(loss, limit) ? "conforms" : "does not conform",
  };
}

function judgeVoltage(step: ResolvedObserveStep, before: ObservedValues | null, after: ObservedValues | null, source: string | null): ObservationCriterionResult | null {
  const share = step.criteria?.openCircuitVoltage?.atLeastPercentOfBefore;
  if (share === undefined) return null;
  const base = { stepId: step.id, label: step.label, kind: "open-circuit voltage" as const, source, limit: share };
  const rule = `open-circuit voltage after ≥ ${limitPercent(share)} of the voltage before`;
  const v1 = before?.openCircuitVoltageV;
  const v2 = after?.openCircuitVoltageV;
  if (v1 === undefined || v2 === undefined) {
    const missing = v1 === undefined ? `no open-circuit voltage recorded on "${step.compareWith}"` : "no open-circuit voltage recorded on this step";
    return { ...base, rule, observed: missing, value: null, outcome: "not decided" };
  }
  if (v1 <= 0) return { ...base, rule, observed: `the voltage before is ${volts(v1)}: no share can be taken of it`, value: null, outcome: "not decided" };
  const value = computeVoltageSharePercent(v1, v2);
  return {
    ...base,
    rule,
    observed: `${volts(v1)} before, ${volts(v2)} after: ${percent(value)}`,
    value,
    outcome: atLeast(value, share) ? "conforms" : "does not conform",
  };
}

function judgeVisual(step: ResolvedObserveStep, after: ObservedValues | null, source: string | null): ObservationCriterionResult | null {
  const required = step.criteria?.visual;
  if (required === undefined) return null;
  const rule = required.map((outcome) => VISUAL_OUTCOME_WORDS[outcome].toLowerCase()).join(", ");
  const base = { stepId: step.id, label: step.label, kind: "visual state" as const, rule, source, value: null, limit: null };
  if (after?.visual === undefined) return { ...base, observed: "no visual inspection recorded", outcome: "not decided" };
  const seen = new Set(after.visual.noneSeen);
  const unconfirmed = required.filter((outcome) => !seen.has(outcome));
  if (unconfirmed.length === 0) return { ...base, observed: `recorded as none seen: ${rule}`, outcome: "conforms" };
  return {
    ...base,
    observed: `not confirmed in the record: ${unconfirmed.map((outcome) => VISUAL_OUTCOME_WORDS[outcome].toLowerCase()).join(", ")}`,
    outcome: "does not conform",
  };
}

/**
 * The observation steps' records and criteria. Each criterion compares this step's values with those of
 * the observation step it names (`compareWith`), on the first cycle (an observation is not repeated);
 * the limits are the procedure's parameters. A missing value leaves its criterion "not decided".
 */
export function evaluateObservations(
  steps: readonly ResolvedStep[],
  records: readonly Pick<StepRecord, "stepId" | "cycle" | "observed">[],
  source: string | null = null,
): ObservationsResult | undefined {
  const observeSteps = steps.filter((step): step is ResolvedObserveStep => step.kind === "observe");
  if (observeSteps.length === 0) return undefined;
  const observedOn = (stepId: string | undefined): ObservedValues | null =>
    stepId === undefined ? null : (records.find((record) => record.stepId === stepId && record.cycle === 1)?.observed ?? null);
  const criteria = observeSteps.flatMap((step) => {
    const after = observedOn(step.id);
    const before = observedOn(step.compareWith);
    return [judgeMassLoss(step, before, after, source), judgeVoltage(step, before, after, source), judgeVisual(step, after, source)].filter(
      (entry): entry is ObservationCriterionResult => entry !== null,
    );
  });
  return {
    records: observeSteps.map((step) => {
      const observed = observedOn(step.id);
      return { stepId: step.id, label: step.label, records: step.records, observed, visual: readVisual(observed) };
    }),
    criteria,
    decisionRule: OBSERVATION_DECISION_RULE,
  };
}

/** The criteria as statements of conformity, so the specimen's verdict takes them in. */
export function toObservationConformity(result: ObservationsResult | undefined): CriterionConformity[] {
  return (result?.criteria ?? []).map((criterion) => ({
    criterionId: `${criterion.kind} on "${criterion.label}"`,
    outcome: criterion.outcome,
    cycle: 1,
    statement: `${criterion.rule}; observed ${criterion.observed}: ${criterion.outcome}.`,
  }));
}

/** "80.000 g; 3.912 V; Ø or thickness 21.10 mm × height 70.20 mm" — what the step's record shows, in words. */
export function describeObservedValues(observed: ObservedValues | null): { name: string; value: string }[] {
  if (observed === null) return [];
  const rows: { name: string; value: string }[] = [];
  if (observed.massG !== undefined) rows.push({ name: "Mass", value: grams(observed.massG) });
  if (observed.openCircuitVoltageV !== undefined) rows.push({ name: "Open-circuit voltage", value: volts(observed.openCircuitVoltageV) });
  const d = observed.dimensionsMm;
  if (d !== undefined) {
    const mm = (value: number) => `${formatNumber(value, { minDecimals: 2, maxDecimals: 2 })} mm`;
    const parts = [
      ...(d.diameterOrThickness !== undefined ? [`diameter or thickness ${mm(d.diameterOrThickness)}`] : []),
      ...(d.width !== undefined ? [`width ${mm(d.width)}`] : []),
      ...(d.height !== undefined ? [`height ${mm(d.height)}`] : []),
    ];
    if (parts.length > 0) rows.push({ name: "Dimensions", value: parts.join(", ") });
  }
  const visual = readVisual(observed);
  if (visual !== null) {
    const confirmed = visual.filter((entry) => entry.noneSeen).map((entry) => entry.words.toLowerCase());
    const open = visual.filter((entry) => !entry.noneSeen).map((entry) => entry.words.toLowerCase());
    rows.push({
      name: "Visual state",
      value: [confirmed.length > 0 ? `recorded as none seen: ${confirmed.join(", ")}` : "", open.length > 0 ? `not confirmed: ${open.join(", ")}` : ""].filter(Boolean).join("; "),
    });
  }
  return rows;
}
