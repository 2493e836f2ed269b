import { describe, expect, it } from 'vitest';
import {
  ratedCapacityAt20cTemplate,
  resolveProcedure,
  type CellSpecification,
  type Procedure,
  type ProcedureResolution,
  type ResolvedStep,
  type Step,
} from '@/protocols';
import { omitFields } from './cell-fixtures';
import { inventedCell } from '@/scenarios/invented-cells';

function procedureOf(steps: Step[], extra: Partial<Procedure> = {}): Procedure {
  return {
    header: {
      title: 'Test procedure',
      code: 'T-1',
      scope: 'Unit test.',
      standard: 'IEC 61960-3:2017',
      clause: '7.3.1',
      ambient: { nominalC: 20, toleranceC: 5 },
    },
    steps,
    acceptance: [],
    ...extra,
  };
}

function resolve(
  procedure: Procedure,
  { cell = inventedCell, acknowledged }: { cell?: CellSpecification; acknowledged?: string[] } = {},
): ProcedureResolution {
  const result = resolveProcedure({ procedure, cellSpecification: cell, acknowledgedCautions: acknowledged });
  if (!result.ok) throw new Error(`unexpected invalid input: ${JSON.stringify(result)}`);
  return result.resolution;
}

function stepOf<K extends ResolvedStep['kind']>(resolution: ProcedureResolution, index: number, kind: K) {
  const step = resolution.steps[index];
  if (step?.kind !== kind) throw new Error(`step ${index} is not a ${kind} step`);
  return step as Extract<ResolvedStep, { kind: K }>;
}

const discharge = (over: Partial<Step & { kind: 'discharge' }> = {}): Step => ({
  kind: 'discharge',
  id: 'discharge',
  label: 'Discharge',
  purpose: 'measure',
  current: { multipleOfIt: 0.2 },
  endVoltage: { spec: 'endOfDischargeVoltage' },
  ...over,
});

