import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { currentReferenceSchema, durationSchema } from './quantity';

/** How a CC-CV charge ends; shared by the charge step and the charge of a cycle block. */
export const chargeTerminationSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('current'), current: currentReferenceSchema }),
    z.strictObject({ kind: z.literal('time'), duration: durationSchema }),
  ],
  { error: explainTypeError('a charge ends at a termination current ({ kind: "current" }) or after a time ({ kind: "time" })') },
);
