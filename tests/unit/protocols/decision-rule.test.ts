import { describe, expect, it } from 'vitest';
import {
  compareProcedures,
  explainDecisionRule,
  procedureTemplates,
  ratedCapacityAt20cTemplate,
  readDecisionRule,
  resolveProcedure,
  validateProcedure,
  type Procedure,
} from '@/protocols';
import { typicalNmcCell } from './cell-fixtures';

/** A definition as stored before procedures named their decision rule. */
function storedWithoutRule(): Procedure {
  const copy: Procedure = structuredClone(ratedCapacityAt20cTemplate);
  delete copy.decisionRule;
  return copy;
}

function resolutionOf(procedure: Procedure) {
  const result = resolveProcedure({ procedure, cellSpecification: typicalNmcCell });
  if (!result.ok) throw new Error(JSON.stringify(result));
  return result.resolution;
}

describe('the decision rule of a procedure', () => {
  it('is stated by every template', () => {
    expect(procedureTemplates.map((template) => template.procedure.decisionRule)).toEqual(Array(6).fill('simple acceptance'));
  });

  it('accepts both rules, refuses any other, and still reads a stored definition without one', () => {
    const guarded = { ...ratedCapacityAt20cTemplate, decisionRule: 'guarded acceptance' as const };
    expect(validateProcedure(guarded)).toEqual({ ok: true, value: guarded });
    expect(validateProcedure({ ...ratedCapacityAt20cTemplate, decisionRule: 'shared risk' })).toEqual({
      ok: false,
      problems: [{ path: 'decisionRule', message: 'the decision rule is simple acceptance or guarded acceptance' }],
    });
    const old = storedWithoutRule();
    expect(validateProcedure(old).ok).toBe(true);
    expect(readDecisionRule(old)).toBe('simple acceptance');
    expect(readDecisionRule(guarded)).toBe('guarded acceptance');
  });

  it('is carried by the resolution, with simple acceptance for a definition that names none', () => {
    expect(resolutionOf({ ...ratedCapacityAt20cTemplate, decisionRule: 'guarded acceptance' }).decisionRule).toBe('guarded acceptance');
    expect(resolutionOf(storedWithoutRule()).decisionRule).toBe('simple acceptance');
  });

  it('is reported by compareProcedures when it changes, and not when an old definition meets the default', () => {
    const guarded = { ...ratedCapacityAt20cTemplate, decisionRule: 'guarded acceptance' as const };
    const changed = compareProcedures(ratedCapacityAt20cTemplate, guarded);
    expect(changed.identical).toBe(false);
    expect(changed.decisionRule).toEqual({ change: 'changed', before: 'simple acceptance', after: 'guarded acceptance' });
    expect(changed.steps.every((step) => step.change === 'unchanged')).toBe(true);
    const same = compareProcedures(storedWithoutRule(), ratedCapacityAt20cTemplate);
    expect(same.identical).toBe(true);
    expect(same.decisionRule).toEqual({ change: 'unchanged', before: 'simple acceptance', after: 'simple acceptance' });
  });

  it('is explained in one sentence each', () => {
    expect(explainDecisionRule('simple acceptance')).toMatch(/compared with the limit as it is/);
    expect(explainDecisionRule('guarded acceptance')).toMatch(/clears the limit by its expanded uncertainty \(k = 2\)/);
  });
});
