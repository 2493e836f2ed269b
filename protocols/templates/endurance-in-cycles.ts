// Endurance in cycles: IEC 61960-3:2017, endurance-in-cycles clause (number recalled as 7.6). The cell is
// charged, rested, discharged and rested again up to 400 times; every 50th cycle discharges at 0.2 It A
// as the capacity check; the test stops when a capacity check falls below 60 % of the rated capacity and
// the cell is accepted with at least 60 % after the last cycle. Every value is a parameter of the cycle
// block; docs/references.md §18 marks each one.
import type { Procedure } from '../procedure';
import { preconditionDischarge } from './common-steps';
import { notePractice, noteRecalled } from './template-notes';

export const enduranceInCyclesTemplate: Procedure = {
  header: {
    title: 'Endurance in cycles',
    code: 'TPL-END400',
    scope:
      'Capacity of a cell over repeated charge and discharge cycles at 20 °C: up to 400 cycles of CC-CV charge and 0.5 It A discharge, with a capacity check at 0.2 It A every 50 cycles, stated as a share of the rated capacity.',
    standard: 'IEC 61960-3:2017',
    clause: '7.6 (endurance in cycles)',
    ambient: { nominalC: 20, toleranceC: 5 },
    notes: [
      noteRecalled('Clause number 7.6 for endurance in cycles'),
      '400 cycles for a cell (300 for a battery): published in a trade summary of IEC 61960; verify against the standard.',
      notePractice('CC-CV charge of each cycle at the standard charge current to the charge voltage, ending at the termination current (the method the manufacturer declares)'),
      noteRecalled('Rest of 0.5 h to 4 h after each charge and after each discharge'),
      noteRecalled('Discharge of each cycle at 0.5 It A to the end-of-discharge voltage'),
      noteRecalled('Capacity check every 50 cycles: that cycle discharges at 0.2 It A'),
      noteRecalled('The test ends when a capacity check gives less than 60 % of the rated capacity'),
      noteRecalled('Accepted when the capacity after the last cycle is at least 60 % of the rated capacity'),
      'Lithium cells cycled for weeks can heat up, vent or burn: run the test in the lab\'s fire-safe enclosure and follow the lab\'s own safety rules and local codes.',
    ],
  },
  steps: [
    preconditionDischarge(),
    {
      kind: 'cycle-block',
      id: 'cycles',
      label: 'Endurance cycles',
      charge: {
        current: { spec: 'standardChargeCurrent' },
        voltage: { spec: 'chargeVoltage' },
        termination: { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
      },
      restAfterCharge: { minDuration: { value: 0.5, unit: 'h' }, maxDuration: { value: 4, unit: 'h' } },
      discharge: { current: { multipleOfIt: 0.5 }, endVoltage: { spec: 'endOfDischargeVoltage' } },
      restAfterDischarge: { minDuration: { value: 0.5, unit: 'h' }, maxDuration: { value: 4, unit: 'h' } },
      maxCycles: 400,
      capacityCheck: { everyCycles: 50, current: { multipleOfIt: 0.2 } },
      stopBelowPercentOfRated: 60,
      acceptAtLeastPercentOfRated: 60,
      instructions:
        'Program the whole cycle once on the cycler channel (charge, rest, discharge, rest; every 50th discharge at the capacity-check current) and start it. Mark the start, take ambient readings while it runs, and mark the end when the cycler stops (the last cycle, or the stop criterion).',
    },
  ],
  acceptance: [],
  decisionRule: 'simple acceptance',
};
