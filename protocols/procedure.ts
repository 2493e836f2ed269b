import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { acceptanceCriterionSchema } from './acceptance-criterion';
import { chargeRetentionSchema } from './charge-retention';
import { decisionRuleSchema } from './decision-rule';
import { setPointTolerancesSchema } from './measurement-tolerances';
import { checkProcedureConsistency } from './procedure-consistency';
import { temperatureRangeSchema } from './quantity';
import { repeatRuleSchema } from './repeat-rule';
import { stepSchema } from './step';

const requireText = (what: string, max: number) =>
  z
    .string({ error: explainTypeError(`${what} is text`) })
    .trim()
    .min(1, { error: `${what} is required` })
    .max(max, { error: `${what} has at most ${max} characters` });

export const procedureHeaderSchema = z.strictObject({
  title: requireText('the title', 200),
  /** The lab's document code for the procedure. */
  code: requireText('the code', 40),
  scope: requireText('the scope', 2000),
  /** Standard by number and edition, e.g. "IEC 61960-3:2017". */
  standard: requireText('the standard', 100),
  clause: requireText('the clause', 100),
  /** Ambient range of every step that does not set its own. */
  ambient: temperatureRangeSchema,
  /** Set-point tolerances of every step that does not set its own (else IEC 61960-3 clause 4). */
  tolerances: setPointTolerancesSchema.optional(),
  /** Remarks on the values, e.g. which were recalled and must be verified against the standard. */
  notes: z.array(requireText('a note', 1000)).optional(),
});

export const procedureSchema = z
  .strictObject({
    header: procedureHeaderSchema,
    steps: z.array(stepSchema).min(1, { error: 'a procedure needs at least one step' }),
    acceptance: z.array(acceptanceCriterionSchema),
    /**
     * How uncertainty enters the statement of conformity. Definitions stored before the field existed
     * have none: read them with readDecisionRule, which gives simple acceptance.
     */
    decisionRule: decisionRuleSchema.optional(),
    repeat: repeatRuleSchema.optional(),
    /** Charge retention and recovery percentages, for a storage procedure. */
    retention: chargeRetentionSchema.optional(),
  })
  .superRefine((procedure, ctx) => checkProcedureConsistency(procedure, ctx));

export type ProcedureHeader = z.infer<typeof procedureHeaderSchema>;
export type Procedure = z.infer<typeof procedureSchema>;
