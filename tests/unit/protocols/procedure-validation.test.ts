import { describe, expect, it } from 'vitest';
import { ratedCapacityAt20cTemplate, validateProcedure, type Procedure, type Step } from '@/protocols';
import { omitFields } from './cell-fixtures';

/** A fresh copy of a valid procedure: precondition, charge, rest, discharge (ids in that order). */
function baseProcedure(): Procedure {
  return structuredClone(ratedCapacityAt20cTemplate);
}

function problemsOf(input: unknown) {
  const result = validateProcedure(input);
  return result.ok ? [] : result.problems;
}

function pathsOf(input: unknown) {
  return problemsOf(input).map((problem) => problem.path);
}

function withStep(index: number, step: Step): Procedure {
  const procedure = baseProcedure();
  procedure.steps[index] = step;
  return procedure;
}

describe('procedure schema: valid input', () => {
  it('accepts a complete procedure and returns it unchanged', () => {
    const procedure = baseProcedure();
    expect(validateProcedure(procedure)).toEqual({ ok: true, value: procedure });
  });

  it('accepts a procedure without criteria (a report-only procedure)', () => {
    const procedure = baseProcedure();
    procedure.acceptance = [];
    delete procedure.repeat;
    expect(validateProcedure(procedure).ok).toBe(true);
  });
});

describe('procedure schema: each refusal names its field', () => {
  it('refuses an empty procedure', () => {
    expect(problemsOf({ ...omitFields(baseProcedure(), 'repeat'), steps: [], acceptance: [] })).toEqual([
      { path: 'steps', message: 'a procedure needs at least one step' },
    ]);
    // Criteria and a repeat block left behind are named as well.
    expect(pathsOf({ ...baseProcedure(), steps: [] })).toContain('acceptance.0.stepId');
  });

  it('refuses a negative current', () => {
    const procedure = withStep(3, {
      kind: 'discharge',
      id: 'discharge',
      label: 'Discharge',
      purpose: 'measure',
      current: { value: -0.6, unit: 'A' },
      endVoltage: { spec: 'endOfDischargeVoltage' },
    });
    expect(problemsOf(procedure)).toEqual([{ path: 'steps.3.current.value', message: 'a current must be greater than 0' }]);
  });

  it('refuses an end voltage above the charge voltage when both are absolute', () => {
    const procedure = baseProcedure();
    procedure.steps[1] = { ...(procedure.steps[1] as Step & { kind: 'charge' }), voltage: { value: 4.2, unit: 'V' } };
    procedure.steps[3] = {
      ...(procedure.steps[3] as Step & { kind: 'discharge' }),
      endVoltage: { value: 4300, unit: 'mV' },
    };
    expect(pathsOf(procedure)).toEqual(['steps.3.endVoltage']);
  });

  it('refuses an end voltage that is the charge voltage field itself', () => {
    const procedure = baseProcedure();
    procedure.steps[3] = { ...(procedure.steps[3] as Step & { kind: 'discharge' }), endVoltage: { spec: 'chargeVoltage' } };
    expect(pathsOf(procedure)).toEqual(['steps.3.endVoltage']);
  });

  it('refuses a rest whose longest time is shorter than its shortest', () => {
    const procedure = withStep(2, {
      kind: 'rest',
      id: 'rest',
      label: 'Rest',
      minDuration: { value: 2, unit: 'h' },
      maxDuration: { value: 90, unit: 'min' },
    });
    expect(problemsOf(procedure)).toEqual([
      { path: 'steps.2.maxDuration', message: 'the longest rest (90 min) is shorter than the shortest rest (2 h)' },
    ]);
  });

  it('refuses an unknown specification field', () => {
    const procedure = baseProcedure();
    const charge = procedure.steps[1] as Step & { kind: 'charge' };
    (charge.voltage as unknown as { spec: string }).spec = 'maxVoltage';
    const problems = problemsOf(procedure);
    expect(problems.map((problem) => problem.path)).toEqual(['steps.1.voltage.spec']);
    expect(problems[0]?.message).toContain('"maxVoltage" is not a voltage field of the cell specification');
  });

  it('refuses an acceptance criterion pointing at a step that does not exist', () => {
    const procedure = baseProcedure();
    procedure.acceptance = [{ kind: 'capacity', id: 'c', stepId: 'discharge-2', atLeastPercent: 100, of: 'rated' }];
    delete procedure.repeat;
    expect(problemsOf(procedure)).toEqual([{ path: 'acceptance.0.stepId', message: 'no step has the id "discharge-2"' }]);
  });

  it('refuses a criterion on a step it cannot judge', () => {
    const procedure = baseProcedure();
    procedure.acceptance = [{ kind: 'resistance', id: 'r', stepId: 'rest', atMost: { value: 20, unit: 'mOhm' } }];
    delete procedure.repeat;
    expect(pathsOf(procedure)).toEqual(['acceptance.0.stepId']);
  });

  it('refuses a repeat block naming unknown steps', () => {
    const procedure = baseProcedure();
    procedure.repeat = { label: 'Cycle', stepIds: ['charge', 'soak', 'discharge'], maxCycles: 5, stopWhenMet: 'rated-capacity' };
    expect(problemsOf(procedure)).toEqual([
      { path: 'repeat.stepIds.1', message: 'the repeated block names "soak", but no step has that id' },
    ]);
  });

  it('refuses a repeat block that skips a step or names an unknown criterion', () => {
    const procedure = baseProcedure();
    procedure.repeat = { label: 'Cycle', stepIds: ['charge', 'discharge'], maxCycles: 5, stopWhenMet: 'nothing' };
    expect(pathsOf(procedure)).toEqual(['repeat.stepIds', 'repeat.stopWhenMet']);
  });

  it('refuses a repeat whose stopping criterion judges a step outside the block', () => {
    const procedure = baseProcedure();
    procedure.repeat = { label: 'Cycle', stepIds: ['charge', 'rest'], maxCycles: 5, stopWhenMet: 'rated-capacity' };
    expect(pathsOf(procedure)).toEqual(['repeat.stopWhenMet']);
  });

  it('refuses duplicate step ids at the second occurrence', () => {
    const procedure = baseProcedure();
    procedure.steps[2] = { ...(procedure.steps[2] as Step), id: 'charge' };
    procedure.repeat = undefined;
    expect(problemsOf(procedure)).toEqual([{ path: 'steps.2.id', message: 'the id "charge" is already used by step 2' }]);
  });

  it('refuses a termination current not below the charge current when both are It multiples', () => {
    const procedure = baseProcedure();
    procedure.steps[1] = {
      ...(procedure.steps[1] as Step & { kind: 'charge' }),
      current: { multipleOfIt: 0.5 },
      termination: { kind: 'current', current: { multipleOfIt: 0.5 } },
    };
    expect(pathsOf(procedure)).toEqual(['steps.1.termination.current']);
  });

  it('refuses a pulse whose pulse current is not above its base current', () => {
    const procedure = withStep(3, {
      kind: 'pulse',
      id: 'pulse',
      label: 'Pulse',
      baseCurrent: { value: 3, unit: 'A' },
      baseDuration: { value: 10, unit: 's' },
      pulseCurrent: { value: 600, unit: 'mA' },
      pulseDuration: { value: 1, unit: 's' },
    });
    procedure.acceptance = [];
    delete procedure.repeat;
    expect(pathsOf(procedure)).toEqual(['steps.3.pulseCurrent']);
  });

  it('refuses an unknown step kind, an ambient on a soak, and an unexpected field', () => {
    const procedure = baseProcedure() as unknown as { steps: Record<string, unknown>[] };
    procedure.steps[2] = { kind: 'wait', id: 'rest', label: 'Rest' };
    expect(pathsOf(procedure)).toEqual(['steps.2.kind']);
    const soak = {
      kind: 'soak',
      id: 'rest',
      label: 'Soak',
      temperature: { nominalC: 45, toleranceC: 2 },
      ambient: { nominalC: 20, toleranceC: 5 },
      minDuration: { value: 1, unit: 'h' },
    };
    procedure.steps[2] = soak;
    expect(problemsOf(procedure)).toEqual([{ path: 'steps.2', message: 'unexpected field: ambient' }]);
  });

  it('says "required" for missing header fields and gives a typed result for garbage', () => {
    const header = omitFields(baseProcedure().header, 'title');
    expect(problemsOf({ ...baseProcedure(), header })).toEqual([{ path: 'header.title', message: 'required' }]);
    expect(validateProcedure(undefined)).toEqual({ ok: false, problems: [{ path: '', message: 'required' }] });
    expect(validateProcedure(42).ok).toBe(false);
  });
});

