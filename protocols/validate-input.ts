import { z } from 'zod';
import { cellSpecificationSchema, type CellSpecification } from './cell-specification';
import { procedureSchema, type Procedure } from './procedure';

/** One reason an input was refused: a dot path to the field (as forms name fields) and a message. */
export interface FieldProblem {
  path: string;
  message: string;
}

export type Validation<T> = { ok: true; value: T } | { ok: false; problems: FieldProblem[] };

/** Plain wording for the issues no schema gave its own message. */
const plainErrors: z.core.$ZodErrorMap = (issue) => {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return 'required';
      return issue.expected === 'array' ? 'expected a list' : `expected a ${issue.expected}`;
    case 'unrecognized_keys':
      return `unexpected field${issue.keys.length > 1 ? 's' : ''}: ${issue.keys.join(', ')}`;
    case 'too_big':
      return `too large (at most ${String(issue.maximum)})`;
    case 'too_small':
      return `too small (at least ${String(issue.minimum)})`;
    default:
      return undefined;
  }
};

function listFieldProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({
    path: issue.path.map((part) => String(part)).join('.'),
    message: issue.message,
  }));
}

function validateWith<T>(schema: z.ZodType<T>, input: unknown): Validation<T> {
  const result = schema.safeParse(input, { error: plainErrors });
  return result.success ? { ok: true, value: result.data } : { ok: false, problems: listFieldProblems(result.error) };
}

/** Checks any input against the procedure schema and its cross-step rules. */
export function validateProcedure(input: unknown): Validation<Procedure> {
  return validateWith(procedureSchema, input);
}

/** Checks any input against the cell specification schema and its consistency rules. */
export function validateCellSpecification(input: unknown): Validation<CellSpecification> {
  return validateWith(cellSpecificationSchema, input);
}
