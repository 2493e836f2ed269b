import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { identifierSchema } from './identifier';

/**
 * Runs a block of consecutive steps (typically charge–rest–discharge) up to `maxCycles` times and
 * stops at the first cycle whose result meets the named acceptance criterion.
 */
export const repeatRuleSchema = z.strictObject({
  label: z
    .string({ error: explainTypeError('a label is text') })
    .trim()
    .min(1, { error: 'name the repeated block' })
    .max(200),
  stepIds: z.array(identifierSchema).min(1, { error: 'the repeated block needs at least one step' }),
  maxCycles: z
    .number({ error: explainTypeError('the number of cycles is a number') })
    .int({ error: 'the number of cycles is a whole number' })
    .min(1, { error: 'the block runs at least once' })
    .max(100, { error: 'at most 100 cycles' }),
  stopWhenMet: identifierSchema,
});

export type RepeatRule = z.infer<typeof repeatRuleSchema>;