describe('procedure schema: a step title cannot contradict its set-points (issue 12, 7c)', () => {
  const dischargeIndex = () => baseProcedure().steps.findIndex((s) => s.id === 'discharge');

  it('refuses "Capacity discharge at 0.2 It" programmed at 3 It, naming the step by number and title', () => {
    const procedure = baseProcedure();
    const index = dischargeIndex();
    const step = procedure.steps[index]!;
    if (step.kind !== 'discharge') throw new Error('the template changed');
    step.current = { multipleOfIt: 3 };
    const problems = problemsOf(procedure);
    expect(problems).toEqual([
      expect.objectContaining({
        path: `steps.${index}.label`,
        message: `step ${index + 1} “Capacity discharge at 0.2 It”: the title says 0.2 It, but the discharge current is 3 It; change the title or the current`,
      }),
    ]);
    step.label = 'Capacity discharge at 3 It';
    expect(problemsOf(procedure)).toEqual([]);
  });

  it('refuses a stated multiple when the current is an absolute value or a datasheet field', () => {
    const procedure = baseProcedure();
    const step = procedure.steps[dischargeIndex()]!;
    if (step.kind !== 'discharge') throw new Error('the template changed');
    step.current = { value: 1, unit: 'A' };
    expect(problemsOf(procedure).map((p) => p.message)).toEqual([expect.stringContaining('the title says 0.2 It, but the discharge current is 1 A')]);
  });

  it('leaves titles that name another step ("before the 0.2 It discharge") and steps without a current alone', () => {
    const procedure = baseProcedure();
    const charge = procedure.steps.find((s) => s.kind === 'charge')!;
    charge.label = 'Charge before the 0.2 It discharge';
    const rest = procedure.steps.find((s) => s.kind === 'rest')!;
    rest.label = 'Rest before 0.2 It';
    expect(problemsOf(procedure)).toEqual([]);
  });
});
