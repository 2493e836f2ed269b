import type { CurrentReference, VoltageReference } from './quantity';
import type { CurrentSpecificationField, VoltageSpecificationField } from './specification-fields';
import { convertToAmperes, convertToVolts } from './units';

export type Ordering = 'lower' | 'equal' | 'higher';

const relativeEpsilon = 1e-9;

/** Orders two numbers, treating a relative difference below 1e-9 as equal (floating-point noise). */
export function compareNumbers(a: number, b: number): Ordering {
  const scale = Math.max(Math.abs(a), Math.abs(b));
  if (Math.abs(a - b) <= scale * relativeEpsilon) return 'equal';
  return a < b ? 'lower' : 'higher';
}

/** Pairs [lower, higher] that every valid cell specification guarantees (its own consistency rules). */
const currentOrder: ReadonlyArray<readonly [CurrentSpecificationField, CurrentSpecificationField]> = [
  ['chargeTerminationCurrent', 'standardChargeCurrent'],
  ['chargeTerminationCurrent', 'maxChargeCurrent'],
];
const voltageOrder: ReadonlyArray<readonly [VoltageSpecificationField, VoltageSpecificationField]> = [
  ['endOfDischargeVoltage', 'nominalVoltage'],
  ['nominalVoltage', 'chargeVoltage'],
  ['endOfDischargeVoltage', 'chargeVoltage'],
];

function compareFields<Field extends string>({
  a,
  b,
  order,
}: {
  a: Field;
  b: Field;
  order: ReadonlyArray<readonly [Field, Field]>;
}): Ordering | undefined {
  if (a === b) return 'equal';
  if (order.some(([low, high]) => low === a && high === b)) return 'lower';
  if (order.some(([low, high]) => low === b && high === a)) return 'higher';
  return undefined;
}

/** Values already refused as not positive are not ordered, so one mistake gives one message. */
function compareUsable(a: number, b: number): Ordering | undefined {
  return a > 0 && b > 0 ? compareNumbers(a, b) : undefined;
}

/**
 * Orders two currents when that is possible without a cell specification (both absolute, both
 * multiples of It, or two specification fields whose order the specification rules fix).
 */
export function compareCurrentsWithoutSpecification(a: CurrentReference, b: CurrentReference): Ordering | undefined {
  if ('multipleOfIt' in a) return 'multipleOfIt' in b ? compareUsable(a.multipleOfIt, b.multipleOfIt) : undefined;
  if ('spec' in a) return 'spec' in b ? compareFields({ a: a.spec, b: b.spec, order: currentOrder }) : undefined;
  if ('value' in b) return compareUsable(convertToAmperes(a), convertToAmperes(b));
  return undefined;
}

/** Orders two voltages when that is possible without a cell specification. */
export function compareVoltagesWithoutSpecification(a: VoltageReference, b: VoltageReference): Ordering | undefined {
  if ('spec' in a) return 'spec' in b ? compareFields({ a: a.spec, b: b.spec, order: voltageOrder }) : undefined;
  if ('spec' in b) return undefined;
  return compareUsable(convertToVolts(a), convertToVolts(b));
}
