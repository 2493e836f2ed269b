import { z } from 'zod';
import { explainTypeError } from './explain-type-error';

/**
 * How measurement uncertainty enters the statement of conformity (ISO/IEC 17025:2017 3.7 and 7.8.6;
 * ILAC-G8:09/2019; JCGM 106:2012): simple acceptance compares the measured value with the limit as
 * it is; guarded acceptance moves the limit inward by the expanded uncertainty U (k = 2).
 */
export const decisionRules = ['simple acceptance', 'guarded acceptance'] as const;
export type DecisionRule = (typeof decisionRules)[number];

export const decisionRuleSchema = z.enum(decisionRules, {
  error: explainTypeError('the decision rule is simple acceptance or guarded acceptance'),
});

/** The rule of a procedure that names none: definitions saved before procedures stated a rule were judged so. */
export const defaultDecisionRule: DecisionRule = 'simple acceptance';

/** The rule a procedure (or its resolution) states, or the default when a stored one predates the field. */
export function readDecisionRule(source: { decisionRule?: DecisionRule | undefined }): DecisionRule {
  return source.decisionRule ?? defaultDecisionRule;
}

const explanations: Record<DecisionRule, string> = {
  'simple acceptance':
    'The measured value is compared with the limit as it is; the measurement uncertainty is reported beside it but not subtracted.',
  'guarded acceptance':
    'A result conforms only when it clears the limit by its expanded uncertainty (k = 2); a result between the limit and that guard band is not decided.',
};

/** One plain sentence on what the rule does, for the editor, the procedure sheet and the results. */
export function explainDecisionRule(rule: DecisionRule): string {
  return explanations[rule];
}
