import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { formatNumber } from './format-number';
import { identifierSchema } from './identifier';
import type { Step } from './step';

/**
 * What the retention and recovery percentages are shares of (IEC 61960-3, charge (capacity) retention and
 * recovery; which one the clause uses is recalled, so it is a parameter of the procedure, not a constant).
 */
export const retentionBases = ['rated capacity', 'capacity before storage'] as const;
export type RetentionBasis = (typeof retentionBases)[number];

/**
 * Charge retention and recovery: the capacity of the discharge after storage (retention) and of the
 * discharge after the recharge that follows it (recovery), each as a percentage of the basis.
 */
export const chargeRetentionSchema = z
  .strictObject({
    afterStorageStepId: identifierSchema,
    recoveryStepId: identifierSchema,
    basis: z.enum(retentionBases, { error: explainTypeError('the percentages are of the rated capacity or of the capacity before storage') }),
    /** The measured discharge before storage; required when the basis is that capacity. */
    beforeStorageStepId: identifierSchema.optional(),
  })
  .superRefine((retention, ctx) => {
    if (retention.basis === 'capacity before storage' && retention.beforeStorageStepId === undefined) {
      ctx.addIssue({ code: 'custom', path: ['beforeStorageStepId'], message: 'name the discharge before storage whose capacity is the basis' });
    }
  });

export type ChargeRetention = z.infer<typeof chargeRetentionSchema>;

/** As resolved on a cell: the rated capacity is carried, so a frozen resolution needs no specification. */
export interface ResolvedChargeRetention {
  afterStorageStepId: string;
  recoveryStepId: string;
  basis: { kind: 'rated capacity'; capacityAh: number } | { kind: 'capacity before storage'; stepId: string };
}

export function resolveChargeRetention(retention: ChargeRetention, ratedCapacityMah: number): ResolvedChargeRetention {
  return {
    afterStorageStepId: retention.afterStorageStepId,
    recoveryStepId: retention.recoveryStepId,
    basis:
      retention.basis === 'rated capacity' || retention.beforeStorageStepId === undefined
        ? { kind: 'rated capacity', capacityAh: ratedCapacityMah / 1000 }
        : { kind: 'capacity before storage', stepId: retention.beforeStorageStepId },
  };
}

type IssueSink = { addIssue: (issue: { code: 'custom'; path: (string | number)[]; message: string }) => void };

/** Each named step is a measured discharge, in the order before storage → after storage → recovery. */
export function checkChargeRetentionSteps(retention: ChargeRetention | undefined, steps: readonly Step[], ctx: IssueSink): void {
  if (retention === undefined) return;
  const named: { key: keyof ChargeRetention; id: string | undefined; words: string }[] = [
    { key: 'beforeStorageStepId', id: retention.basis === 'capacity before storage' ? retention.beforeStorageStepId : undefined, words: 'discharge before storage' },
    { key: 'afterStorageStepId', id: retention.afterStorageStepId, words: 'discharge after storage' },
    { key: 'recoveryStepId', id: retention.recoveryStepId, words: 'recovery discharge' },
  ];
  let lastIndex = -1;
  for (const { key, id, words } of named) {
    if (id === undefined) continue;
    const path = ['retention', key];
    const index = steps.findIndex((step) => step.id === id);
    const step = steps[index];
    if (step === undefined) {
      ctx.addIssue({ code: 'custom', path, message: `the ${words} names "${id}", but no step has that id` });
      continue;
    }
    if (step.kind !== 'discharge' || step.purpose !== 'measure') {
      ctx.addIssue({ code: 'custom', path, message: `the ${words} must be a measured discharge; "${id}" is not` });
    }
    if (index <= lastIndex) ctx.addIssue({ code: 'custom', path, message: `the ${words} must come after the discharge named before it` });
    lastIndex = Math.max(lastIndex, index);
  }
}

/** The procedure's retention setting in words, for the procedure preview. */
export function describeChargeRetention(retention: ResolvedChargeRetention, steps: readonly { id: string; label: string }[]): string {
  const label = (id: string) => `"${steps.find((step) => step.id === id)?.label ?? id}"`;
  const basis =
    retention.basis.kind === 'rated capacity'
      ? `the rated capacity, ${formatNumber(retention.basis.capacityAh * 1000, { maxDecimals: 1 })} mAh`
      : `the capacity of ${label(retention.basis.stepId)} before storage`;
  return `Reports charge retention (${label(retention.afterStorageStepId)}) and recovery (${label(retention.recoveryStepId)}) as percentages of ${basis}.`;
}

/** A procedure's own retention setting in words (before it is resolved on a cell). */
export function describeRetentionSetting(retention: ChargeRetention, steps: readonly { id: string; label: string }[]): string {
  const label = (id: string) => `"${steps.find((step) => step.id === id)?.label ?? id}"`;
  const basis =
    retention.basis === 'capacity before storage' && retention.beforeStorageStepId !== undefined
      ? `the capacity of ${label(retention.beforeStorageStepId)} before storage`
      : 'the rated capacity';
  return `Charge retention (${label(retention.afterStorageStepId)}) and recovery (${label(retention.recoveryStepId)}) as percentages of ${basis}.`;
}
