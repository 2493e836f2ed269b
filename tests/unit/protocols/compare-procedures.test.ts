import { describe, expect, it } from 'vitest';
import { chargeRetentionTemplate, compareProcedures, describeRetentionSetting, listChangedPaths, ratedCapacityAt20cTemplate, type Procedure, type Step } from '@/protocols';

function copy(): Procedure {
  return structuredClone(ratedCapacityAt20cTemplate);
}

describe('compareProcedures', () => {
  it('finds nothing between a procedure and its copy', () => {
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, copy());
    expect(comparison.identical).toBe(true);
    expect(comparison.steps.map((entry) => entry.change)).toEqual(['unchanged', 'unchanged', 'unchanged', 'unchanged']);
    expect(comparison.headerChangedFields).toEqual([]);
  });

  it('lists the changed fields of a step as dot paths', () => {
    const after = copy();
    after.steps[3] = { ...(after.steps[3] as Step & { kind: 'discharge' }), current: { spec: 'standardChargeCurrent' } };
    after.header.ambient = { nominalC: 25, toleranceC: 5 };
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, after);
    expect(comparison.identical).toBe(false);
    expect(comparison.headerChangedFields).toEqual(['ambient.nominalC']);
    expect(comparison.steps[3]).toMatchObject({
      stepId: 'discharge',
      change: 'changed',
      moved: false,
      changedFields: ['current.multipleOfIt', 'current.spec'],
    });
  });

  it('places added and removed steps where they were, a removal before an addition at the same place', () => {
    const after = copy();
    after.steps.splice(2, 1, {
      kind: 'measure',
      id: 'ocv',
      label: 'Open-circuit voltage',
      measurement: { quantity: 'openCircuitVoltage' },
    });
    after.repeat = undefined;
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, after);
    expect(comparison.steps.map((entry) => [entry.stepId, entry.change])).toEqual([
      ['precondition', 'unchanged'],
      ['charge', 'unchanged'],
      ['rest', 'removed'],
      ['ocv', 'added'],
      ['discharge', 'unchanged'],
    ]);
    expect(comparison.steps[2]).toMatchObject({ beforeIndex: 2, before: { kind: 'rest' } });
    expect(comparison.steps[3]).toMatchObject({ afterIndex: 2, after: { kind: 'measure' } });
    expect(comparison.repeat.change).toBe('removed');
  });

  it('places a removed first step first', () => {
    const after = copy();
    after.steps.shift();
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, after);
    expect(comparison.steps.map((entry) => `${entry.stepId}:${entry.change}`)).toEqual([
      'precondition:removed',
      'charge:unchanged',
      'rest:unchanged',
      'discharge:unchanged',
    ]);
  });

  it('marks only the step that changed place as moved', () => {
    const after = copy();
    const [precondition, ...rest] = after.steps;
    after.steps = [...rest, precondition!];
    after.repeat = undefined;
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, after);
    expect(comparison.steps.filter((entry) => entry.moved).map((entry) => entry.stepId)).toEqual(['precondition']);
    expect(comparison.identical).toBe(false);
  });

  it('compares acceptance criteria and the repeat rule by id', () => {
    const after = copy();
    after.acceptance = [
      { kind: 'capacity', id: 'rated-capacity', stepId: 'discharge', atLeastPercent: 95, of: 'minimum' },
      { kind: 'discharge-duration', id: 'time', stepId: 'discharge', atLeast: { value: 300, unit: 'min' } },
    ];
    after.repeat = { ...after.repeat!, maxCycles: 3 };
    const comparison = compareProcedures(ratedCapacityAt20cTemplate, after);
    expect(comparison.acceptance.map((entry) => [entry.criterionId, entry.change, entry.changedFields])).toEqual([
      ['rated-capacity', 'changed', ['atLeastPercent', 'of']],
      ['time', 'added', []],
    ]);
    expect(comparison.repeat).toMatchObject({ change: 'changed', changedFields: ['maxCycles'] });
  });
});

describe('compareProcedures on the retention setting', () => {
  it('is not identical when only the basis of the percentages changed, and says how', () => {
    const after: Procedure = {
      ...chargeRetentionTemplate,
      retention: { ...chargeRetentionTemplate.retention!, basis: 'capacity before storage', beforeStorageStepId: 'discharge' },
    };
    const comparison = compareProcedures(chargeRetentionTemplate, after);
    expect(comparison.identical).toBe(false);
    expect(comparison.retention).toMatchObject({ change: 'changed', changedFields: ['basis', 'beforeStorageStepId'] });
    expect(compareProcedures(ratedCapacityAt20cTemplate, chargeRetentionTemplate).retention.change).toBe('added');
    expect(compareProcedures(chargeRetentionTemplate, structuredClone(chargeRetentionTemplate)).identical).toBe(true);
    expect(describeRetentionSetting(chargeRetentionTemplate.retention!, chargeRetentionTemplate.steps)).toBe(
      'Charge retention ("Discharge after storage (retention)") and recovery ("Recovery discharge") as percentages of the rated capacity.',
    );
  });
});

describe('listChangedPaths', () => {
  it('compares nested values and arrays by position', () => {
    expect(listChangedPaths({ a: 1, b: { c: [1, 2] } }, { a: 1, b: { c: [1, 3, 4] } })).toEqual(['b.c.1', 'b.c.2']);
    expect(listChangedPaths({ a: undefined }, {})).toEqual([]);
    expect(listChangedPaths({ a: { b: 1 } }, { a: null })).toEqual(['a']);
  });
});
