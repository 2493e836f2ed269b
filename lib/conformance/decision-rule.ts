import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";
import { citeDecisionRule, nameDecisionRule, type DecisionRule } from "@/protocols";

/**
 * The decision rules of ILAC-G8:09/2019 clause 4.2 (ISO/IEC 17025:2017 7.1.3 and 7.8.6; JCGM
 * 106:2012), named by the procedure (protocols/decision-rule.ts). TL is the tolerance limit, U the
 * expanded uncertainty (k = 2), the guard band w = U, the acceptance limit AL = TL moved inward by w:
 * - simple acceptance (4.2.1, w = 0): at or inside TL → conforms; else does not conform;
 * - binary guard band (4.2.2): at or inside AL → conforms; else does not conform;
 * - non-binary guard band (4.2.3): at or inside AL → conforms ("pass"); between AL and TL →
 *   conditional pass; outside TL by less than U → conditional fail; outside TL by U or more →
 *   does not conform ("fail").
 * "not decided" is no outcome of any rule: it is written when no rule could be applied (no
 * measured value, no limit, no uncertainty for a guard band).
 */
export type { DecisionRule };

export type ConformityOutcome = "conforms" | "conditional pass" | "conditional fail" | "does not conform" | "not decided";

/** A lower limit (capacity ≥ rated) or an upper limit (resistance ≤ maximum). */
export interface SpecificationLimit {
  side: "lower" | "upper";
  value: number;
}

export interface ConformityInput {
  measured: number;
  limit: SpecificationLimit;
  rule: DecisionRule;
  /** Expanded uncertainty U of the measured value, same unit; required for both guard-band rules. */
  expandedUncertainty?: number;
  coverageFactor?: number;
  /** Unit written in the statement, e.g. "Ah". */
  unit: string;
  /** Decimals written in the statement. Default 3. */
  decimals?: number;
}

export interface ConformityStatement {
  outcome: ConformityOutcome;
  rule: DecisionRule;
  /** The value the measured result is compared with to conform: the limit moved inward by the guard band. */
  acceptanceLimit: number;
  guardBand: number;
  /** Plain-English statement of the rule applied, its clause and the outcome, for the certificate. */
  statement: string;
}

/** Does the rule need the expanded uncertainty (a guard band w = U)? */
export function usesGuardBand(rule: DecisionRule): boolean {
  return rule !== "simple acceptance";
}

function decideOutcome(rule: DecisionRule, insideLimit: number, insideAcceptance: number, guardBand: number): ConformityOutcome {
  switch (rule) {
    case "simple acceptance":
      return insideLimit >= 0 ? "conforms" : "does not conform";
    case "binary guard band":
      return insideAcceptance >= 0 ? "conforms" : "does not conform";
    case "non-binary guard band":
      if (insideAcceptance >= 0) return "conforms";
      if (insideLimit >= 0) return "conditional pass";
      return insideLimit > -guardBand ? "conditional fail" : "does not conform";
    default: {
      const unknown: never = rule;
      throw new Error(`Unknown decision rule ${String(unknown)}`);
    }
  }
}

export function evaluateConformity(input: ConformityInput): AnalysisResult<ConformityStatement> {
  const { measured, limit, rule, unit } = input;
  if (!Number.isFinite(measured) || !Number.isFinite(limit.value)) return fail("invalid-input", "The measured value and the limit must be numbers.");
  const u = input.expandedUncertainty;
  if (u !== undefined && !(Number.isFinite(u) && u >= 0)) return fail("invalid-input", "The expanded uncertainty must be zero or more.");
  if (usesGuardBand(rule) && u === undefined) return fail("invalid-input", "A guard band w = U needs the expanded uncertainty.");
  const guardBand = usesGuardBand(rule) ? (u as number) : 0;
  const inward = limit.side === "lower" ? 1 : -1;
  const acceptanceLimit = limit.value + inward * guardBand;
  // Signed distances on the "conforming" side: positive means the value is inside.
  const insideLimit = inward * (measured - limit.value);
  const insideAcceptance = inward * (measured - acceptanceLimit);
  const outcome = decideOutcome(rule, insideLimit, insideAcceptance, guardBand);

  const decimals = input.decimals ?? 3;
  const show = (x: number) => `${x.toFixed(decimals)} ${unit}`;
  const k = input.coverageFactor ?? 2;
  const uText = u === undefined ? "" : `U = ${show(u)}, k = ${k}`;
  const bound = limit.side === "lower" ? "at or above" : "at or below";
  const beyond = limit.side === "lower" ? "below" : "above";
  const named = `Decision rule: ${nameDecisionRule(rule)}.`;
  const ruleText = (() => {
    switch (rule) {
      case "simple acceptance":
        return (
          `${named} The result conforms when the measured value is ${bound} the ${limit.side} limit of ${show(limit.value)} and does not conform otherwise` +
          (uText ? `; the measurement uncertainty (${uText}) is reported but not subtracted.` : ".")
        );
      case "binary guard band":
        return (
          `${named} Guard band equal to the expanded uncertainty (${uText}): the result conforms when the measured value is ${bound} the acceptance limit of ` +
          `${show(acceptanceLimit)} (the ${limit.side} limit of ${show(limit.value)} moved inward by U) and does not conform otherwise.`
        );
      case "non-binary guard band": {
        const outer = limit.value - inward * guardBand;
        return (
          `${named} Guard band equal to the expanded uncertainty (${uText}), ${limit.side} limit ${show(limit.value)}, acceptance limit ${show(acceptanceLimit)}: ` +
          `${bound} the acceptance limit conforms (pass); between the acceptance limit and the limit, conditional pass; ${beyond} the limit by less than U ` +
          `(as far as ${show(outer)}), conditional fail; further out, does not conform (fail).`
        );
      }
      default: {
        const unknown: never = rule;
        throw new Error(`Unknown decision rule ${String(unknown)}`);
      }
    }
  })();
  return succeed({ outcome, rule, acceptanceLimit, guardBand, statement: `${ruleText} Measured ${show(measured)}: ${outcome}.` });
}

/** The clause a statement of conformity cites: the standard's requirement on reports and the guide's rule. */
export function citeStatementOfConformity(rule: DecisionRule): string {
  return `ISO/IEC 17025:2017 7.8.6; ${citeDecisionRule(rule)}`;
}
