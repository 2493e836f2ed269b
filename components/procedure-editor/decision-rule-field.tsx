"use client";

import { decisionRules, explainDecisionRule, type DecisionRule } from "@/protocols";
import { SelectInput } from "./select-input";

export const DECISION_RULE_PATH = "definition.decisionRule";

const RULE_WORDS: Record<DecisionRule, string> = {
  "simple acceptance": "Simple acceptance, w = 0 (ILAC-G8:09/2019 4.2.1)",
  "binary guard band": "Binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)",
  "non-binary guard band": "Non-binary statement with guard band w = U, four outcomes (ILAC-G8:09/2019 4.2.3)",
};

/**
 * How the measurement uncertainty enters the pass/fail statement of every criterion (ISO/IEC
 * 17025:2017 7.8.6). The rule is agreed with the customer and named on the certificate.
 */
export function DecisionRuleField() {
  return (
    <SelectInput
      path={DECISION_RULE_PATH}
      label="Decision rule"
      className="max-w-xl"
      options={decisionRules.map((rule) => ({ value: rule, label: RULE_WORDS[rule] }))}
      hint={
        <>
          {decisionRules.map((rule) => (
            <span key={rule} className="block">
              <span className="font-semibold">{RULE_WORDS[rule]}:</span> {explainDecisionRule(rule)}
            </span>
          ))}
          <span className="block">Agree the rule with the customer before the test; the certificate names it.</span>
        </>
      }
    />
  );
}
