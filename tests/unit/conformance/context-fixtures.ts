import { computeStepResults, evaluateDcResistancePulse, segment, type LogColumns } from "@/lib/analysis";
import {
  evaluationOptionsSchema,
  stepRecordSchema,
  type CellRating,
  type EvaluationOptionsInput,
  type LogEvidence,
  type StepContext,
  type StepRecord,
  type StepRecordInput,
} from "@/lib/conformance";
import {
  clauseFourTolerances,
  setPointToleranceNames,
  type ResolvedStep,
  type ResolvedTolerances,
  type ResolvedValue,
  type SiUnit,
} from "@/protocols";

/** A resolved value written as an absolute value, as resolveProcedure would give it. */
export function valueOf(value: number, unit: SiUnit): ResolvedValue {
  return { value, unit, source: { kind: "absolute", value, unit }, explanation: `${value} ${unit} as written` };
}

const clauseFour = Object.fromEntries(
  setPointToleranceNames.map((name) => [name, { value: clauseFourTolerances[name], from: "IEC 61960-3 clause 4" }]),
) as ResolvedTolerances;

const common = {
  index: 0,
  ambient: { minC: 20, maxC: 25, from: "procedure" as const, explanation: "20 °C to 25 °C from the procedure" },
  tolerances: clauseFour,
};

/** Hand-made resolved steps of each kind, for a 3 000 mAh cell (0.2 It = 0.6 A). */
export const steps = {
  charge: {
    ...common,
    id: "charge",
    label: "Charge",
    kind: "charge",
    current: valueOf(1.5, "A"),
    voltage: valueOf(4.2, "V"),
    termination: { kind: "current", current: valueOf(0.06, "A") },
  },
  discharge: {
    ...common,
    id: "discharge",
    label: "Discharge",
    kind: "discharge",
    purpose: "measure",
    current: valueOf(0.6, "A"),
    endVoltage: valueOf(2.5, "V"),
  },
  rest: { ...common, id: "rest", label: "Rest", kind: "rest", minDuration: valueOf(3600, "s"), maxDuration: valueOf(14_400, "s") },
  soak: {
    ...common,
    id: "soak",
    label: "Soak",
    kind: "soak",
    ambient: { minC: -22, maxC: -18, from: "step", explanation: "−20 °C ± 2 °C from the step" },
    temperature: { minC: -22, maxC: -18, from: "step", explanation: "−20 °C ± 2 °C from the step" },
    minDuration: valueOf(57_600, "s"),
  },
  pulse: {
    ...common,
    id: "pulse",
    label: "Pulse",
    kind: "pulse",
    baseCurrent: valueOf(0.6, "A"),
    baseDuration: valueOf(10, "s"),
    pulseCurrent: valueOf(3, "A"),
    pulseDuration: valueOf(1, "s"),
  },
  measure: { ...common, id: "measure", label: "AC resistance", kind: "measure", measurement: { quantity: "acResistance", frequency: { value: 1, unit: "kHz" } } },
  observe: { ...common, id: "observe", label: "Observation after", kind: "observe", records: ["mass", "openCircuitVoltage", "visual"] },
  "cycle-block": {
    ...common,
    id: "cycles",
    label: "Endurance cycles",
    kind: "cycle-block",
    charge: { current: valueOf(1.5, "A"), voltage: valueOf(4.2, "V"), termination: { kind: "current", current: valueOf(0.06, "A") } },
    restAfterCharge: { minDuration: valueOf(1800, "s") },
    discharge: { current: valueOf(1.5, "A"), endVoltage: valueOf(2.75, "V") },
    restAfterDischarge: { minDuration: valueOf(1800, "s") },
    maxCycles: 400,
    capacityCheck: { everyCycles: 50, current: valueOf(0.6, "A") },
    stopBelowPercentOfRated: 60,
    acceptAtLeastPercentOfRated: 60,
    ratedCapacityMah: 3000,
  },
} satisfies Record<ResolvedStep["kind"], ResolvedStep>;

export const rating: CellRating = { maxContinuousDischargeCurrentA: 15, maxChargeCurrentA: 4, chargeVoltageV: 4.2 };

export function recordOf(input: Partial<StepRecordInput> & { stepId: string }): StepRecord {
  return stepRecordSchema.parse({ completed: true, ...input });
}

export const noLog: LogEvidence = { kind: "no log", reason: "no data log was uploaded" };

export function contextOf(input: {
  step: ResolvedStep;
  record?: StepRecord | null;
  evidence?: LogEvidence;
  cellRating?: CellRating;
  options?: EvaluationOptionsInput;
  acknowledged?: readonly string[];
  cycle?: number;
  logStartMs?: number | null;
}): StepContext {
  const acknowledged = new Set(input.acknowledged ?? []);
  return {
    step: input.step,
    cycle: input.cycle ?? 1,
    record: input.record === undefined ? recordOf({ stepId: input.step.id }) : input.record,
    evidence: input.evidence ?? noLog,
    cellRating: input.cellRating ?? rating,
    settings: evaluationOptionsSchema.parse(input.options ?? {}),
    citation: "IEC 61960-3:2017 7.3.1",
    logStartMs: input.logStartMs ?? null,
    isAcknowledged: (code) => acknowledged.has(code),
  };
}

/** A log from (time, voltage, current) rows, 1 s apart unless times are given. */
export function logOf(rows: readonly (readonly [voltageV: number, currentA: number])[], timeS?: readonly number[]): LogColumns {
  return {
    timeS: Float64Array.from(rows, (_, k) => timeS?.[k] ?? k),
    voltageV: Float64Array.from(rows, ([v]) => v),
    currentA: Float64Array.from(rows, ([, c]) => c),
    length: rows.length,
  };
}

/** Evidence for the first phase of a log, as the run evaluation builds it. */
export function evidenceOf(columns: LogColumns, options: { phaseIndex?: number; pulse?: boolean } = {}): LogEvidence {
  const phases = segment(columns);
  if (!phases.ok) throw new Error(phases.error.message);
  const phaseIndex = options.phaseIndex ?? 0;
  const phase = phases.value[phaseIndex];
  if (!phase) throw new Error("no such phase");
  const results = computeStepResults(columns, phase);
  if (!results.ok) throw new Error(results.error.message);
  const pulse = options.pulse ? evaluateDcResistancePulse(columns, phase) : null;
  return { kind: "found", columns, phase, phaseIndex, results: results.value, dcResistance: pulse?.ok ? pulse.value : null };
}

/** n samples of one level. */
export function levelOf(n: number, voltageV: number | ((k: number) => number), currentA: number | ((k: number) => number)): [number, number][] {
  return Array.from({ length: n }, (_, k) => [
    typeof voltageV === "number" ? voltageV : voltageV(k),
    typeof currentA === "number" ? currentA : currentA(k),
  ]);
}
