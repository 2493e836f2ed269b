import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  convertToSeconds,
  formatQuantity,
  resolveCurrent,
  resolveProcedure,
  validateProcedure,
  type Procedure,
  type Step,
} from '@/protocols';
import { cellSpecificationArbitrary, currentReferenceArbitrary, durationArbitrary, procedureArbitrary } from './arbitraries';
import { inventedCell } from '@/scenarios/invented-cells';

// A fixed seed keeps the suite deterministic; change it locally to explore other cases.
const runs = { numRuns: 150, seed: 61960 };

function relativelyClose(a: number, b: number, tolerance = 1e-9): boolean {
  return Math.abs(a - b) <= tolerance * Math.max(Math.abs(a), Math.abs(b));
}

function resolvedValue(result: ReturnType<typeof resolveCurrent>): number {
  if (!result.ok) throw new Error(result.message);
  return result.resolved.value;
}

describe('resolution properties', () => {
  it('It multiples scale linearly with rated capacity and with the multiple (IEC 61434 definition)', () => {
    fc.assert(
      fc.property(
        cellSpecificationArbitrary,
        fc.integer({ min: 1, max: 100 }),
        fc.integer({ min: 2, max: 5 }),
        (cell, hundredths, factor) => {
          const multiple = hundredths / 100;
          const single = resolvedValue(resolveCurrent({ multipleOfIt: multiple }, cell));
          const scaledCell = { ...cell, ratedCapacityMah: cell.ratedCapacityMah * factor };
          const scaled = resolvedValue(resolveCurrent({ multipleOfIt: multiple }, scaledCell));
          const doubled = resolvedValue(resolveCurrent({ multipleOfIt: multiple * factor }, cell));
          expect(relativelyClose(single, (multiple * cell.ratedCapacityMah) / 1000)).toBe(true);
          expect(relativelyClose(scaled, factor * single)).toBe(true);
          expect(relativelyClose(doubled, factor * single)).toBe(true);
        },
      ),
      runs,
    );
  });

  it('mA and A give the same current in SI', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), (milliamperes) => {
        const inMilli = resolvedValue(resolveCurrent({ value: milliamperes, unit: 'mA' }, inventedCell));
        const inUnits = resolvedValue(resolveCurrent({ value: milliamperes / 1000, unit: 'A' }, inventedCell));
        expect(inMilli).toBe(inUnits);
      }),
      runs,
    );
  });

  it('h, min and s give the same duration in SI, also for fractional values', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), fc.integer({ min: 1, max: 8 }), (count, divisor) => {
        const hours = count / divisor;
        const inHours = convertToSeconds({ value: hours, unit: 'h' });
        const inMinutes = convertToSeconds({ value: hours * 60, unit: 'min' });
        const inSeconds = convertToSeconds({ value: hours * 3600, unit: 's' });
        expect(relativelyClose(inHours, inMinutes, 1e-12)).toBe(true);
        expect(relativelyClose(inHours, inSeconds, 1e-12)).toBe(true);
        if (divisor === 1) expect(inHours).toBe(count * 3600);
      }),
      runs,
    );
  });

  it('every generated valid procedure passes the schema and resolves deterministically', () => {
    fc.assert(
      fc.property(procedureArbitrary, cellSpecificationArbitrary, (procedure, cell) => {
        expect(validateProcedure(procedure)).toEqual({ ok: true, value: procedure });
        const first = resolveProcedure({ procedure, cellSpecification: cell });
        const second = resolveProcedure({ procedure: structuredClone(procedure), cellSpecification: { ...cell } });
        expect(first.ok).toBe(true);
        expect(second).toEqual(first);
        if (!first.ok) return;
        const { resolution } = first;
        expect(resolution.steps.map((step) => step.id)).toEqual(procedure.steps.map((step) => step.id));
        expect(resolution.decisionRule).toBe(procedure.decisionRule ?? 'simple acceptance');
        expect(resolution.ready).toBe(resolution.errors.length === 0 && resolution.cautionsNeedingAcknowledgement.length === 0);
        // Acknowledging every caution leaves only the errors standing.
        const acknowledged = resolveProcedure({
          procedure,
          cellSpecification: cell,
          acknowledgedCautions: resolution.cautions.map((caution) => caution.code),
        });
        expect(acknowledged.ok && acknowledged.resolution.ready).toBe(resolution.errors.length === 0);
      }),
      runs,
    );
  }, 30_000);

  it('every resolved current above the maximum continuous discharge current is a caution', () => {
    fc.assert(
      fc.property(currentReferenceArbitrary, cellSpecificationArbitrary, (current, cell) => {
        const step: Step = {
          kind: 'discharge',
          id: 'd',
          label: 'Discharge',
          purpose: 'measure',
          current,
          endVoltage: { spec: 'endOfDischargeVoltage' },
        };
        const result = resolveProcedure({ procedure: procedureWith([step]), cellSpecification: cell });
        if (!result.ok) throw new Error('generated input must be valid');
        const resolved = result.resolution.steps[0];
        const amperes = resolved?.kind === 'discharge' ? resolved.current?.value : undefined;
        const flagged = result.resolution.cautions.some((caution) => caution.code === 'discharge-current-above-rating/d/current');
        expect(flagged).toBe(amperes !== undefined && amperes > cell.maxContinuousDischargeCurrentA * (1 + 1e-9));
      }),
      runs,
    );
  });

  it('formats every reference without throwing', () => {
    fc.assert(
      fc.property(fc.oneof(currentReferenceArbitrary, durationArbitrary), (quantity) => {
        expect(formatQuantity(quantity)).toMatch(/\S/);
      }),
      runs,
    );
  });
});