const charge = (over: Partial<Step & { kind: 'charge' }> = {}): Step => ({
  kind: 'charge',
  id: 'charge',
  label: 'Charge',
  current: { spec: 'standardChargeCurrent' },
  voltage: { spec: 'chargeVoltage' },
  termination: { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
  ...over,
});

describe('resolveProcedure: set-points and their trace', () => {
  const resolution = resolve(ratedCapacityAt20cTemplate);

  it('turns 0.2 It of 3 000 mAh into 0.6 A and says so (IEC 61434 definition)', () => {
    const step = stepOf(resolution, 3, 'discharge');
    expect(step.current).toEqual({
      value: 0.6,
      unit: 'A',
      source: { kind: 'it-multiple', multipleOfIt: 0.2, ratedCapacityMah: 3000 },
      explanation: '0.2 × It = 0.6 A from rated 3 000 mAh',
    });
  });

  it('takes specification fields with their key and value', () => {
    const step = stepOf(resolution, 1, 'charge');
    expect(step.voltage).toEqual({
      value: 4.2,
      unit: 'V',
      source: { kind: 'specification', field: 'chargeVoltage', key: 'chargeVoltageV', specificationValue: 4.2 },
      explanation: 'charge voltage = 4.20 V from the cell specification',
    });
    expect(step.termination).toMatchObject({ kind: 'current', current: { value: 0.06 } });
  });

  it('converts durations to seconds and keeps the written value', () => {
    const step = stepOf(resolution, 2, 'rest');
    expect(step.minDuration).toMatchObject({ value: 3600, explanation: '1 h = 3 600 s' });
    expect(step.maxDuration?.value).toBe(14_400);
  });

  it('takes the ambient from the procedure unless the step sets its own', () => {
    expect(resolution.steps[0]?.ambient).toEqual({
      minC: 15,
      maxC: 25,
      from: 'procedure',
      explanation: '20 °C ± 5 °C (15 °C to 25 °C) from the procedure',
    });
    const own = resolve(procedureOf([discharge({ ambient: { minC: 23, maxC: 27 } })]));
    expect(own.steps[0]?.ambient).toMatchObject({ minC: 23, maxC: 27, from: 'step' });
  });

  it('takes tolerances from the step, then the procedure, then IEC 61960-3 clause 4', () => {
    const procedure = procedureOf([discharge({ tolerances: { currentPercent: 0.5 } })]);
    procedure.header.tolerances = { voltagePercent: 0.2 };
    expect(resolve(procedure).steps[0]?.tolerances).toEqual({
      currentPercent: { value: 0.5, from: 'step' },
      voltagePercent: { value: 0.2, from: 'procedure' },
      temperatureC: { value: 2, from: 'IEC 61960-3 clause 4' },
      timePercent: { value: 0.1, from: 'IEC 61960-3 clause 4' },
    });
  });

  it('resolves acceptance limits: capacity in Ah, duration in s, resistance in Ω', () => {
    expect(resolution.acceptance).toEqual([
      {
        kind: 'capacity',
        id: 'rated-capacity',
        stepId: 'discharge',
        atLeastPercent: 100,
        of: 'rated',
        minimum: {
          value: 3,
          unit: 'Ah',
          source: { kind: 'capacity-share', percent: 100, basis: 'rated', capacityMah: 3000 },
          explanation: '100 % of the rated capacity 3 000 mAh = 3 000 mAh',
        },
      },
    ]);
    const other = resolve(
      procedureOf(
        [
          discharge(),
          {
            kind: 'measure',
            id: 'acr',
            label: 'AC resistance',
            measurement: { quantity: 'acResistance', frequency: { value: 1, unit: 'kHz' } },
          },
        ],
        {
          acceptance: [
            { kind: 'discharge-duration', id: 'time', stepId: 'discharge', atLeast: { value: 300, unit: 'min' } },
            { kind: 'resistance', id: 'acr-limit', stepId: 'acr', atMost: { spec: 'maxAcResistance' } },
            { kind: 'capacity', id: 'min', stepId: 'discharge', atLeastPercent: 95, of: 'minimum' },
          ],
        },
      ),
    );
    expect(other.acceptance.map((criterion) => (criterion.kind === 'resistance' ? criterion.maximum?.value : criterion.minimum?.value))).toEqual([
      18_000, 0.02, 2.755,
    ]);
    expect(stepOf(other, 1, 'measure').frequency).toMatchObject({ value: 1000, explanation: '1 kHz = 1 000 Hz' });
  });

  it('is ready to run when there are no errors and no cautions', () => {
    expect(resolution.errors).toEqual([]);
    expect(resolution.cautions).toEqual([]);
    expect(resolution.ready).toBe(true);
    expect(resolution.repeat?.maxCycles).toBe(5);
  });
});

describe('resolveProcedure: errors', () => {
  it('names a set-point the specification cannot supply', () => {
    const cell = omitFields(inventedCell, 'chargeTerminationCurrentA');
    const resolution = resolve(procedureOf([charge()]), { cell });
    expect(stepOf(resolution, 0, 'charge').termination).toEqual({ kind: 'current', current: null });
    expect(resolution.errors).toEqual([
      {
        severity: 'error',
        kind: 'specification-value-missing',
        code: 'specification-value-missing/charge/termination.current',
        path: 'steps.0.termination.current',
        stepId: 'charge',
        message: 'Step 1 "Charge": the cell specification does not state the charge termination current',
      },
    ]);
    expect(resolution.ready).toBe(false);
  });

  it('names a criterion limit the specification cannot supply', () => {
    const cell = omitFields(inventedCell, 'maxAcResistanceMOhm', 'minimumCapacityMah');
    const procedure = procedureOf([discharge()], {
      acceptance: [{ kind: 'capacity', id: 'min', stepId: 'discharge', atLeastPercent: 100, of: 'minimum' }],
    });
    const resolution = resolve(procedure, { cell });
    expect(resolution.errors.map((error) => [error.path, error.criterionId])).toEqual([['acceptance.0.of', 'min']]);
  });

  it('refuses a charge voltage above the cell specification', () => {
    const resolution = resolve(procedureOf([charge({ voltage: { value: 4.25, unit: 'V' } })]));
    expect(resolution.errors.map((error) => error.kind)).toEqual(['charge-voltage-above-specification']);
    expect(resolution.errors[0]?.message).toBe(
      'Step 1 "Charge": the charge voltage 4.25 V is above the cell\'s charge voltage 4.20 V',
    );
  });

  it('accepts a charge voltage equal to the specification written in mV (floating point)', () => {
    expect(resolve(procedureOf([charge({ voltage: { value: 4200, unit: 'mV' } })])).errors).toEqual([]);
  });

  it('refuses a discharge end voltage below the end-of-discharge voltage', () => {
    const resolution = resolve(procedureOf([discharge({ endVoltage: { value: 2.4, unit: 'V' } })]));
    expect(resolution.errors.map((error) => [error.kind, error.path])).toEqual([
      ['end-voltage-below-specification', 'steps.0.endVoltage'],
    ]);
  });

  it('refuses a discharge ending at or above the preceding charge voltage', () => {
    const resolution = resolve(
      procedureOf([charge({ voltage: { value: 3.9, unit: 'V' } }), discharge({ endVoltage: { spec: 'nominalVoltage' } })]),
    );
    expect(resolution.errors).toEqual([]);
    const wrong = resolve(
      procedureOf([charge({ voltage: { value: 3.5, unit: 'V' } }), discharge({ endVoltage: { spec: 'nominalVoltage' } })]),
    );
    expect(wrong.errors.map((error) => error.kind)).toEqual(['end-voltage-not-below-charge-voltage']);
  });

  it('refuses a termination current that the specification puts above the charge current', () => {
    const resolution = resolve(procedureOf([charge({ current: { value: 50, unit: 'mA' } })]));
    expect(resolution.errors.map((error) => error.kind)).toEqual(['termination-current-not-below-charge-current']);
  });

  it('refuses a pulse current that resolves below the base current', () => {
    const pulse: Step = {
      kind: 'pulse',
      id: 'pulse',
      label: 'Pulse',
      baseCurrent: { multipleOfIt: 1 },
      baseDuration: { value: 10, unit: 's' },
      pulseCurrent: { value: 2, unit: 'A' },
      pulseDuration: { value: 1, unit: 's' },
    };
    expect(resolve(procedureOf([pulse])).errors.map((error) => error.path)).toEqual(['steps.0.pulseCurrent']);
  });

  it('returns field problems, not a resolution, for an invalid procedure or specification', () => {
    const result = resolveProcedure({
      procedure: procedureOf([]),
      cellSpecification: { ...inventedCell, ratedCapacityMah: -1 },
    });
    expect(result).toEqual({
      ok: false,
      procedureProblems: [{ path: 'steps', message: 'a procedure needs at least one step' }],
      cellSpecificationProblems: [{ path: 'ratedCapacityMah', message: 'the rated capacity must be greater than 0' }],
    });
  });
});

describe('resolveProcedure: cautions and their acknowledgement', () => {
  const overRated = procedureOf([
    discharge({ id: 'fast', current: { multipleOfIt: 6 } }),
    charge({ id: 'boost', current: { value: 4.5, unit: 'A' } }),
  ]);

  it('flags currents above the rating with stable codes', () => {
    const resolution = resolve(overRated);
    expect(resolution.errors).toEqual([]);
    expect(resolution.cautions).toEqual([
      {
        severity: 'caution',
        kind: 'discharge-current-above-rating',
        code: 'discharge-current-above-rating/fast/current',
        path: 'steps.0.current',
        stepId: 'fast',
        message:
          'Step 1 "Discharge": 18 A is above the cell\'s maximum continuous discharge current 15 A; outside the rating, acknowledge before running',
        acknowledged: false,
      },
      {
        severity: 'caution',
        kind: 'charge-current-above-rating',
        code: 'charge-current-above-rating/boost/current',
        path: 'steps.1.current',
        stepId: 'boost',
        message:
          'Step 2 "Charge": 4.5 A is above the cell\'s maximum charge current 4 A; outside the rating, acknowledge before running',
        acknowledged: false,
      },
    ]);
    expect(resolution.cautionsNeedingAcknowledgement).toEqual([
      'discharge-current-above-rating/fast/current',
      'charge-current-above-rating/boost/current',
    ]);
    expect(resolution.ready).toBe(false);
  });

  it('does not flag a current exactly at the rating', () => {
    const atRating = procedureOf([discharge({ current: { spec: 'maxContinuousDischargeCurrent' } }), charge({ current: { value: 4000, unit: 'mA' } })]);
    expect(resolve(atRating).cautions).toEqual([]);
  });

  it('becomes ready once every caution is acknowledged, and lists stale acknowledgements', () => {
    const codes = resolve(overRated).cautionsNeedingAcknowledgement;
    const partly = resolve(overRated, { acknowledged: [codes[0] ?? ''] });
    expect(partly.cautionsNeedingAcknowledgement).toEqual([codes[1]]);
    expect(partly.ready).toBe(false);
    const all = resolve(overRated, {
      acknowledged: [...codes, 'discharge-current-above-rating/removed-step/current'],
    });
    expect(all.ready).toBe(true);
    expect(all.cautions.every((caution) => caution.acknowledged)).toBe(true);
    expect(all.unmatchedAcknowledgements).toEqual(['discharge-current-above-rating/removed-step/current']);
  });

  it('compares a charge current with the standard charge current when no maximum is stated', () => {
    const cell = omitFields(inventedCell, 'maxChargeCurrentA');
    const resolution = resolve(procedureOf([charge({ current: { multipleOfIt: 1 } })]), { cell });
    expect(resolution.cautions.map((caution) => caution.message)).toEqual([
      'Step 1 "Charge": 3 A is above the cell\'s standard charge current (no maximum stated) 1.5 A; outside the rating, acknowledge before running',
    ]);
  });

  it('flags both levels of a pulse above the maximum continuous discharge current', () => {
    const pulse: Step = {
      kind: 'pulse',
      id: 'pulse',
      label: 'Pulse',
      baseCurrent: { value: 16, unit: 'A' },
      baseDuration: { value: 10, unit: 's' },
      pulseCurrent: { value: 20, unit: 'A' },
      pulseDuration: { value: 1, unit: 's' },
    };
    expect(resolve(procedureOf([pulse])).cautionsNeedingAcknowledgement).toEqual([
      'discharge-current-above-rating/pulse/baseCurrent',
      'discharge-current-above-rating/pulse/pulseCurrent',
    ]);
  });

  it('flags a charge and a soak below 0 °C, but not a discharge', () => {
    const cold = procedureOf([
      {
        kind: 'soak',
        id: 'soak',
        label: 'Cold soak',
        temperature: { minC: -10, maxC: -5 },
        minDuration: { value: 4, unit: 'h' },
      },
      discharge({ ambient: { nominalC: -20, toleranceC: 2 } }),
      charge({ ambient: { nominalC: 1, toleranceC: 2 } }),
    ]);
    const resolution = resolve(cold);
    expect(resolution.cautions.map((caution) => caution.code)).toEqual([
      'soak-below-zero-celsius/soak/temperature',
      'charge-below-zero-celsius/charge/ambient',
    ]);
    expect(resolution.cautions[1]?.message).toContain('reaches \u22121 °C');
    expect(stepOf(resolution, 0, 'soak').ambient).toMatchObject({ minC: -10, maxC: -5, from: 'step' });
  });
});

describe('resolveProcedure: plain data', () => {
  it('does not change its input and returns JSON-safe data', () => {
    const procedure = structuredClone(ratedCapacityAt20cTemplate);
    const before = JSON.stringify(procedure);
    const result = resolveProcedure({ procedure, cellSpecification: inventedCell });
    expect(JSON.stringify(procedure)).toBe(before);
    expect(JSON.parse(JSON.stringify(result))).toEqual(result);
  });
});
