// Pure helpers for the compound inputs: how a reference or a temperature range is written, and
// what it becomes when the engineer switches to another way of writing it.
import {
  assertNever,
  currentSpecificationFieldNames,
  resistanceSpecificationFieldNames,
  voltageSpecificationFieldNames,
} from "@/protocols";
import { blank } from "./draft-values";

export const referenceModes = ["it", "spec", "absolute"] as const;
export type ReferenceMode = (typeof referenceModes)[number];
export type ReferenceQuantity = "current" | "voltage" | "resistance";

/** How a reference is given: a multiple of It, a specification field, or a value with unit. */
export function readReferenceMode(reference: unknown): ReferenceMode {
  if (typeof reference === "object" && reference !== null) {
    if ("multipleOfIt" in reference) return "it";
    if ("spec" in reference) return "spec";
  }
  return "absolute";
}

export const specificationFieldNames = {
  current: currentSpecificationFieldNames,
  voltage: voltageSpecificationFieldNames,
  resistance: resistanceSpecificationFieldNames,
} as const;

export const absoluteUnits = { current: ["A", "mA"], voltage: ["V", "mV"], resistance: ["mOhm", "Ohm"] } as const;

/** The reference a mode starts with; only currents can be a multiple of It. */
export function createReference(quantity: ReferenceQuantity, mode: ReferenceMode) {
  switch (mode) {
    case "it":
      return quantity === "current" ? { multipleOfIt: blank } : { spec: specificationFieldNames[quantity][0] };
    case "spec":
      return { spec: specificationFieldNames[quantity][0] };
    case "absolute":
      return { value: blank, unit: absoluteUnits[quantity][0] };
    default:
      return assertNever(mode);
  }
}

export type TemperatureMode = "nominal" | "bounds";

/** How a temperature range is written: nominal ± tolerance, or lowest to highest. */
export function readTemperatureMode(range: unknown): TemperatureMode {
  return typeof range === "object" && range !== null && ("minC" in range || "maxC" in range) ? "bounds" : "nominal";
}

const isNumber = (value: unknown): value is number => typeof value === "number" && Number.isFinite(value);

/**
 * The same range written the other way, when both of its numbers are known (bounds = nominal ∓
 * tolerance, by definition); otherwise the other form with blanks.
 */
export function switchTemperatureMode(range: unknown, mode: TemperatureMode) {
  const r = (typeof range === "object" && range !== null ? range : {}) as Record<string, unknown>;
  if (mode === "bounds") {
    const { nominalC, toleranceC } = r;
    return isNumber(nominalC) && isNumber(toleranceC)
      ? { minC: nominalC - toleranceC, maxC: nominalC + toleranceC }
      : { minC: blank, maxC: blank };
  }
  const { minC, maxC } = r;
  return isNumber(minC) && isNumber(maxC) && maxC > minC
    ? { nominalC: (minC + maxC) / 2, toleranceC: (maxC - minC) / 2 }
    : { nominalC: blank, toleranceC: blank };
}
