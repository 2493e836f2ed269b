import { assertNever } from './assert-never';
import { formatDuration, formatQuantity } from './format-quantity';
import type { Duration, QuantityReference } from './quantity';
import { getSpecificationFieldLabel } from './specification-fields';
import { OBSERVED_QUANTITY_WORDS, type ObservedQuantity } from './observation';
import type { ChargeTermination, Measurement, Step } from './step';

function describeObservation(records: readonly ObservedQuantity[], compareWith: string | undefined): string {
  const what = records.map((quantity) => OBSERVED_QUANTITY_WORDS[quantity].replace(/ \(.*\)$/, ''));
  const list = what.length > 1 ? `${what.slice(0, -1).join(', ')} and ${what[what.length - 1]}` : (what[0] ?? '');
  return `Observe the ${list}${compareWith ? `, against observation "${compareWith}"` : ''}`;
}

/** A reference inside a sentence: "0.2 It", "the specified charge voltage", "5 A". */
function phrase(quantity: QuantityReference): string {
  if ('spec' in quantity) return `the specified ${getSpecificationFieldLabel(quantity.spec)}`;
  return formatQuantity(quantity);
}

function describeSpan(min: Duration, max: Duration | undefined): string {
  return max ? `${formatDuration(min)} to ${formatDuration(max)}` : `at least ${formatDuration(min)}`;
}

function describeTermination(termination: ChargeTermination): string {
  switch (termination.kind) {
    case 'current':
      return `ending when the current falls to ${phrase(termination.current)}`;
    case 'time':
      return `ending after ${formatDuration(termination.duration)}`;
    default:
      return assertNever(termination);
  }
}

function describeMeasurement(measurement: Measurement): string {
  switch (measurement.quantity) {
    case 'mass':
      return 'Measure the mass';
    case 'openCircuitVoltage':
      return 'Measure the open-circuit voltage';
    case 'acResistance':
      return `Measure the AC resistance at ${formatQuantity(measurement.frequency)}`;
    case 'dimensions':
      return 'Measure the dimensions';
    default:
      return assertNever(measurement);
  }
}

/** One plain-English line summing up a step, e.g. "Rest 1 h to 4 h". */
export function describeStep(step: Step): string {
  switch (step.kind) {
    case 'charge': {
      const limit = step.maxDuration ? ` (at most ${formatDuration(step.maxDuration)})` : '';
      return `CC-CV charge at ${phrase(step.current)} to ${phrase(step.voltage)}, ${describeTermination(step.termination)}${limit}`;
    }
    case 'discharge': {
      const limit = step.maxDuration ? ` (at most ${formatDuration(step.maxDuration)})` : '';
      const core = `discharge at ${phrase(step.current)} to ${phrase(step.endVoltage)}${limit}`;
      return step.purpose === 'precondition' ? `Precondition: ${core}` : `Capacity ${core}`;
    }
    case 'rest':
      return `Rest ${describeSpan(step.minDuration, step.maxDuration)}`;
    case 'soak':
      return `Soak at ${formatQuantity(step.temperature)} for ${describeSpan(step.minDuration, step.maxDuration)}`;
    case 'pulse':
      return `DC resistance pulse: ${phrase(step.baseCurrent)} for ${formatDuration(step.baseDuration)}, then ${phrase(step.pulseCurrent)} for ${formatDuration(step.pulseDuration)}`;
    case 'measure':
      return describeMeasurement(step.measurement);
    case 'observe':
      return describeObservation(step.records, step.compareWith);
    case 'cycle-block': {
      const check = step.capacityCheck
        ? `, a capacity check at ${phrase(step.capacityCheck.current)} every ${step.capacityCheck.everyCycles} cycles`
        : '';
      return (
        `Up to ${step.maxCycles} cycles of: CC-CV charge at ${phrase(step.charge.current)} to ${phrase(step.charge.voltage)}, ` +
        `${describeTermination(step.charge.termination)}; rest ${describeSpan(step.restAfterCharge.minDuration, step.restAfterCharge.maxDuration)}; ` +
        `discharge at ${phrase(step.discharge.current)} to ${phrase(step.discharge.endVoltage)}; ` +
        `rest ${describeSpan(step.restAfterDischarge.minDuration, step.restAfterDischarge.maxDuration)}${check}. ` +
        `Stops below ${step.stopBelowPercentOfRated} % of the rated capacity; accepted at ${step.acceptAtLeastPercentOfRated} % or more after the last cycle`
      );
    }
    default:
      return assertNever(step);
  }
}
