import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";
import type { DecisionRule } from "@/protocols";

/**
 * The decision rule (ISO/IEC 17025:2017 3.7 and 7.8.6; ILAC-G8:09/2019; JCGM 106:2012), named by
 * the procedure (protocols/decision-rule.ts):
 * - simple acceptance: the measured value is compared with the limit as it is (guard band w = 0);
 * - guarded acceptance: a result conforms only when it clears the limit by the expanded
 *   uncertainty U (guard band w = U); a result on the wrong side of the limit does not conform;
 *   a result between the limit and the acceptance limit is not decided.
 */
export type { DecisionRule };

export type ConformityOutcome = "conforms" | "does not conform" | "not decided";

/** A lower limit (capacity ≥ rated) or an upper limit (resistance ≤ maximum). */
export interface SpecificationLimit {
  side: "lower" | "upper";
  value: number;
}

export interface ConformityInput {
  measured: number;
  limit: SpecificationLimit;
  rule: DecisionRule;
  /** Expanded uncertainty U of the measured value, same unit; required for guarded acceptance. */
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
  /** Plain-English statement of the rule applied and the outcome, for the certificate. */
  statement: string;
}

export function evaluateConformity(input: ConformityInput): AnalysisResult<ConformityStatement> {
  const { measured, limit, rule, unit } = input;
  if (!Number.isFinite(measured) || !Number.isFinite(limit.value)) return fail("invalid-input", "The measured value and the limit must be numbers.");
  const u = input.expandedUncertainty;
  if (u !== undefined && !(Number.isFinite(u) && u >= 0)) return fail("invalid-input", "The expanded uncertainty must be zero or more.");
  if (rule === "guarded acceptance" && u === undefined) return fail("invalid-input", "Guarded acceptance needs the expanded uncertainty.");
  const guardBand = rule === "guarded acceptance" ? (u as number) : 0;
  const inward = limit.side === "lower" ? 1 : -1;
  const acceptanceLimit = limit.value + inward * guardBand;
  // Signed distances on the "conforming" side: positive means the value is inside.
  const insideLimit = inward * (measured - limit.value);
  const insideAcceptance = inward * (measured - acceptanceLimit);
  const outcome: ConformityOutcome = insideAcceptance >= 0 ? "conforms" : insideLimit < 0 ? "does not conform" : "not decided";

  const decimals = input.decimals ?? 3;
  const show = (x: number) => `${x.toFixed(decimals)} ${unit}`;
  const k = input.coverageFactor ?? 2;
  const uText = u === undefined ? "" : `U = ${show(u)}, k = ${k}`;
  const bound = limit.side === "lower" ? "at or above" : "at or below";
  const beyond = limit.side === "lower" ? "below" : "above";
  const ruleText = (() => {
    switch (rule) {
      case "simple acceptance":
        return (
          `Decision rule: simple acceptance (ILAC-G8:09/2019, guard band zero). The result conforms when the measured value is ${bound} the ` +
          `${limit.side} limit of ${show(limit.value)} and does not conform otherwise` +
          (uText ? `; the measurement uncertainty (${uText}) is reported but not subtracted.` : ".")
        );
      case "guarded acceptance":
        return (
          `Decision rule: guarded acceptance (ILAC-G8:09/2019, JCGM 106:2012), guard band equal to the expanded uncertainty (${uText}). ` +
          `The result conforms when the measured value is ${bound} the acceptance limit of ${show(acceptanceLimit)}, does not conform when it is ` +
          `${beyond} the ${limit.side} limit of ${show(limit.value)}, and is not decided in between.`
        );
      default: {
        const unknown: never = rule;
        throw new Error(`Unknown decision rule ${String(unknown)}`);
      }
    }
  })();
  return succeed({ outcome, rule, acceptanceLimit, guardBand, statement: `${ruleText} Measured ${show(measured)}: ${outcome}.` });
}
