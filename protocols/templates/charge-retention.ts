// Charge retention after storage: IEC 61960-3:2017 clause 7.4 (clause number recalled).
import type { Procedure } from '../procedure';
import { preconditionDischarge, standardCharge, measuredDischarge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const chargeRetentionTemplate: Procedure = {
  header: {
    title: 'Charge retention after 28 days',
    code: 'TPL-RET28',
    scope:
      'Capacity remaining in a fully charged cell after open-circuit storage of 28 days at 20 °C, discharged at 0.2 It A to its end-of-discharge voltage.',
    standard: 'IEC 61960-3:2017',
    clause: '7.4',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Clause number 7.4'),
      noteRecalled('Storage of 28 days at 20 °C ± 5 °C on open circuit'),
      noteRecalled('Discharge after storage at 0.2 It A to the end-of-discharge voltage'),
      notePractice('Precondition discharge and CC-CV charge as for the rated capacity'),
      'No acceptance limit set: enter the retention limit from the standard\'s text as a capacity criterion on step "discharge".',
    ],
  },
  steps: [
    preconditionDischarge(),
    standardCharge(),
    {
      kind: 'rest',
      id: 'storage',
      label: 'Storage on open circuit',
      minDuration: { value: 672, unit: 'h' },
      instructions: 'Store the cell on open circuit; do not connect it to a charger or a load.',
    },
    measuredDischarge({ id: 'discharge', label: 'Discharge after storage' }),
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
};
