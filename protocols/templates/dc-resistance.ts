// DC internal resistance by a two-level discharge pulse: IEC 61960-3:2017 clause 7.7
// (DC method). R = (U1 − U2) / (I2 − I1) is computed in lib/analysis from the recorded log.
import type { Procedure } from '../procedure';
import { standardCharge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const dcResistanceTemplate: Procedure = {
  header: {
    title: 'DC internal resistance',
    code: 'TPL-DCR',
    scope:
      'DC internal resistance of a fully charged cell from a two-level discharge pulse: I1 = 0.2 It A for 10 s, then I2 = 1 It A for 1 s; R = (U1 − U2) / (I2 − I1).',
    standard: 'IEC 61960-3:2017',
    clause: '7.7',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Pulse levels 0.2 It A for 10 s then 1 It A for 1 s (high confidence)'),
      noteRecalled('Rest of 1 h to 4 h after charge before the pulse'),
      notePractice('Charge at the standard charge current to the charge voltage, ending at the termination current'),
      'No acceptance limit: datasheets seldom declare a DC resistance; add a resistance criterion when yours does.',
    ],
  },
  steps: [
    standardCharge(),
    {
      kind: 'rest',
      id: 'rest',
      label: 'Rest after charge',
      minDuration: { value: 1, unit: 'h' },
      maxDuration: { value: 4, unit: 'h' },
    },
    {
      kind: 'pulse',
      id: 'pulse',
      label: 'Two-level pulse',
      baseCurrent: { multipleOfIt: 0.2 },
      baseDuration: { value: 10, unit: 's' },
      pulseCurrent: { multipleOfIt: 1 },
      pulseDuration: { value: 1, unit: 's' },
    },
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
};
