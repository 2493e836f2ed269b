import { z } from 'zod';
import { explainTypeError } from './explain-type-error';

/**
 * How measurement uncertainty enters the statement of conformity (ISO/IEC 17025:2017 3.7, 7.1.3 and
 * 7.8.6; ILAC-G8:09/2019 clause 4.2; JCGM 106:2012). The three rules of ILAC-G8:09/2019 4.2:
 * - simple acceptance: binary statement, guard band w = 0 (4.2.1);
 * - binary guard band: binary statement with guard band w = U, the acceptance limit moved inward by
 *   the expanded uncertainty (4.2.2): inside it conforms, anywhere else does not conform;
 * - non-binary guard band: four outcomes with w = U (4.2.3): conforms (the guide's "pass"),
 *   conditional pass, conditional fail, does not conform (the guide's "fail").
 * Clause numbers checked against a public copy of ILAC-G8:09/2019 (pages 9 and 10); see docs/references.md.
 */
export const decisionRules = ['simple acceptance', 'binary guard band', 'non-binary guard band'] as const;
export type DecisionRule = (typeof decisionRules)[number];

/**
 * Names stored before the three rules of ILAC-G8 were offered. "guarded acceptance" (guard band
 * w = U) is read as the binary statement with guard band, the guide's rule for that band.
 */
export const legacyDecisionRules = ['guarded acceptance'] as const;
export type LegacyDecisionRule = (typeof legacyDecisionRules)[number];
/** A rule as it may be found in stored records: today's names or an earlier one. */
export type StoredDecisionRule = DecisionRule | LegacyDecisionRule;

/** Today's rule for a stored name: "guarded acceptance" becomes the binary statement with guard band w = U. */
export function upgradeDecisionRule(rule: StoredDecisionRule): DecisionRule {
  return rule === 'guarded acceptance' ? 'binary guard band' : rule;
}

export const decisionRuleSchema = z.enum([...decisionRules, ...legacyDecisionRules], {
  error: explainTypeError('the decision rule is simple acceptance, binary guard band or non-binary guard band'),
}).transform(upgradeDecisionRule);

/** The rule of a procedure that names none: definitions saved before procedures stated a rule were judged so. */
export const defaultDecisionRule: DecisionRule = 'simple acceptance';

/** The rule a procedure (or its resolution) states, or the default when a stored one predates the field. */
export function readDecisionRule(source: { decisionRule?: StoredDecisionRule | undefined }): DecisionRule {
  return source.decisionRule === undefined ? defaultDecisionRule : upgradeDecisionRule(source.decisionRule);
}

interface RuleWords {
  /** The rule's name in the guide's words, as the editor, the results and the certificate write it. */
  name: string;
  clause: string;
  explanation: string;
}

const words: Record<StoredDecisionRule, RuleWords> = {
  'simple acceptance': {
    name: 'simple acceptance (binary statement, guard band w = 0)',
    clause: 'ILAC-G8:09/2019 4.2.1',
    explanation:
      'The measured value is compared with the limit as it is: at or inside the limit it conforms, outside it does not conform. The measurement uncertainty is reported beside it but not subtracted.',
  },
  'binary guard band': {
    name: 'binary statement with guard band w = U',
    clause: 'ILAC-G8:09/2019 4.2.2',
    explanation:
      'The acceptance limit is the limit moved inward by the expanded uncertainty U (k = 2). A result at or inside the acceptance limit conforms; any other result does not conform. There is no third outcome.',
  },
  'non-binary guard band': {
    name: 'non-binary statement with guard band w = U (four outcomes)',
    clause: 'ILAC-G8:09/2019 4.2.3',
    explanation:
      'At or inside the acceptance limit (the limit moved inward by U, k = 2): conforms. Between the acceptance limit and the limit: conditional pass. Outside the limit by less than U: conditional fail. Outside the limit by U or more: does not conform.',
  },
  'guarded acceptance': {
    name: 'guarded acceptance, guard band w = U (earlier wording)',
    clause: 'ILAC-G8:09/2019 4.2.2',
    explanation:
      'Stated under the earlier wording of the guard-band rule: a result inside the guard band was written "not decided". New evaluations read this rule as the binary statement with guard band w = U.',
  },
};

/** The rule's name with its clause, e.g. "binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)". */
export function nameDecisionRule(rule: StoredDecisionRule): string {
  const w = words[rule] ?? words[defaultDecisionRule];
  return `${w.name} (${w.clause})`;
}

/** The clause of ILAC-G8:09/2019 the rule comes from. */
export function citeDecisionRule(rule: StoredDecisionRule): string {
  return (words[rule] ?? words[defaultDecisionRule]).clause;
}

/** Plain sentences on what the rule does, for the editor, the procedure sheet and the results. */
export function explainDecisionRule(rule: StoredDecisionRule): string {
  return (words[rule] ?? words[defaultDecisionRule]).explanation;
}
