import { z } from 'zod';
import { assertNever } from './assert-never';
import { chargeTerminationSchema } from './charge-termination';
import { cycleBlockFields, checkCycleBlock } from './endurance';
import { explainTypeError } from './explain-type-error';
import { compareCurrentsWithoutSpecification, compareNumbers } from './compare-references';
import { identifierSchema } from './identifier';
import { observationFieldsSchema } from './observation';
import { setPointTolerancesSchema } from './measurement-tolerances';
import {
  currentReferenceSchema,
  durationSchema,
  frequencySchema,
  temperatureRangeSchema,
  voltageReferenceSchema,
  type Duration,
} from './quantity';
import { convertToSeconds } from './units';

type IssueSink = { addIssue: (issue: { code: 'custom'; path: string[]; message: string }) => void };

export { chargeTerminationSchema };

/** Fields every step has. A soak sets its own temperature, so it takes no ambient range. */
const commonFields = {
  id: identifierSchema,
  label: z
    .string({ error: explainTypeError('a label is text') })
    .trim()
    .min(1, { error: 'every step needs a label' })
    .max(200),
  ambient: temperatureRangeSchema.optional(),
  tolerances: setPointTolerancesSchema.optional(),
  /** Plain-text instructions to the operator; rich text lives with the procedure version. */
  instructions: z.string().max(4000, { error: 'instructions have at most 4 000 characters' }).optional(),
};

function checkDurationOrder({
  longer,
  shorter,
  ctx,
}: {
  longer: { duration: Duration | undefined; key: string; words: string };
  shorter: { duration: Duration; words: string };
  ctx: IssueSink;
}): void {
  if (longer.duration === undefined) return;
  const longerS = convertToSeconds(longer.duration);
  const shorterS = convertToSeconds(shorter.duration);
  // Durations already refused as not positive are not compared, so one mistake gives one message.
  if (longerS > 0 && shorterS > 0 && compareNumbers(longerS, shorterS) === 'lower') {
    ctx.addIssue({
      code: 'custom',
      path: [longer.key],
      message: `the ${longer.words} (${longer.duration.value} ${longer.duration.unit}) is shorter than the ${shorter.words} (${shorter.duration.value} ${shorter.duration.unit})`,
    });
  }
}

/** CC-CV charge: constant current to the voltage, then constant voltage until the termination. */
export const chargeStepSchema = z
  .strictObject({
    kind: z.literal('charge'),
    ...commonFields,
    current: currentReferenceSchema,
    voltage: voltageReferenceSchema,
    termination: chargeTerminationSchema,
    maxDuration: durationSchema.optional(),
  })
  .superRefine((step, ctx) => {
    switch (step.termination.kind) {
      case 'current': {
        const order = compareCurrentsWithoutSpecification(step.termination.current, step.current);
        if (order === 'equal' || order === 'higher') {
          ctx.addIssue({
            code: 'custom',
            path: ['termination', 'current'],
            message: 'the termination current must be below the charge current',
          });
        }
        return;
      }
      case 'time':
        checkDurationOrder({
          longer: { duration: step.maxDuration, key: 'maxDuration', words: 'maximum duration' },
          shorter: { duration: step.termination.duration, words: 'termination time' },
          ctx,
        });
        return;
      default:
        assertNever(step.termination);
    }
  });

export const dischargePurposes = ['precondition', 'measure'] as const;
export type DischargePurpose = (typeof dischargePurposes)[number];

/** CC discharge to an end voltage; `measure` discharges are the ones whose capacity is reported. */
export const dischargeStepSchema = z.strictObject({
  kind: z.literal('discharge'),
  ...commonFields,
  current: currentReferenceSchema,
  endVoltage: voltageReferenceSchema,
  maxDuration: durationSchema.optional(),
  purpose: z.enum(dischargePurposes, { error: explainTypeError('the purpose of a discharge is precondition or measure') }),
});

export const restStepSchema = z
  .strictObject({
    kind: z.literal('rest'),
    ...commonFields,
    minDuration: durationSchema,
    maxDuration: durationSchema.optional(),
  })
  .superRefine((step, ctx) =>
    checkDurationOrder({
      longer: { duration: step.maxDuration, key: 'maxDuration', words: 'longest rest' },
      shorter: { duration: step.minDuration, words: 'shortest rest' },
      ctx,
    }),
  );

