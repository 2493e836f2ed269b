import type { CellSpecification } from './cell-specification';

/**
 * The names a procedure uses to point at a value of the cell specification, grouped by what the
 * value is, with the specification key that holds it and the words shown to people.
 */
export const currentSpecificationFields = {
  standardChargeCurrent: { key: 'standardChargeCurrentA', label: 'standard charge current' },
  maxChargeCurrent: { key: 'maxChargeCurrentA', label: 'maximum charge current' },
  chargeTerminationCurrent: { key: 'chargeTerminationCurrentA', label: 'charge termination current' },
  maxContinuousDischargeCurrent: {
    key: 'maxContinuousDischargeCurrentA',
    label: 'maximum continuous discharge current',
  },
} as const satisfies Record<string, { key: keyof CellSpecification; label: string }>;

export const voltageSpecificationFields = {
  chargeVoltage: { key: 'chargeVoltageV', label: 'charge voltage' },
  nominalVoltage: { key: 'nominalVoltageV', label: 'nominal voltage' },
  endOfDischargeVoltage: { key: 'endOfDischargeVoltageV', label: 'end-of-discharge voltage' },
} as const satisfies Record<string, { key: keyof CellSpecification; label: string }>;

/** Resistances are held in mΩ in the specification (as datasheets state them). */
export const resistanceSpecificationFields = {
  maxAcResistance: { key: 'maxAcResistanceMOhm', label: 'maximum AC resistance' },
  maxDcResistance: { key: 'maxDcResistanceMOhm', label: 'maximum DC resistance' },
} as const satisfies Record<string, { key: keyof CellSpecification; label: string }>;

export type CurrentSpecificationField = keyof typeof currentSpecificationFields;
export type VoltageSpecificationField = keyof typeof voltageSpecificationFields;
export type ResistanceSpecificationField = keyof typeof resistanceSpecificationFields;
export type SpecificationField = CurrentSpecificationField | VoltageSpecificationField | ResistanceSpecificationField;

export const currentSpecificationFieldNames = [
  'standardChargeCurrent',
  'maxChargeCurrent',
  'chargeTerminationCurrent',
  'maxContinuousDischargeCurrent',
] as const satisfies readonly CurrentSpecificationField[];

export const voltageSpecificationFieldNames = [
  'chargeVoltage',
  'nominalVoltage',
  'endOfDischargeVoltage',
] as const satisfies readonly VoltageSpecificationField[];

export const resistanceSpecificationFieldNames = [
  'maxAcResistance',
  'maxDcResistance',
] as const satisfies readonly ResistanceSpecificationField[];

const allFields = {
  ...currentSpecificationFields,
  ...voltageSpecificationFields,
  ...resistanceSpecificationFields,
};

/** Plain words for a specification field name, e.g. "end-of-discharge voltage". */
export function getSpecificationFieldLabel(field: SpecificationField): string {
  return allFields[field].label;
}

/** The key of the cell specification that holds the value a field name points at. */
export function getSpecificationKey(field: SpecificationField): keyof CellSpecification {
  return allFields[field].key;
}
