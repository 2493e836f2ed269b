// Steps most templates share: the precondition discharge, the manufacturer's CC-CV charge and a
// discharge to the end-of-discharge voltage, each taken from the cell specification.
import type { ChargeStep, DischargeStep } from '../step';
import type { CurrentReference } from '../quantity';

/** Discharge at 0.2 It A to the end-of-discharge voltage before the test charge. */
export function preconditionDischarge(): DischargeStep {
  return {
    kind: 'discharge',
    id: 'precondition',
    label: 'Precondition discharge',
    purpose: 'precondition',
    current: { multipleOfIt: 0.2 },
    endVoltage: { spec: 'endOfDischargeVoltage' },
  };
}

/** CC-CV at the standard charge current to the charge voltage, ending at the termination current. */
export function standardCharge({ id = 'charge', label = 'Charge' }: { id?: string; label?: string } = {}): ChargeStep {
  return {
    kind: 'charge',
    id,
    label,
    current: { spec: 'standardChargeCurrent' },
    voltage: { spec: 'chargeVoltage' },
    termination: { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
  };
}

/** A measured discharge to the end-of-discharge voltage, at 0.2 It A unless another current is given. */
export function measuredDischarge({ id, label, current = { multipleOfIt: 0.2 } }: { id: string; label: string; current?: CurrentReference }): DischargeStep {
  return { kind: 'discharge', id, label, purpose: 'measure', current, endVoltage: { spec: 'endOfDischargeVoltage' } };
}
