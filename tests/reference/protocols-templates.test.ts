import { describe, expect, it } from 'vitest';
import {
  describeChargeRetention,
  clauseFourTolerances,
  convertToBounds,
  findProcedureTemplate,
  recalledMark,
  resolveProcedure,
  type Procedure,
  type ProcedureResolution,
  type ResolvedStep,
  type Step,
} from '@/protocols';
import { inventedCell } from '@/scenarios/invented-cells';

function templateOf(key: string): Procedure {
  const template = findProcedureTemplate(key);
  if (!template) throw new Error(`no template ${key}`);
  return template.procedure;
}

function stepOf(procedure: Procedure, id: string): Step {
  const step = procedure.steps.find((candidate) => candidate.id === id);
  if (!step) throw new Error(`no step ${id}`);
  return step;
}

function resolutionOf(procedure: Procedure): ProcedureResolution {
  const result = resolveProcedure({ procedure, cellSpecification: inventedCell });
  if (!result.ok) throw new Error('template must resolve');
  return result.resolution;
}

function resolvedStepOf(resolution: ProcedureResolution, id: string): ResolvedStep {
  const step = resolution.steps.find((candidate) => candidate.id === id);
  if (!step) throw new Error(`no resolved step ${id}`);
  return step;
}

/** A [memory] value must be named "recalled, verify against the standard" in the template notes. */
function expectRecalledNote(procedure: Procedure, words: RegExp): void {
  const notes = procedure.header.notes ?? [];
  expect(notes.some((note) => words.test(note) && note.includes(recalledMark))).toBe(true);
}

