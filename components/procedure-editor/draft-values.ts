// Pure helpers for the editor's form values. The form holds the draft in exactly the shape the
// server validates (procedureDraftSchema), so a zod path is also a form path; these helpers make
// new steps, criteria and references, and read number inputs.
import type { z } from "zod";
import type { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { assertNever, type AcceptanceCriterionKind, type StepKind } from "@/protocols";

export type DraftFormValues = z.input<typeof procedureDraftSchema>;
export type ProcedureValues = DraftFormValues["definition"];
export type StepValue = ProcedureValues["steps"][number];
export type CriterionValue = ProcedureValues["acceptance"][number];
export type RepeatRuleValue = NonNullable<ProcedureValues["repeat"]>;

/**
 * A number the engineer has still to choose. The editor invents no set-points: a new step leaves
 * its numbers blank, and the schema reports each one as "required" until it is filled in.
 */
export const blank = undefined as unknown as number;

/** A number input's text as a value: blank is undefined (the schema says "required"). */
export function parseNumberInput(text: string): number | undefined {
  const trimmed = text.trim();
  if (trimmed === "") return undefined;
  return Number(trimmed);
}

/** The first of "base", "base-2", "base-3", … that no item uses yet. */
export function createUniqueId(base: string, existingIds: readonly string[]): string {
  const taken = new Set(existingIds);
  if (!taken.has(base)) return base;
  let n = 2;
  while (taken.has(`${base}-${n}`)) n += 1;
  return `${base}-${n}`;
}

const STEP_LABELS: Record<StepKind, string> = {
  charge: "Charge",
  discharge: "Discharge",
  rest: "Rest",
  soak: "Soak",
  pulse: "DC resistance pulse",
  measure: "Measurement",
  observe: "Observation (mass, voltage, visual state)",
  "cycle-block": "Cycle block (endurance: repeated charge, rest, discharge)",
};

export function describeStepKind(kind: StepKind): string {
  return STEP_LABELS[kind];
}

/**
 * A new step of a kind. Set-points that point at the cell specification (charge voltage,
 * end-of-discharge voltage, …) are filled in, since they are the datasheet's own values; numbers
 * the engineer must decide (multiples of It, durations, temperatures) are left blank.
 */
export function createStep(kind: StepKind, existingIds: readonly string[]): StepValue {
  const common = { id: createUniqueId(kind, existingIds), label: STEP_LABELS[kind] };
  switch (kind) {
    case "charge":
      return {
        kind,
        ...common,
        current: { spec: "standardChargeCurrent" },
        voltage: { spec: "chargeVoltage" },
        termination: { kind: "current", current: { spec: "chargeTerminationCurrent" } },
      };
    case "discharge":
      return { kind, ...common, purpose: "measure", current: { multipleOfIt: blank }, endVoltage: { spec: "endOfDischargeVoltage" } };
    case "rest":
      return { kind, ...common, minDuration: { value: blank, unit: "h" } };
    case "soak":
      return { kind, ...common, temperature: { nominalC: blank, toleranceC: blank }, minDuration: { value: blank, unit: "h" } };
    case "pulse":
      return {
        kind,
        ...common,
        baseCurrent: { multipleOfIt: blank },
        baseDuration: { value: blank, unit: "s" },
        pulseCurrent: { multipleOfIt: blank },
        pulseDuration: { value: blank, unit: "s" },
      };
    case "measure":
      return { kind, ...common, measurement: { quantity: "openCircuitVoltage" } };
    case "observe":
      return { kind, ...common, label: "Observation", records: ["mass", "openCircuitVoltage", "visual"] };
    case "cycle-block":
      return {
        kind,
        ...common,
        label: "Endurance cycles",
        charge: {
          current: { spec: "standardChargeCurrent" },
          voltage: { spec: "chargeVoltage" },
          termination: { kind: "current", current: { spec: "chargeTerminationCurrent" } },
        },
        restAfterCharge: { minDuration: { value: blank, unit: "h" } },
        discharge: { current: { multipleOfIt: blank }, endVoltage: { spec: "endOfDischargeVoltage" } },
        restAfterDischarge: { minDuration: { value: blank, unit: "h" } },
        maxCycles: blank,
        stopBelowPercentOfRated: blank,
        acceptAtLeastPercentOfRated: blank,
      };
    default:
      return assertNever(kind);
  }
}

/** A new acceptance criterion judging the first step it can judge (or none yet). */
export function createCriterion(
  kind: AcceptanceCriterionKind,
  { existingIds, steps }: { existingIds: readonly string[]; steps: readonly { id: string; kind: string }[] },
): CriterionValue {
  switch (kind) {
    case "capacity":
    case "discharge-duration": {
      const stepId = steps.find((step) => step.kind === "discharge")?.id ?? "";
      const id = createUniqueId(kind === "capacity" ? "capacity" : "duration", existingIds);
      return kind === "capacity"
        ? { kind, id, stepId, atLeastPercent: blank, of: "rated" }
        : { kind, id, stepId, atLeast: { value: blank, unit: "min" } };
    }
    case "resistance": {
      const step = steps.find((candidate) => candidate.kind === "pulse" || candidate.kind === "measure");
      const atMost = { spec: step?.kind === "measure" ? "maxAcResistance" : "maxDcResistance" } as const;
      return { kind, id: createUniqueId("resistance", existingIds), stepId: step?.id ?? "", atMost };
    }
    default:
      return assertNever(kind);
  }
}

/** A repeat rule to start from: no steps chosen yet, stopping at the first criterion. */
export function createRepeatRule(criterionIds: readonly string[]): RepeatRuleValue {
  return { label: "Cycle", stepIds: [], maxCycles: blank, stopWhenMet: criterionIds[0] ?? "" };
}

/** The notes textarea holds one note per line; blank lines are dropped. */
export function splitNotes(text: string): string[] | undefined {
  const notes = text.split("\n").map((line) => line.trim()).filter(Boolean);
  return notes.length ? notes : undefined;
}

/** Steps `from`..`to` (inclusive, in procedure order) as a repeated block. */
export function listStepRange(stepIds: readonly string[], from: string, to: string): string[] {
  const start = stepIds.indexOf(from);
  const end = stepIds.indexOf(to);
  if (start < 0 || end < start) return [];
  return stepIds.slice(start, end + 1);
}

/** A duration to start from when an optional one is switched on. */
export function createDuration(unit: "s" | "min" | "h" = "h") {
  return { value: blank, unit };
}

/** The acknowledged caution codes with one code added or removed, in a stable order. */
export function toggleAcknowledgement(codes: readonly string[], code: string, acknowledged: boolean): string[] {
  const rest = codes.filter((existing) => existing !== code);
  return acknowledged ? [...rest, code] : rest;
}
