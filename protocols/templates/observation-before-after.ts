// Observation before and after a test, judged by the criteria of UN Manual of Tests and Criteria 38.3.4
// (tests T1 to T5; values recalled, docs/references.md §14, §17): mass loss by the cell's mass band, open-
// circuit voltage after at least a share of the voltage before, and no leakage, venting, disassembly,
// rupture or fire. The bands and the share are this template's parameters; the lab checks them against
// the Manual's text. The storage between the observations stands for the lab's own test condition.
import type { Procedure } from '../procedure';
import { noteRecalled } from './template-notes';

export const observationBeforeAfterTemplate: Procedure = {
  header: {
    title: 'Observation before and after storage: mass, open-circuit voltage, visual state',
    code: 'TPL-OBS',
    scope:
      'Mass, open-circuit voltage, dimensions and visual state of a cell recorded before and after a period on open circuit (or the test condition the lab sets in its place), judged by the mass-loss, voltage and visual criteria of the transport tests.',
    standard: 'UN Manual of Tests and Criteria',
    clause: '38.3.4 (T1 to T5), criteria',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Mass-loss limits by the mass before the test: below 1 g at most 0.5 %; 1 g to 75 g at most 0.2 %; above 75 g at most 0.1 %'),
      noteRecalled('Open-circuit voltage after the test at least 90 % of the voltage immediately before it (not required for cells tested fully discharged)'),
      noteRecalled('No leakage, no venting, no disassembly, no rupture and no fire'),
      'The storage step stands for the test condition: replace it with the lab\'s own procedure for the condition (altitude, thermal, vibration, shock) where one applies.',
      'No data log is needed: every step is recorded on the step sheet.',
    ],
  },
  steps: [
    {
      kind: 'observe',
      id: 'before',
      label: 'Observation before',
      records: ['mass', 'openCircuitVoltage', 'dimensions', 'visual'],
      instructions: 'Weigh the cell on the balance, read its open-circuit voltage with the voltmeter at the terminals, measure its dimensions and look it over.',
    },
    {
      kind: 'soak',
      id: 'storage',
      label: 'Storage on open circuit',
      temperature: { nominalC: 20, toleranceC: 5 },
      minDuration: { value: 24, unit: 'h' },
      instructions: 'Keep the cell on open circuit; connect no charger or load.',
    },
    {
      kind: 'observe',
      id: 'after',
      label: 'Observation after',
      records: ['mass', 'openCircuitVoltage', 'dimensions', 'visual'],
      compareWith: 'before',
      criteria: {
        massLoss: {
          bands: [
            { upToG: 1, upToIncluded: false, maxLossPercent: 0.5 },
            { upToG: 75, upToIncluded: true, maxLossPercent: 0.2 },
            { maxLossPercent: 0.1 },
          ],
        },
        openCircuitVoltage: { atLeastPercentOfBefore: 90 },
        visual: ['leakage', 'venting', 'disassembly', 'rupture', 'fire'],
      },
      instructions: 'Weigh, read the open-circuit voltage and measure as before, on the same instruments; look the cell over for leakage, venting, disassembly, rupture and fire.',
    },
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
};
