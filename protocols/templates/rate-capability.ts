// Rate capability series: IEC 61960-3:2017 clause 7.3 (discharge performance), extended in the
// trade's usual way to a series of rates up to the cell's maximum continuous discharge current.
import type { Procedure } from '../procedure';
import type { CurrentReference } from '../quantity';
import type { Step } from '../step';
import { measuredDischarge, preconditionDischarge, standardCharge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

// `words` follows "the … discharge"; `at` follows "Discharge at …".
const rates: ReadonlyArray<{ key: string; words: string; at: string; current: CurrentReference }> = [
  { key: '02it', words: '0.2 It', at: '0.2 It', current: { multipleOfIt: 0.2 } },
  { key: '05it', words: '0.5 It', at: '0.5 It', current: { multipleOfIt: 0.5 } },
  { key: '1it', words: '1 It', at: '1 It', current: { multipleOfIt: 1 } },
  { key: 'max', words: 'maximum continuous current', at: 'the maximum continuous current', current: { spec: 'maxContinuousDischargeCurrent' } },
];

function buildCycle(rate: (typeof rates)[number], isLast: boolean): Step[] {
  const cycle: Step[] = [
    standardCharge({ id: `charge-${rate.key}`, label: `Charge before the ${rate.words} discharge` }),
    {
      kind: 'rest',
      id: `rest-${rate.key}`,
      label: `Rest before the ${rate.words} discharge`,
      minDuration: { value: 1, unit: 'h' },
    },
    measuredDischarge({ id: `discharge-${rate.key}`, label: `Discharge at ${rate.at}`, current: rate.current }),
  ];
  if (isLast) return cycle;
  return [
    ...cycle,
    {
      kind: 'rest',
      id: `rest-after-${rate.key}`,
      label: `Rest after the ${rate.words} discharge`,
      minDuration: { value: 1, unit: 'h' },
    },
  ];
}

export const rateCapabilityTemplate: Procedure = {
  header: {
    title: 'Rate capability',
    code: 'TPL-RATE',
    scope:
      'Delivered capacity at 0.2 It, 0.5 It, 1 It and the maximum continuous discharge current, each after a standard charge and a rest of at least 1 h. Reports capacities; sets no acceptance limit.',
    standard: 'IEC 61960-3:2017',
    clause: '7.3',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Clause 7.3 as the home of discharge performance at several rates'),
      noteRecalled('Precondition discharge at 0.2 It A to the end-of-discharge voltage'),
      notePractice('Series of rates 0.2 It, 0.5 It, 1 It and the maximum continuous current'),
      notePractice('Rest of at least 1 h after each charge and after each discharge'),
    ],
  },
  steps: [
    preconditionDischarge(),
    ...rates.flatMap((rate, index) => buildCycle(rate, index === rates.length - 1)),
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
};