function procedureWith(steps: Step[]): Procedure {
  return {
    header: {
      title: 'Property',
      code: 'P',
      scope: 'Property test.',
      standard: 'IEC 61960-3:2017',
      clause: '7.3',
      ambient: { nominalC: 20, toleranceC: 5 },
    },
    steps,
    acceptance: [],
  };
}

type Mutation = { apply: (procedure: Procedure) => void; expectedPath: (procedure: Procedure) => string };

/** Ways to break a valid procedure, each with the field path the refusal must name. */
const mutations: Record<string, Mutation> = {
  'negative current': {
    apply: (procedure) => {
      procedure.steps[0] = {
        kind: 'discharge',
        id: 'step-0',
        label: 'D',
        purpose: 'measure',
        current: { value: -1, unit: 'A' },
        endVoltage: { spec: 'endOfDischargeVoltage' },
      };
    },
    expectedPath: () => 'steps.0.current.value',
  },
  'duplicate id': {
    apply: (procedure) => {
      const id = procedure.steps[0]?.id ?? 'x';
      procedure.steps.push({ kind: 'rest', id, label: 'Rest', minDuration: { value: 1, unit: 'h' } });
    },
    expectedPath: (procedure) => `steps.${procedure.steps.length - 1}.id`,
  },
  'criterion on a missing step': {
    apply: (procedure) => {
      const criterion = { kind: 'capacity', id: 'extra', stepId: 'missing-step', atLeastPercent: 100, of: 'rated' } as const;
      procedure.acceptance.push(criterion);
    },
    expectedPath: (procedure) => `acceptance.${procedure.acceptance.length - 1}.stepId`,
  },
  'rest shorter at most than at least': {
    apply: (procedure) => {
      procedure.steps.push({
        kind: 'rest',
        id: 'extra-rest',
        label: 'Rest',
        minDuration: { value: 2, unit: 'h' },
        maxDuration: { value: 1, unit: 'h' },
      });
    },
    expectedPath: (procedure) => `steps.${procedure.steps.length - 1}.maxDuration`,
  },
  'unknown specification field': {
    apply: (procedure) => {
      procedure.steps.push({
        kind: 'discharge',
        id: 'extra-d',
        label: 'D',
        purpose: 'measure',
        current: { spec: 'ratedCurrent' } as never,
        endVoltage: { spec: 'endOfDischargeVoltage' },
      });
    },
    expectedPath: (procedure) => `steps.${procedure.steps.length - 1}.current.spec`,
  },
  'no steps': {
    apply: (procedure) => {
      procedure.steps = [];
      procedure.acceptance = [];
      delete procedure.repeat;
    },
    expectedPath: () => 'steps',
  },
};

describe('validation properties', () => {
  it('every broken procedure is refused with the field path of the break', () => {
    fc.assert(
      fc.property(procedureArbitrary, fc.constantFrom(...Object.keys(mutations)), (valid, name) => {
        const mutation = mutations[name]!;
        const procedure = structuredClone(valid);
        mutation.apply(procedure);
        const result = validateProcedure(procedure);
        expect(result.ok).toBe(false);
        if (result.ok) return;
        expect(result.problems.map((problem) => problem.path)).toContain(mutation.expectedPath(procedure));
        for (const problem of result.problems) expect(problem.message).toMatch(/\S/);
      }),
      runs,
    );
  });
});
