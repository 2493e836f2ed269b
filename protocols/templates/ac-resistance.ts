// AC internal resistance: IEC 61960-3:2017 clause 7.7 (AC method), Rac = Ua / Ia.
import type { Procedure } from '../procedure';
import { standardCharge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const acResistanceTemplate: Procedure = {
  header: {
    title: 'AC internal resistance',
    code: 'TPL-ACR',
    scope:
      'AC internal resistance of a fully charged cell at 1 kHz, Rac = Ua / Ia, compared with the maximum AC resistance of the cell specification.',
    standard: 'IEC 61960-3:2017',
    clause: '7.7',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Measuring frequency 1.0 kHz ± 0.1 kHz, applied for 1 s to 5 s, peak voltage at most 20 mV'),
      noteRecalled('Rest of 1 h to 4 h after charge before the measurement'),
      notePractice('Charge at the standard charge current to the charge voltage, ending at the termination current'),
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
      kind: 'measure',
      id: 'ac-resistance',
      label: 'AC resistance at 1 kHz',
      measurement: { quantity: 'acResistance', frequency: { value: 1, unit: 'kHz' } },
    },
  ],
  acceptance: [
    { kind: 'resistance', id: 'ac-resistance-limit', stepId: 'ac-resistance', atMost: { spec: 'maxAcResistance' } },
  ],
  decisionRule: 'simple acceptance',
};
