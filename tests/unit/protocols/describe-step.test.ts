import { describe, expect, it } from 'vitest';
import { describeCriterion, describeStep, formatQuantity, type Step } from '@/protocols';

describe('formatQuantity', () => {
  it('writes references the way a procedure reads', () => {
    expect(formatQuantity({ multipleOfIt: 0.2 })).toBe('0.2 It');
    expect(formatQuantity({ multipleOfIt: 1 / 3 })).toBe('0.333333 It');
    expect(formatQuantity({ spec: 'endOfDischargeVoltage' })).toBe('spec: end-of-discharge voltage');
    expect(formatQuantity({ spec: 'maxContinuousDischargeCurrent' })).toBe('spec: maximum continuous discharge current');
    expect(formatQuantity({ value: 5, unit: 'A' })).toBe('5 A');
    expect(formatQuantity({ value: 1500, unit: 'mA' })).toBe('1 500 mA');
    expect(formatQuantity({ value: 4.2, unit: 'V' })).toBe('4.2 V');
    expect(formatQuantity({ value: 20, unit: 'mOhm' })).toBe('20 mΩ');
    expect(formatQuantity({ value: 1, unit: 'kHz' })).toBe('1 kHz');
  });

  it('writes durations and temperature ranges', () => {
    expect(formatQuantity({ value: 30, unit: 'min' })).toBe('30 min');
    expect(formatQuantity({ value: 672, unit: 'h' })).toBe('672 h (28 days)');
    expect(formatQuantity({ value: 25, unit: 'h' })).toBe('25 h');
    expect(formatQuantity({ nominalC: -20, toleranceC: 2 })).toBe('\u221220 °C ± 2 °C');
    expect(formatQuantity({ minC: 15, maxC: 25 })).toBe('15 °C to 25 °C');
  });
});

describe('describeStep', () => {
  const cases: Array<[Step, string]> = [
    [
      {
        kind: 'charge',
        id: 'c',
        label: 'Charge',
        current: { multipleOfIt: 0.5 },
        voltage: { spec: 'chargeVoltage' },
        termination: { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
        maxDuration: { value: 4, unit: 'h' },
      },
      'CC-CV charge at 0.5 It to the specified charge voltage, ending when the current falls to the specified charge termination current (at most 4 h)',
    ],
    [
      {
        kind: 'charge',
        id: 'c',
        label: 'Charge',
        current: { value: 1, unit: 'A' },
        voltage: { value: 4.1, unit: 'V' },
        termination: { kind: 'time', duration: { value: 3, unit: 'h' } },
      },
      'CC-CV charge at 1 A to 4.1 V, ending after 3 h',
    ],
    [
      {
        kind: 'discharge',
        id: 'd',
        label: 'Discharge',
        purpose: 'precondition',
        current: { multipleOfIt: 0.2 },
        endVoltage: { spec: 'endOfDischargeVoltage' },
      },
      'Precondition: discharge at 0.2 It to the specified end-of-discharge voltage',
    ],
    [
      {
        kind: 'discharge',
        id: 'd',
        label: 'Discharge',
        purpose: 'measure',
        current: { spec: 'maxContinuousDischargeCurrent' },
        endVoltage: { value: 2750, unit: 'mV' },
        maxDuration: { value: 6, unit: 'h' },
      },
      'Capacity discharge at the specified maximum continuous discharge current to 2 750 mV (at most 6 h)',
    ],
    [{ kind: 'rest', id: 'r', label: 'Rest', minDuration: { value: 1, unit: 'h' }, maxDuration: { value: 4, unit: 'h' } }, 'Rest 1 h to 4 h'],
    [{ kind: 'rest', id: 'r', label: 'Rest', minDuration: { value: 30, unit: 'min' } }, 'Rest at least 30 min'],
    [
      {
        kind: 'soak',
        id: 's',
        label: 'Soak',
        temperature: { nominalC: -20, toleranceC: 2 },
        minDuration: { value: 16, unit: 'h' },
        maxDuration: { value: 24, unit: 'h' },
      },
      'Soak at \u221220 °C ± 2 °C for 16 h to 24 h',
    ],
    [
      {
        kind: 'pulse',
        id: 'p',
        label: 'Pulse',
        baseCurrent: { multipleOfIt: 0.2 },
        baseDuration: { value: 10, unit: 's' },
        pulseCurrent: { multipleOfIt: 1 },
        pulseDuration: { value: 1, unit: 's' },
      },
      'DC resistance pulse: 0.2 It for 10 s, then 1 It for 1 s',
    ],
    [
      { kind: 'measure', id: 'm', label: 'AC', measurement: { quantity: 'acResistance', frequency: { value: 1, unit: 'kHz' } } },
      'Measure the AC resistance at 1 kHz',
    ],
    [{ kind: 'measure', id: 'm', label: 'Mass', measurement: { quantity: 'mass' } }, 'Measure the mass'],
    [{ kind: 'measure', id: 'm', label: 'OCV', measurement: { quantity: 'openCircuitVoltage' } }, 'Measure the open-circuit voltage'],
    [{ kind: 'measure', id: 'm', label: 'Size', measurement: { quantity: 'dimensions' } }, 'Measure the dimensions'],
  ];

  it.each(cases)('summarises a %s step in one line', (step, expected) => {
    expect(describeStep(step)).toBe(expected);
  });
});

describe('describeCriterion', () => {
  it('summarises each criterion kind', () => {
    expect(describeCriterion({ kind: 'capacity', id: 'c', stepId: 'discharge', atLeastPercent: 100, of: 'rated' })).toBe(
      'Capacity of step "discharge" ≥ 100 % of the rated capacity',
    );
    expect(describeCriterion({ kind: 'discharge-duration', id: 'd', stepId: 'discharge', atLeast: { value: 300, unit: 'min' } })).toBe(
      'Discharge duration of step "discharge" ≥ 300 min',
    );
    expect(describeCriterion({ kind: 'resistance', id: 'r', stepId: 'acr', atMost: { spec: 'maxAcResistance' } })).toBe(
      'Resistance of step "acr" ≤ the specified maximum AC resistance',
    );
    expect(describeCriterion({ kind: 'resistance', id: 'r', stepId: 'p', atMost: { value: 25, unit: 'mOhm' } })).toBe(
      'Resistance of step "p" ≤ 25 mΩ',
    );
  });
});
