// Pure display helpers for a resolved procedure: values with units beside them, long durations
// in h and min, each set-point of a step with the sentence that says where it came from.
import {
  assertNever,
  describeObservationCriteria,
  formatNumber,
  OBSERVED_QUANTITY_WORDS,
  formatSiValue,
  type Measurement,
  type ResolvedSetPoint,
  type ResolvedStep,
  type ResolvedTemperatureRange,
  type ResolvedTolerances,
  type ResolvedValue,
} from "@/protocols";

/** A duration in seconds as people read it: "90 s", "5 min", "1 h 30 min", "672 h (28 days)". */
export function formatSeconds(seconds: number): string {
  if (seconds < 120) return `${formatNumber(seconds, { maxDecimals: 3 })} s`;
  const hours = Math.floor(seconds / 3600);
  const minutes = Math.floor((seconds - hours * 3600) / 60);
  const rest = seconds - hours * 3600 - minutes * 60;
  const parts = [
    hours > 0 ? `${formatNumber(hours)} h` : "",
    minutes > 0 ? `${minutes} min` : "",
    rest > 0 ? `${formatNumber(rest, { maxDecimals: 3 })} s` : "",
  ].filter(Boolean);
  const isWholeDays = hours >= 48 && minutes === 0 && rest === 0 && hours % 24 === 0;
  return isWholeDays ? `${parts.join(" ")} (${formatNumber(hours / 24)} days)` : parts.join(" ");
}

/** A resolved value with its unit: "0.6 A", "4.20 V", "1 h 30 min", "25 mΩ", "1 kHz", "3 000 mAh". */
export function formatResolvedValue(resolved: ResolvedValue): string {
  switch (resolved.unit) {
    case "s":
      return formatSeconds(resolved.value);
    case "Hz":
      return resolved.value >= 1000
        ? `${formatNumber(resolved.value / 1000, { maxDecimals: 3 })} kHz`
        : formatSiValue(resolved.value, "Hz");
    case "A":
    case "V":
    case "Ω":
    case "Ah":
      return formatSiValue(resolved.value, resolved.unit);
    default:
      return assertNever(resolved.unit);
  }
}

export interface SetPointLine {
  name: string;
  value: string;
  explanation: string;
  /** The cell specification could not supply it; an error says why. */
  missing: boolean;
}

const MISSING: Omit<SetPointLine, "name"> = {
  value: "—",
  explanation: "not available for this cell; see the problems above",
  missing: true,
};

function toLines(name: string, resolved: ResolvedSetPoint | undefined): SetPointLine[] {
  if (resolved === undefined) return [];
  if (resolved === null) return [{ name, ...MISSING }];
  return [{ name, value: formatResolvedValue(resolved), explanation: resolved.explanation, missing: false }];
}

/** A temperature range as bounds: "15 °C to 25 °C". */
export function formatTemperatureRange(range: ResolvedTemperatureRange): string {
  return `${formatNumber(range.minC, { maxDecimals: 2 })} °C to ${formatNumber(range.maxC, { maxDecimals: 2 })} °C`;
}

export function describeMeasurement(measurement: Measurement): string {
  switch (measurement.quantity) {
    case "mass":
      return "mass";
    case "openCircuitVoltage":
      return "open-circuit voltage";
    case "acResistance":
      return "AC resistance";
    case "dimensions":
      return "dimensions";
    default:
      return assertNever(measurement);
  }
}