export const soakStepSchema = z
  .strictObject({
    kind: z.literal('soak'),
    id: commonFields.id,
    label: commonFields.label,
    tolerances: commonFields.tolerances,
    instructions: commonFields.instructions,
    temperature: temperatureRangeSchema,
    minDuration: durationSchema,
    maxDuration: durationSchema.optional(),
  })
  .superRefine((step, ctx) =>
    checkDurationOrder({
      longer: { duration: step.maxDuration, key: 'maxDuration', words: 'longest soak' },
      shorter: { duration: step.minDuration, words: 'shortest soak' },
      ctx,
    }),
  );

/**
 * Two-level discharge pulse for DC resistance (IEC 61960-3 7.7): base current for a time, then
 * the pulse current; R = (U1 − U2) / (I2 − I1) needs I2 above I1.
 */
export const pulseStepSchema = z
  .strictObject({
    kind: z.literal('pulse'),
    ...commonFields,
    baseCurrent: currentReferenceSchema,
    baseDuration: durationSchema,
    pulseCurrent: currentReferenceSchema,
    pulseDuration: durationSchema,
  })
  .superRefine((step, ctx) => {
    const order = compareCurrentsWithoutSpecification(step.pulseCurrent, step.baseCurrent);
    if (order === 'equal' || order === 'lower') {
      ctx.addIssue({
        code: 'custom',
        path: ['pulseCurrent'],
        message: 'the pulse current must be above the base current',
      });
    }
  });

export const measurementSchema = z.discriminatedUnion(
  'quantity',
  [
    z.strictObject({ quantity: z.literal('mass') }),
    z.strictObject({ quantity: z.literal('openCircuitVoltage') }),
    z.strictObject({ quantity: z.literal('acResistance'), frequency: frequencySchema }),
    z.strictObject({ quantity: z.literal('dimensions') }),
  ],
  { error: explainTypeError('a measurement is one of mass, openCircuitVoltage, acResistance, dimensions') },
);

export const measureStepSchema = z.strictObject({
  kind: z.literal('measure'),
  ...commonFields,
  measurement: measurementSchema,
});

/**
 * Observation: the operator records mass, open-circuit voltage, dimensions and the visual state (a
 * closed list), judged against an earlier observation by the step's criteria (protocols/observation.ts).
 * No current flows, so the data log holds no trace of it.
 */
export const observeStepSchema = z.strictObject({
  kind: z.literal('observe'),
  ...commonFields,
  ...observationFieldsSchema,
});

/**
 * Endurance in cycles: charge, rest, discharge, rest repeated up to `maxCycles` times, recorded once on
 * the step sheet while the data log carries the cycles (protocols/endurance.ts).
 */
export const cycleBlockStepSchema = z
  .strictObject({
    kind: z.literal('cycle-block'),
    ...commonFields,
    ...cycleBlockFields,
  })
  .superRefine((step, ctx) => checkCycleBlock(step, ctx));

export const stepKinds = ['charge', 'discharge', 'rest', 'soak', 'pulse', 'measure', 'observe', 'cycle-block'] as const;

export const stepSchema = z.discriminatedUnion(
  'kind',
  [chargeStepSchema, dischargeStepSchema, restStepSchema, soakStepSchema, pulseStepSchema, measureStepSchema, observeStepSchema, cycleBlockStepSchema],
  { error: explainTypeError(`the step kind is one of ${stepKinds.join(', ')}`) },
);

export type ChargeTermination = z.infer<typeof chargeTerminationSchema>;
export type ChargeStep = z.infer<typeof chargeStepSchema>;
export type DischargeStep = z.infer<typeof dischargeStepSchema>;
export type RestStep = z.infer<typeof restStepSchema>;
export type SoakStep = z.infer<typeof soakStepSchema>;
export type PulseStep = z.infer<typeof pulseStepSchema>;
export type Measurement = z.infer<typeof measurementSchema>;
export type MeasurementQuantity = Measurement['quantity'];
export type MeasureStep = z.infer<typeof measureStepSchema>;
export type ObserveStep = z.infer<typeof observeStepSchema>;
export type CycleBlockStep = z.infer<typeof cycleBlockStepSchema>;
export type Step = z.infer<typeof stepSchema>;
export type StepKind = Step['kind'];
