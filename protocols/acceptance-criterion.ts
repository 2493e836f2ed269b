import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { identifierSchema } from './identifier';
import { durationSchema, resistanceReferenceSchema } from './quantity';
import { assertNever } from './assert-never';
import type { Step } from './step';

export const capacityBases = ['rated', 'minimum'] as const;
export type CapacityBasis = (typeof capacityBases)[number];

const common = { id: identifierSchema, stepId: identifierSchema };

/** Delivered capacity of a discharge step ≥ a percentage of the rated (or minimum) capacity. */
export const capacityCriterionSchema = z.strictObject({
  kind: z.literal('capacity'),
  ...common,
  atLeastPercent: z
    .number({ error: explainTypeError('the percentage is a number') })
    .positive({ error: 'the percentage must be greater than 0' })
    .max(1000, { error: 'the percentage is at most 1 000 %' }),
  of: z.enum(capacityBases, { error: explainTypeError('the capacity is compared with the rated or the minimum capacity') }),
});

/** Duration of a discharge step ≥ a time (0.2 It for ≥ 300 min is the same test as ≥ 100 % rated). */
export const dischargeDurationCriterionSchema = z.strictObject({
  kind: z.literal('discharge-duration'),
  ...common,
  atLeast: durationSchema,
});

/** Resistance from a pulse or an AC measurement ≤ an absolute value or a specification field. */
export const resistanceCriterionSchema = z.strictObject({
  kind: z.literal('resistance'),
  ...common,
  atMost: resistanceReferenceSchema,
});

export const acceptanceCriterionKinds = ['capacity', 'discharge-duration', 'resistance'] as const;

export const acceptanceCriterionSchema = z.discriminatedUnion(
  'kind',
  [capacityCriterionSchema, dischargeDurationCriterionSchema, resistanceCriterionSchema],
  { error: explainTypeError(`the criterion kind is one of ${acceptanceCriterionKinds.join(', ')}`) },
);

export type CapacityCriterion = z.infer<typeof capacityCriterionSchema>;
export type DischargeDurationCriterion = z.infer<typeof dischargeDurationCriterionSchema>;
export type ResistanceCriterion = z.infer<typeof resistanceCriterionSchema>;
export type AcceptanceCriterion = z.infer<typeof acceptanceCriterionSchema>;
export type AcceptanceCriterionKind = AcceptanceCriterion['kind'];

/** Why a criterion cannot judge the step it names, or undefined when it can. */
export function findCriterionStepProblem(criterion: AcceptanceCriterion, step: Step): string | undefined {
  switch (criterion.kind) {
    case 'capacity':
    case 'discharge-duration':
      return step.kind === 'discharge'
        ? undefined
        : `a ${criterion.kind} criterion judges a discharge step; "${step.id}" is a ${step.kind} step`;
    case 'resistance':
      if (step.kind === 'pulse') return undefined;
      if (step.kind === 'measure' && step.measurement.quantity === 'acResistance') return undefined;
      return `a resistance criterion judges a pulse step or an AC resistance measurement; "${step.id}" is neither`;
    default:
      return assertNever(criterion);
  }
}
