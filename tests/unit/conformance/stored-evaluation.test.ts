import { describe, expect, it } from "vitest";
import { evaluateRun, parseStoredEvaluation, STORED_EVALUATION_FORMAT, StoredEvaluationError, toStoredEvaluation } from "@/lib/conformance";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";

/** An evaluation as the database hands its JSON back: written by toStoredEvaluation, read through JSON. */
function storedRow(): Record<string, unknown> {
  const result = evaluateRun(buildRatedCapacityRun({ cycles: 1 }).input);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return JSON.parse(JSON.stringify(toStoredEvaluation(result.evaluation)));
}

describe("parseStoredEvaluation", () => {
  it("reads today's format as written, naming its own decision rule", () => {
    const row = storedRow();
    expect(row.format).toBe(STORED_EVALUATION_FORMAT);
    const read = parseStoredEvaluation(row);
    expect(read.format).toBe(2);
    expect(read.steps).toEqual(row.steps);
    expect(read.verdict).toEqual(row.verdict);
    expect(read.uncertainty).toEqual(row.uncertainty);
    expect(read.decisionRule).toBe("simple acceptance");
    expect(read.statedDecisionRule).toBe("simple acceptance");
  });

  it("upgrades a row without a format with the stated defaults", () => {
    const row = storedRow();
    delete row.format;
    delete row.decisionRule;
    delete row.uncertainty;
    delete row.uncertaintyNotEvaluated;
    const read = parseStoredEvaluation(row);
    expect(read.format).toBe(2);
    expect(read.uncertainty).toEqual([]);
    expect(read.uncertaintyNotEvaluated).toEqual([]);
    // The first acceptance result names the rule the run was judged by.
    expect(read.decisionRule).toBe("simple acceptance");
  });

  it("takes an older row's rule from its acceptance results or its settings, and gives an earlier name in today's words", () => {
    const row = storedRow();
    delete row.format;
    delete row.decisionRule;
    row.acceptance = (row.acceptance as object[]).map((a) => ({ ...a, rule: "guarded acceptance" }));
    const fromCriteria = parseStoredEvaluation(row);
    expect(fromCriteria.statedDecisionRule).toBe("guarded acceptance");
    expect(fromCriteria.decisionRule).toBe("binary guard band");
    const fromSettings = parseStoredEvaluation({ ...row, acceptance: [], settings: { ...(row.settings as object), decisionRule: "non-binary guard band" } });
    expect(fromSettings.decisionRule).toBe("non-binary guard band");
    expect(parseStoredEvaluation({ ...row, acceptance: [] }).decisionRule).toBe("simple acceptance");
  });

  it("refuses a row that is not an evaluation, or a format it does not know, in words and without the data", () => {
    const row = storedRow();
    expect(() => parseStoredEvaluation(null)).toThrow(StoredEvaluationError);
    expect(() => parseStoredEvaluation({ ...row, steps: "none" })).toThrow(/steps/);
    expect(() => parseStoredEvaluation({ ...row, verdict: { procedureFollowed: "yes" } })).toThrow(/verdict is not as an evaluation stores it/);
    expect(() => parseStoredEvaluation({ ...row, format: 3 })).toThrow(StoredEvaluationError);
    // Today's format must carry what today's evaluations always write.
    const withoutRule = { ...row };
    delete withoutRule.decisionRule;
    expect(() => parseStoredEvaluation(withoutRule)).toThrow(/decisionRule/);
  });
});
