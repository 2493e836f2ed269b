// Discharge performance at −20 °C: IEC 61960-3:2017 clause 7.3.2 (clause number recalled).
import type { Procedure } from '../procedure';
import { preconditionDischarge, standardCharge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const dischargeAtMinus20cTemplate: Procedure = {
  header: {
    title: 'Discharge at −20 °C',
    code: 'TPL-LT20',
    scope:
      'Capacity delivered at −20 °C by a cell charged at 20 °C and soaked at −20 °C, compared with its rated capacity.',
    standard: 'IEC 61960-3:2017',
    clause: '7.3.2',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Clause number 7.3.2'),
      noteRecalled('Soak at −20 °C ± 2 °C for 16 h to 24 h before the discharge'),
      noteRecalled('Discharge at 0.2 It A at −20 °C to the end-of-discharge voltage'),
      noteRecalled('Capacity of at least 30 % of the rated capacity'),
      notePractice('Precondition discharge and CC-CV charge at 20 °C as for the rated capacity'),
    ],
  },
  steps: [
    preconditionDischarge(),
    standardCharge({ label: 'Charge at 20 °C' }),
    {
      kind: 'soak',
      id: 'cold-soak',
      label: 'Soak at −20 °C',
      temperature: { nominalC: -20, toleranceC: 2 },
      minDuration: { value: 16, unit: 'h' },
      maxDuration: { value: 24, unit: 'h' },
    },
    {
      kind: 'discharge',
      id: 'discharge',
      label: 'Discharge at −20 °C',
      purpose: 'measure',
      ambient: { nominalC: -20, toleranceC: 2 },
      current: { multipleOfIt: 0.2 },
      endVoltage: { spec: 'endOfDischargeVoltage' },
    },
  ],
  acceptance: [{ kind: 'capacity', id: 'cold-capacity', stepId: 'discharge', atLeastPercent: 30, of: 'rated' }],
  decisionRule: 'simple acceptance',
};
