import { z } from 'zod';
import { explainTypeError } from './explain-type-error';

/** Stable identifier of a step or an acceptance criterion inside one procedure. */
export const identifierSchema = z
  .string({ error: explainTypeError('an id is text') })
  .regex(/^[A-Za-z0-9][A-Za-z0-9_-]*$/, {
    error: 'an id uses letters, digits, "-" and "_" only, and starts with a letter or digit',
  })
  .max(64, { error: 'an id has at most 64 characters' });

export type Identifier = z.infer<typeof identifierSchema>;