describe('rated capacity template vs IEC 61960-3:2017 7.2 and 7.3.1 (docs/references.md §2)', () => {
  const procedure = templateOf('rated-capacity-20c');
  const resolution = resolutionOf(procedure);

  it('ambient 20 °C ± 5 °C for charge, rest and discharge — [published: clause structure]', () => {
    expect(convertToBounds(procedure.header.ambient)).toEqual({ minC: 15, maxC: 25 });
    expect(procedure.steps.every((step) => step.kind === 'soak' || step.ambient === undefined)).toBe(true);
  });

  it('precondition discharge at 0.2 It A to the end-of-discharge voltage — [memory], noted as recalled', () => {
    expect(stepOf(procedure, 'precondition')).toMatchObject({
      kind: 'discharge',
      purpose: 'precondition',
      current: { multipleOfIt: 0.2 },
      endVoltage: { spec: 'endOfDischargeVoltage' },
    });
    expectRecalledNote(procedure, /Precondition discharge at 0\.2 It/);
  });

  it('CC-CV charge to the charge voltage, ending at the termination current — [practice]', () => {
    expect(stepOf(procedure, 'charge')).toMatchObject({
      kind: 'charge',
      current: { spec: 'standardChargeCurrent' },
      voltage: { spec: 'chargeVoltage' },
      termination: { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
    });
  });

  it('rest not less than 1 h and not more than 4 h after charge — [memory, high confidence], noted as recalled', () => {
    expect(resolvedStepOf(resolution, 'rest')).toMatchObject({
      kind: 'rest',
      minDuration: { value: 3600 },
      maxDuration: { value: 14_400 },
    });
    expectRecalledNote(procedure, /not less than 1 h and not more than 4 h/);
  });

  it('discharge at 0.2 It A to the end-of-discharge voltage — [published: clause title and current]', () => {
    expect(resolvedStepOf(resolution, 'discharge')).toMatchObject({
      kind: 'discharge',
      purpose: 'measure',
      current: { value: 0.6 },
      endVoltage: { value: 2.5 },
    });
  });

  it('capacity ≥ 100 % of rated; at 0.2 It that is ≥ 300 min — [published: datasheets; arithmetic]', () => {
    const [criterion] = resolution.acceptance;
    expect(criterion).toMatchObject({ kind: 'capacity', stepId: 'discharge', atLeastPercent: 100, of: 'rated' });
    const current = resolvedStepOf(resolution, 'discharge');
    const amperes = current.kind === 'discharge' ? current.current?.value ?? 0 : 0;
    const limitAh = criterion?.kind === 'capacity' ? criterion.minimum?.value ?? 0 : 0;
    expect((limitAh / amperes) * 60).toBeCloseTo(300, 9);
  });

  it('up to five cycles of charge–rest–discharge, ending at the first that meets the requirement — [memory], noted', () => {
    expect(procedure.repeat).toEqual({
      label: 'Capacity cycle',
      stepIds: ['charge', 'rest', 'discharge'],
      maxCycles: 5,
      stopWhenMet: 'rated-capacity',
    });
    expectRecalledNote(procedure, /Up to 5 cycles/);
  });
});

describe('rate capability template (docs/references.md §2, §12)', () => {
  const procedure = templateOf('rate-capability');
  const resolution = resolutionOf(procedure);

  it('discharges at 0.2 It, 0.5 It, 1 It and the maximum continuous current — [practice]', () => {
    const currents = resolution.steps.flatMap((step) =>
      step.kind === 'discharge' && step.purpose === 'measure' ? [step.current?.value] : [],
    );
    expect(currents).toEqual([0.6, 1.5, 3, 15]);
  });

  it('a standard charge and a rest of at least 1 h before each discharge — [practice] (docs/references.md §12)', () => {
    const kinds = procedure.steps.map((step) => step.kind);
    procedure.steps.forEach((step, index) => {
      if (step.kind !== 'discharge' || step.purpose !== 'measure') return;
      expect(kinds.slice(index - 2, index)).toEqual(['charge', 'rest']);
      const rest = procedure.steps[index - 1];
      expect(rest?.kind === 'rest' && rest.minDuration).toEqual({ value: 1, unit: 'h' });
    });
  });
});

describe('DC resistance template vs IEC 61960-3 7.7 (docs/references.md §4)', () => {
  const procedure = templateOf('dc-resistance');
  const resolution = resolutionOf(procedure);
  const pulse = resolvedStepOf(resolution, 'pulse');

  it('I1 = 0.2 It A for 10 s, then I2 = 1.0 It A for 1 s — [memory, high confidence], noted as recalled', () => {
    expect(pulse).toMatchObject({
      kind: 'pulse',
      baseCurrent: { value: 0.6 },
      baseDuration: { value: 10 },
      pulseCurrent: { value: 3 },
      pulseDuration: { value: 1 },
    });
    expectRecalledNote(procedure, /0\.2 It A for 10 s then 1 It A for 1 s/);
  });

  it('with these currents, U1 = 3.9000 V and U2 = 3.8520 V give Rdc = 20.0 mΩ — docs/references.md §4 check [memory; arithmetic]', () => {
    if (pulse.kind !== 'pulse' || !pulse.baseCurrent || !pulse.pulseCurrent) throw new Error('pulse must resolve');
    // Rdc = (U1 − U2) / (I2 − I1), IEC 61960-3 7.7.
    const resistanceOhm = (3.9 - 3.852) / (pulse.pulseCurrent.value - pulse.baseCurrent.value);
    expect(resistanceOhm * 1000).toBeCloseTo(20.0, 9);
  });
});

describe('AC resistance template vs IEC 61960-3 7.7 (docs/references.md §4)', () => {
  const procedure = templateOf('ac-resistance');

  it('measures at 1.0 kHz — [memory], noted as recalled', () => {
    const step = stepOf(procedure, 'ac-resistance');
    expect(step.kind === 'measure' && step.measurement).toEqual({
      quantity: 'acResistance',
      frequency: { value: 1, unit: 'kHz' },
    });
    expectRecalledNote(procedure, /1\.0 kHz ± 0\.1 kHz/);
  });
});

describe('other clauses of IEC 61960-3 (docs/references.md §2, last item) [memory]', () => {
  it('−20 °C discharge: capacity ≥ 30 % of rated — [memory], noted as recalled', () => {
    const procedure = templateOf('discharge-at-minus-20c');
    expect(procedure.acceptance).toEqual([
      { kind: 'capacity', id: 'cold-capacity', stepId: 'discharge', atLeastPercent: 30, of: 'rated' },
    ]);
    const discharge = stepOf(procedure, 'discharge');
    expect(discharge.kind === 'discharge' && discharge.ambient && convertToBounds(discharge.ambient)).toEqual({
      minC: -22,
      maxC: -18,
    });
    expectRecalledNote(procedure, /at least 30 %/);
  });

  it('charge retention: storage of 28 days — [memory], noted as recalled', () => {
    const procedure = templateOf('charge-retention');
    const resolution = resolutionOf(procedure);
    expect(resolvedStepOf(resolution, 'storage')).toMatchObject({ kind: 'rest', minDuration: { value: 28 * 24 * 3600 } });
    expectRecalledNote(procedure, /28 days/);
  });

  it('charge retention and recovery: discharge after storage, then charge, rest 1 h to 4 h and discharge again, both at 0.2 It — [memory], noted as recalled', () => {
    const procedure = templateOf('charge-retention');
    expect(procedure.steps.map((step) => step.id)).toEqual([
      'precondition',
      'charge',
      'storage',
      'discharge',
      'recovery-charge',
      'recovery-rest',
      'recovery-discharge',
    ]);
    const resolution = resolutionOf(procedure);
    // 0.2 It of the 3 000 mAh cell = 0.6 A (docs/references.md §1, published) for both measured discharges.
    for (const id of ['discharge', 'recovery-discharge']) {
      expect(resolvedStepOf(resolution, id)).toMatchObject({ kind: 'discharge', purpose: 'measure', current: { value: 0.6 } });
    }
    expect(resolvedStepOf(resolution, 'recovery-charge')).toMatchObject({ kind: 'charge', voltage: { value: 4.2 } });
    // Rest 1 h to 4 h after charge as for the rated capacity (docs/references.md §2, memory).
    expect(resolvedStepOf(resolution, 'recovery-rest')).toMatchObject({ kind: 'rest', minDuration: { value: 3600 }, maxDuration: { value: 14400 } });
    expectRecalledNote(procedure, /Recovery: charge again/);
    // Both percentages of the rated capacity: a parameter of the template, recalled.
    expect(procedure.retention).toEqual({ afterStorageStepId: 'discharge', recoveryStepId: 'recovery-discharge', basis: 'rated capacity' });
    expect(resolution.retention).toEqual({
      afterStorageStepId: 'discharge',
      recoveryStepId: 'recovery-discharge',
      basis: { kind: 'rated capacity', capacityAh: inventedCell.ratedCapacityMah / 1000 },
    });
    expectRecalledNote(procedure, /percentages of the rated capacity/);
    expect(describeChargeRetention(resolution.retention!, resolution.steps)).toBe(
      'Reports charge retention ("Discharge after storage (retention)") and recovery ("Recovery discharge") as percentages of the rated capacity, 3 000 mAh.',
    );
    // No limit is published in our references: the template sets none and says so.
    expect(procedure.acceptance).toEqual([]);
    expect(procedure.header.notes).toContainEqual(expect.stringMatching(/No acceptance limit set: none is published in our references/));
  });
});

describe('measurement tolerances (docs/references.md §3)', () => {
  it('voltage ±1 %, current ±1 %, temperature ±2 °C, time ±0.1 %, dimensions ±0.1 mm, capacity ±1 % — [published via IEC 61951-2:2022 clause 4; memory for 61960-3]', () => {
    expect(clauseFourTolerances).toEqual({
      voltagePercent: 1,
      currentPercent: 1,
      temperatureC: 2,
      timePercent: 0.1,
      dimensionMm: 0.1,
      capacityPercent: 1,
    });
  });

  it('are the defaults every template step resolves to', () => {
    const resolution = resolutionOf(templateOf('rated-capacity-20c'));
    expect(resolution.steps.every((step) => step.tolerances.currentPercent.from === 'IEC 61960-3 clause 4')).toBe(true);
  });
});
