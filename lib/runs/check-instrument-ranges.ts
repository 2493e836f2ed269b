import type { AccuracySpecification } from "@/lib/instruments/accuracy";
import { formatNumber, type ProcedureResolution, type ResolvedSetPoint, type ResolvedStep } from "@/protocols";

export interface RangedInstrument {
  kind: string;
  identifier: string;
  accuracy: AccuracySpecification;
}

interface SetPoint {
  what: string;
  quantity: "current" | "voltage";
  value: ResolvedSetPoint | undefined;
}

function listSetPoints(step: ResolvedStep): SetPoint[] {
  switch (step.kind) {
    case "charge":
      return [
        { what: "charge current", quantity: "current", value: step.current },
        { what: "charge voltage", quantity: "voltage", value: step.voltage },
      ];
    case "discharge":
      return [
        { what: "discharge current", quantity: "current", value: step.current },
        { what: "end voltage", quantity: "voltage", value: step.endVoltage },
      ];
    case "pulse":
      return [
        { what: "base current", quantity: "current", value: step.baseCurrent },
        { what: "pulse current", quantity: "current", value: step.pulseCurrent },
      ];
    default:
      return [];
  }
}

/**
 * Each set-point the cycler channel must drive or measure, compared with the channel's stated
 * range: a 14.55 A discharge on a 10 A range is outside what the channel is calibrated for, and its
 * accuracy (stated as % of that range) says nothing there. Returns one sentence per set-point
 * outside a range; an instrument that states no range is not judged here.
 */
export function findSetPointsOutsideRange(resolution: Pick<ProcedureResolution, "steps">, instruments: readonly RangedInstrument[]): string[] {
  const problems: string[] = [];
  for (const instrument of instruments.filter((i) => i.kind === "cycler-channel")) {
    for (const step of resolution.steps) {
      for (const point of listSetPoints(step)) {
        const range = instrument.accuracy[point.quantity]?.range;
        if (!point.value || range === undefined || Math.abs(point.value.value) <= range) continue;
        const unit = point.quantity === "current" ? "A" : "V";
        problems.push(
          `step ${step.index + 1} “${step.label}”: its ${point.what} of ${formatNumber(point.value.value, { maxDecimals: 4 })} ${unit} is above the ${formatNumber(range, { maxDecimals: 4 })} ${unit} ${point.quantity} range of cycler channel ${instrument.identifier}`,
        );
      }
    }
  }
  return problems;
}
