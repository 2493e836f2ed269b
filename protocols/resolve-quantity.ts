import { assertNever } from './assert-never';
import type { CellSpecification } from './cell-specification';
import { formatNumber, roundSignificant } from './format-number';
import type {
  CurrentReference,
  Duration,
  Frequency,
  ResistanceReference,
  TemperatureRange,
  VoltageReference,
} from './quantity';
import {
  getSpecificationFieldLabel,
  getSpecificationKey,
  type SpecificationField,
} from './specification-fields';
import {
  convertToAmperes,
  convertToBounds,
  convertToHertz,
  convertToOhms,
  convertToSeconds,
  convertToVolts,
} from './units';

export type SiUnit = 'A' | 'V' | 's' | 'Ω' | 'Hz' | 'Ah';

/** Where a resolved value came from, in machine-readable form. */
export type ValueSource =
  | { kind: 'it-multiple'; multipleOfIt: number; ratedCapacityMah: number }
  | { kind: 'specification'; field: SpecificationField; key: keyof CellSpecification; specificationValue: number }
  | { kind: 'absolute'; value: number; unit: string }
  | { kind: 'capacity-share'; percent: number; basis: 'rated' | 'minimum'; capacityMah: number };

/** A concrete value in SI units with its origin and a sentence a person can check. */
export interface ResolvedValue {
  value: number;
  unit: SiUnit;
  source: ValueSource;
  explanation: string;
}

export type QuantityResolution =
  | { ok: true; resolved: ResolvedValue }
  | { ok: false; field: SpecificationField; message: string };

export interface ResolvedTemperatureRange {
  minC: number;
  maxC: number;
  from: 'step' | 'procedure';
  explanation: string;
}

/** How each unit's values are written in explanations. */
export function formatSiValue(value: number, unit: SiUnit): string {
  switch (unit) {
    case 'A':
      return `${formatNumber(value, { maxDecimals: 4 })} A`;
    case 'V':
      return `${formatNumber(value, { minDecimals: 2, maxDecimals: 3 })} V`;
    case 's':
      return `${formatNumber(value, { maxDecimals: 3 })} s`;
    case 'Ω':
      return `${formatNumber(value * 1000, { maxDecimals: 3 })} mΩ`;
    case 'Hz':
      return `${formatNumber(value, { maxDecimals: 3 })} Hz`;
    case 'Ah':
      return `${formatNumber(value * 1000, { maxDecimals: 1 })} mAh`;
    default:
      return assertNever(unit);
  }
}

/** IEC 61434: It (A) = Cn (Ah) / 1 h, with Cn the rated capacity. */
export function computeItAmperes(ratedCapacityMah: number): number {
  return roundSignificant(ratedCapacityMah / 1000);
}

function resolveFromSpecification({
  field,
  cell,
  unit,
  scale = 1,
}: {
  field: SpecificationField;
  cell: CellSpecification;
  unit: SiUnit;
  /** Factor from the specification's unit to the SI unit. */
  scale?: number;
}): QuantityResolution {
  const key = getSpecificationKey(field);
  const specificationValue = cell[key];
  const label = getSpecificationFieldLabel(field);
  if (typeof specificationValue !== 'number') {
    return { ok: false, field, message: `the cell specification does not state the ${label}` };
  }
  const value = roundSignificant(specificationValue * scale);
  return {
    ok: true,
    resolved: {
      value,
      unit,
      source: { kind: 'specification', field, key, specificationValue },
      explanation: `${label} = ${formatSiValue(value, unit)} from the cell specification`,
    },
  };
}

/** The unit in which formatSiValue writes each SI unit, so a value written in it needs no conversion. */
const displayUnits: Record<SiUnit, string> = { A: 'A', V: 'V', s: 's', Ω: 'mOhm', Hz: 'Hz', Ah: 'mAh' };

function resolveAbsolute({
  value,
  unit,
  written,
}: {
  value: number;
  unit: SiUnit;
  written: { value: number; unit: string };
}): ResolvedValue {
  const siText = formatSiValue(value, unit);
  const writtenText = `${formatNumber(written.value, { maxDecimals: 6 })} ${written.unit.replace('Ohm', 'Ω')}`;
  return {
    value,
    unit,
    source: { kind: 'absolute', value: written.value, unit: written.unit },
    explanation: written.unit === displayUnits[unit] ? `${siText} as written` : `${writtenText} = ${siText}`,
  };
}

export function resolveCurrent(reference: CurrentReference, cell: CellSpecification): QuantityResolution {
  if ('multipleOfIt' in reference) {
    // IEC 61434: a current of n It A is n × Cn / 1 h.
    const value = roundSignificant(reference.multipleOfIt * computeItAmperes(cell.ratedCapacityMah));
    return {
      ok: true,
      resolved: {
        value,
        unit: 'A',
        source: { kind: 'it-multiple', multipleOfIt: reference.multipleOfIt, ratedCapacityMah: cell.ratedCapacityMah },
        explanation: `${formatNumber(reference.multipleOfIt, { maxDecimals: 6 })} × It = ${formatSiValue(value, 'A')} from rated ${formatNumber(cell.ratedCapacityMah, { maxDecimals: 1 })} mAh`,
      },
    };
  }
  if ('spec' in reference) return resolveFromSpecification({ field: reference.spec, cell, unit: 'A' });
  return { ok: true, resolved: resolveAbsolute({ value: convertToAmperes(reference), unit: 'A', written: reference }) };
}

export function resolveVoltage(reference: VoltageReference, cell: CellSpecification): QuantityResolution {
  if ('spec' in reference) return resolveFromSpecification({ field: reference.spec, cell, unit: 'V' });
  return { ok: true, resolved: resolveAbsolute({ value: convertToVolts(reference), unit: 'V', written: reference }) };
}

/** Resistances resolve to Ω; the specification holds them in mΩ. */
export function resolveResistance(reference: ResistanceReference, cell: CellSpecification): QuantityResolution {
  if ('spec' in reference) return resolveFromSpecification({ field: reference.spec, cell, unit: 'Ω', scale: 1 / 1000 });
  return { ok: true, resolved: resolveAbsolute({ value: convertToOhms(reference), unit: 'Ω', written: reference }) };
}

export function resolveDuration(duration: Duration): ResolvedValue {
  return resolveAbsolute({ value: convertToSeconds(duration), unit: 's', written: duration });
}

export function resolveFrequency(frequency: Frequency): ResolvedValue {
  return resolveAbsolute({ value: convertToHertz(frequency), unit: 'Hz', written: frequency });
}

export function resolveTemperatureRange(range: TemperatureRange, from: 'step' | 'procedure'): ResolvedTemperatureRange {
  const { minC, maxC } = convertToBounds(range);
  const written =
    'nominalC' in range
      ? `${formatNumber(range.nominalC, { maxDecimals: 2 })} °C ± ${formatNumber(range.toleranceC, { maxDecimals: 2 })} °C`
      : `${formatNumber(minC, { maxDecimals: 2 })} °C to ${formatNumber(maxC, { maxDecimals: 2 })} °C`;
  const bounds = 'nominalC' in range ? ` (${formatNumber(minC, { maxDecimals: 2 })} °C to ${formatNumber(maxC, { maxDecimals: 2 })} °C)` : '';
  return { minC, maxC, from, explanation: `${written}${bounds} from the ${from}` };
}