/** Every set-point of a resolved step, in the order an operator programs them. */
export function listSetPoints(step: ResolvedStep): SetPointLine[] {
  switch (step.kind) {
    case "charge": {
      const termination =
        step.termination.kind === "current"
          ? toLines("Ends at current", step.termination.current)
          : toLines("Ends after", step.termination.duration);
      return [...toLines("Current", step.current), ...toLines("Voltage", step.voltage), ...termination, ...toLines("Longest", step.maxDuration)];
    }
    case "discharge":
      return [...toLines("Current", step.current), ...toLines("End voltage", step.endVoltage), ...toLines("Longest", step.maxDuration)];
    case "rest":
      return [...toLines("Shortest", step.minDuration), ...toLines("Longest", step.maxDuration)];
    case "soak":
      return [
        { name: "Temperature", value: formatTemperatureRange(step.temperature), explanation: step.temperature.explanation, missing: false },
        ...toLines("Shortest", step.minDuration),
        ...toLines("Longest", step.maxDuration),
      ];
    case "pulse":
      return [
        ...toLines("Base current", step.baseCurrent),
        ...toLines("Base for", step.baseDuration),
        ...toLines("Pulse current", step.pulseCurrent),
        ...toLines("Pulse for", step.pulseDuration),
      ];
    case "measure":
      return [
        { name: "Measure", value: describeMeasurement(step.measurement), explanation: "", missing: false },
        ...toLines("Frequency", step.frequency),
      ];
    case "observe":
      return [
        { name: "Records", value: step.records.map((quantity) => OBSERVED_QUANTITY_WORDS[quantity]).join(", "), explanation: "", missing: false },
        ...(step.compareWith ? [{ name: "Compared with", value: `observation "${step.compareWith}"`, explanation: "", missing: false }] : []),
        ...describeObservationCriteria(step.criteria).map((value) => ({ name: "Criterion", value, explanation: "the procedure's limit", missing: false })),
      ];
    case "cycle-block": {
      const termination =
        step.charge.termination.kind === "current"
          ? toLines("Charge ends at current", step.charge.termination.current)
          : toLines("Charge ends after", step.charge.termination.duration);
      const check = step.capacityCheck;
      return [
        ...toLines("Charge current", step.charge.current),
        ...toLines("Charge voltage", step.charge.voltage),
        ...termination,
        ...toLines("Rest after charge, shortest", step.restAfterCharge.minDuration),
        ...toLines("Rest after charge, longest", step.restAfterCharge.maxDuration),
        ...toLines("Discharge current", step.discharge.current),
        ...toLines("End voltage", step.discharge.endVoltage),
        ...toLines("Rest after discharge, shortest", step.restAfterDischarge.minDuration),
        ...toLines("Rest after discharge, longest", step.restAfterDischarge.maxDuration),
        { name: "Cycles", value: `at most ${formatNumber(step.maxCycles)}`, explanation: "the procedure's number of cycles", missing: false },
        ...(check
          ? [
              { name: "Capacity check", value: `every ${formatNumber(check.everyCycles)} cycles`, explanation: "the procedure's interval", missing: false },
              ...toLines("Capacity-check current", check.current),
            ]
          : []),
        {
          name: "Stops",
          value: `below ${formatNumber(step.stopBelowPercentOfRated, { maxDecimals: 2 })} % of rated`,
          explanation: `${formatNumber((step.stopBelowPercentOfRated / 100) * step.ratedCapacityMah, { maxDecimals: 1 })} mAh of the rated ${formatNumber(step.ratedCapacityMah, { maxDecimals: 1 })} mAh`,
          missing: false,
        },
        {
          name: "Accepted",
          value: `at least ${formatNumber(step.acceptAtLeastPercentOfRated, { maxDecimals: 2 })} % of rated after the last cycle`,
          explanation: `${formatNumber((step.acceptAtLeastPercentOfRated / 100) * step.ratedCapacityMah, { maxDecimals: 1 })} mAh of the rated ${formatNumber(step.ratedCapacityMah, { maxDecimals: 1 })} mAh`,
          missing: false,
        },
      ];
    }
    default:
      return assertNever(step);
  }
}

/** The kind of a step in words, with a discharge's purpose. */
export function describeResolvedKind(step: ResolvedStep): string {
  if (step.kind === "discharge") return step.purpose === "measure" ? "discharge (measured)" : "discharge (precondition)";
  if (step.kind === "pulse") return "DC pulse";
  if (step.kind === "observe") return "observation";
  if (step.kind === "cycle-block") return "cycle block";
  return step.kind;
}

const TOLERANCE_WORDS = {
  voltagePercent: { name: "U", unit: "%" },
  currentPercent: { name: "I", unit: "%" },
  temperatureC: { name: "T", unit: "°C" },
  timePercent: { name: "t", unit: "%" },
} as const;

const SOURCE_WORDS = { step: "set on the step", procedure: "set on the procedure", "IEC 61960-3 clause 4": "IEC 61960-3 clause 4" };

/**
 * Tolerances in the trade's symbols, "U ±1 %, I ±1 %, T ±2 °C, t ±0.1 %", and where they were set
 * ("from IEC 61960-3 clause 4", or per tolerance when they come from different places).
 */
export function formatTolerances(tolerances: ResolvedTolerances): { text: string; source: string } {
  const entries = (Object.keys(TOLERANCE_WORDS) as (keyof typeof TOLERANCE_WORDS)[]).map((key) => ({
    ...TOLERANCE_WORDS[key],
    ...tolerances[key],
  }));
  const text = entries.map((e) => `${e.name} ±${formatNumber(e.value, { maxDecimals: 3 })} ${e.unit}`).join(", ");
  const sources = new Set(entries.map((e) => e.from));
  const source =
    sources.size === 1
      ? `from ${SOURCE_WORDS[entries[0]?.from ?? "IEC 61960-3 clause 4"]}`
      : entries.map((e) => `${e.name}: ${SOURCE_WORDS[e.from]}`).join("; ");
  return { text, source };
}
