import type { ProgrammedField } from "@/lib/conformance";
import { assertNever, type ResolvedSetPoint, type ResolvedStep } from "@/protocols";

/** One set-point the operator types in as programmed, in the unit the cycler shows it. */
export interface ProgrammedFieldSpec {
  name: ProgrammedField;
  label: string;
  unit: "A" | "V" | "s" | "min" | "°C";
  /** Multiply the typed value by this to get the record's SI unit (s for durations). */
  toSi: number;
  /** The resolved set-point in the field's unit, offered as the value to program. */
  suggested: number | null;
}

const fromSi = (resolved: ResolvedSetPoint | undefined, toSi: number) => (resolved ? resolved.value / toSi : null);

function field(name: ProgrammedField, label: string, unit: ProgrammedFieldSpec["unit"], resolved: ResolvedSetPoint | undefined): ProgrammedFieldSpec {
  const toSi = unit === "min" ? 60 : 1;
  return { name, label, unit, toSi, suggested: fromSi(resolved, toSi) };
}

/** The set-points a step of this kind is programmed with, in the order they are keyed in. */
export function listProgrammedFields(step: ResolvedStep): ProgrammedFieldSpec[] {
  switch (step.kind) {
    case "charge":
      return [
        field("current", "Charge current", "A", step.current),
        field("voltage", "Charge voltage", "V", step.voltage),
        step.termination.kind === "current"
          ? field("terminationCurrent", "Termination current", "A", step.termination.current)
          : field("terminationDuration", "Charge time", "min", step.termination.duration),
        ...(step.maxDuration ? [field("maxDuration", "Time limit", "min", step.maxDuration)] : []),
      ];
    case "discharge":
      return [
        field("current", "Discharge current", "A", step.current),
        field("endVoltage", "End voltage", "V", step.endVoltage),
        ...(step.maxDuration ? [field("maxDuration", "Time limit", "min", step.maxDuration)] : []),
      ];
    case "rest":
      return [field("duration", "Rest time", "min", step.minDuration)];
    case "soak":
      return [
        { name: "temperature", label: "Chamber temperature", unit: "°C", toSi: 1, suggested: (step.temperature.minC + step.temperature.maxC) / 2 },
        field("duration", "Soak time", "min", step.minDuration),
      ];
    case "pulse":
      return [
        field("baseCurrent", "Base current", "A", step.baseCurrent),
        field("baseDuration", "Base time", "s", step.baseDuration),
        field("pulseCurrent", "Pulse current", "A", step.pulseCurrent),
        field("pulseDuration", "Pulse time", "s", step.pulseDuration),
      ];
    case "measure":
    case "observe":
    case "cycle-block":
      return [];
    default:
      return assertNever(step);
  }
}
