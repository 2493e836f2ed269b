import { describe, expect, it } from 'vitest';
import {
  compareProcedures,
  explainDecisionRule,
  nameDecisionRule,
  procedureTemplates,
  ratedCapacityAt20cTemplate,
  readDecisionRule,
  resolveProcedure,
  validateProcedure,
  type Procedure,
} from '@/protocols';
import { inventedCell } from '@/scenarios/invented-cells';

/** A definition as stored before procedures named their decision rule. */
function storedWithoutRule(): Procedure {
  const copy: Procedure = structuredClone(ratedCapacityAt20cTemplate);
  delete copy.decisionRule;
  return copy;
}

function resolutionOf(procedure: Procedure) {
  const result = resolveProcedure({ procedure, cellSpecification: inventedCell });
  if (!result.ok) throw new Error(JSON.stringify(result));
  return result.resolution;
}

describe('the decision rule of a procedure', () => {
  it('is stated by every template', () => {
    expect(procedureTemplates.map((template) => template.procedure.decisionRule)).toEqual(Array(8).fill('simple acceptance'));
  });

  it('accepts the three rules of ILAC-G8:09/2019 4.2, refuses any other, and still reads a stored definition without one', () => {
    for (const rule of ['simple acceptance', 'binary guard band', 'non-binary guard band'] as const) {
      const procedure = { ...ratedCapacityAt20cTemplate, decisionRule: rule };
      expect(validateProcedure(procedure)).toEqual({ ok: true, value: procedure });
    }
    expect(validateProcedure({ ...ratedCapacityAt20cTemplate, decisionRule: 'shared risk' })).toEqual({
      ok: false,
      problems: [{ path: 'decisionRule', message: 'the decision rule is simple acceptance, binary guard band or non-binary guard band' }],
    });
    const old = storedWithoutRule();
    expect(validateProcedure(old).ok).toBe(true);
    expect(readDecisionRule(old)).toBe('simple acceptance');
  });

  it('reads a definition stored as "guarded acceptance" as the binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)', () => {
    const stored = { ...ratedCapacityAt20cTemplate, decisionRule: 'guarded acceptance' };
    const read = validateProcedure(stored);
    expect(read.ok && read.value.decisionRule).toBe('binary guard band');
    expect(readDecisionRule({ decisionRule: 'guarded acceptance' })).toBe('binary guard band');
    expect(resolutionOf(stored as Procedure).decisionRule).toBe('binary guard band');
    expect(nameDecisionRule('guarded acceptance')).toBe('guarded acceptance, guard band w = U (earlier wording) (ILAC-G8:09/2019 4.2.2)');
  });

  it('is carried by the resolution, with simple acceptance for a definition that names none', () => {
    expect(resolutionOf({ ...ratedCapacityAt20cTemplate, decisionRule: 'non-binary guard band' }).decisionRule).toBe('non-binary guard band');
    expect(resolutionOf(storedWithoutRule()).decisionRule).toBe('simple acceptance');
  });

  it('is reported by compareProcedures when it changes, and not when an old definition meets the default', () => {
    const guarded = { ...ratedCapacityAt20cTemplate, decisionRule: 'binary guard band' as const };
    const changed = compareProcedures(ratedCapacityAt20cTemplate, guarded);
    expect(changed.identical).toBe(false);
    expect(changed.decisionRule).toEqual({ change: 'changed', before: 'simple acceptance', after: 'binary guard band' });
    expect(changed.steps.every((step) => step.change === 'unchanged')).toBe(true);
    const same = compareProcedures(storedWithoutRule(), ratedCapacityAt20cTemplate);
    expect(same.identical).toBe(true);
    expect(same.decisionRule).toEqual({ change: 'unchanged', before: 'simple acceptance', after: 'simple acceptance' });
  });

  it('is named with its clause and explained in plain words', () => {
    expect(nameDecisionRule('simple acceptance')).toBe('simple acceptance (binary statement, guard band w = 0) (ILAC-G8:09/2019 4.2.1)');
    expect(nameDecisionRule('binary guard band')).toBe('binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)');
    expect(nameDecisionRule('non-binary guard band')).toBe('non-binary statement with guard band w = U (four outcomes) (ILAC-G8:09/2019 4.2.3)');
    expect(explainDecisionRule('simple acceptance')).toMatch(/compared with the limit as it is/);
    expect(explainDecisionRule('binary guard band')).toMatch(/There is no third outcome/);
    expect(explainDecisionRule('non-binary guard band')).toMatch(/conditional pass.*conditional fail/);
  });
});
