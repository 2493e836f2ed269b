// Charge (capacity) retention and recovery after storage: IEC 61960-3:2017 clause 7.4 (clause number
// recalled). Retention: the capacity of the discharge after storage; recovery: the capacity of the
// discharge after the cell is charged again. Both are reported as percentages of the basis in `retention`.
import type { Procedure } from '../procedure';
import { preconditionDischarge, standardCharge, measuredDischarge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const chargeRetentionTemplate: Procedure = {
  header: {
    title: 'Charge retention and recovery after 28 days',
    code: 'TPL-RET28',
    scope:
      'Capacity remaining in a fully charged cell after open-circuit storage of 28 days at 20 °C (retention), and capacity after it is charged again (recovery), each discharged at 0.2 It A to its end-of-discharge voltage and stated as a percentage of the rated capacity.',
    standard: 'IEC 61960-3:2017',
    clause: '7.4',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Clause number 7.4'),
      noteRecalled('Storage of 28 days at 20 °C ± 5 °C on open circuit'),
      noteRecalled('Discharge after storage at 0.2 It A to the end-of-discharge voltage (retention)'),
      noteRecalled('Recovery: charge again as before the storage, rest 1 h to 4 h, discharge at 0.2 It A to the end-of-discharge voltage'),
      noteRecalled('Retention and recovery stated as percentages of the rated capacity (set "capacity before storage" and add a measured discharge and a charge before the storage to use the measured capacity instead)'),
      notePractice('Precondition discharge and CC-CV charge as for the rated capacity'),
      'No acceptance limit set: none is published in our references. Enter the retention and recovery limits from the standard\'s text as capacity criteria (percentage of the rated capacity) on the steps "discharge" and "recovery-discharge".',
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
    measuredDischarge({ id: 'discharge', label: 'Discharge after storage (retention)' }),
    standardCharge({ id: 'recovery-charge', label: 'Charge after storage' }),
    {
      kind: 'rest',
      id: 'recovery-rest',
      label: 'Rest after charge',
      minDuration: { value: 1, unit: 'h' },
      maxDuration: { value: 4, unit: 'h' },
    },
    measuredDischarge({ id: 'recovery-discharge', label: 'Recovery discharge' }),
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
  retention: { afterStorageStepId: 'discharge', recoveryStepId: 'recovery-discharge', basis: 'rated capacity' },
};
