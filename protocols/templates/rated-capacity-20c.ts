// Rated capacity at 20 °C: IEC 61960-3:2017 clause 7.2 (charge for test purposes) and 7.3.1
// (discharge performance at 20 °C). Values are template parameters; see `notes` for their marks.
import type { Procedure } from '../procedure';
import { preconditionDischarge, standardCharge, measuredDischarge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const ratedCapacityAt20cTemplate: Procedure = {
  header: {
    title: 'Rated capacity at 20 °C',
    code: 'TPL-RC20',
    scope:
      'Delivered capacity of a cell discharged at 0.2 It A to its end-of-discharge voltage after a full charge, compared with its rated capacity.',
    standard: 'IEC 61960-3:2017',
    clause: '7.2, 7.3.1',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Precondition discharge at 0.2 It A to the end-of-discharge voltage before the test charge'),
      notePractice('CC-CV charge at the standard charge current to the charge voltage, ending at the termination current (the method the manufacturer declares)'),
      noteRecalled('Rest of not less than 1 h and not more than 4 h after charge'),
      noteRecalled('Up to 5 cycles, ending at the first cycle that meets the requirement'),
    ],
  },
  steps: [
    preconditionDischarge(),
    standardCharge(),
    {
      kind: 'rest',
      id: 'rest',
      label: 'Rest after charge',
      minDuration: { value: 1, unit: 'h' },
      maxDuration: { value: 4, unit: 'h' },
    },
    measuredDischarge({ id: 'discharge', label: 'Capacity discharge at 0.2 It' }),
  ],
  acceptance: [{ kind: 'capacity', id: 'rated-capacity', stepId: 'discharge', atLeastPercent: 100, of: 'rated' }],
  decisionRule: 'simple acceptance',
  repeat: {
    label: 'Capacity cycle',
    stepIds: ['charge', 'rest', 'discharge'],
    maxCycles: 5,
    stopWhenMet: 'rated-capacity',
  },
};
