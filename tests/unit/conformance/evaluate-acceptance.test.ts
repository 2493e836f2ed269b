import { describe, expect, it } from "vitest";
import { evaluateCapacityUncertainty, type UncertaintySource } from "@/lib/analysis";
import { evaluateAcceptance } from "@/lib/conformance";
import type { ResolvedCriterion } from "@/protocols";
import { contextOf, evidenceOf, levelOf, logOf, recordOf, steps, valueOf } from "./context-fixtures";

/** A 0.6 A discharge for `hours`, ending at `lastV`, sampled every 60 s: Q = 0.6 A × hours. */
function dischargeFor(hours: number, lastV = 2.5) {
  const n = hours * 60 + 1;
  return evidenceOf(logOf(levelOf(n, (k) => 4 - ((4 - lastV) * k) / (n - 1), -0.6), Array.from({ length: n }, (_, k) => k * 60)));
}

const capacity: ResolvedCriterion = {
  kind: "capacity",
  id: "rated-capacity",
  stepId: "discharge",
  atLeastPercent: 100,
  of: "rated",
  minimum: { ...valueOf(3, "Ah"), explanation: "100 % of the rated capacity 3 000 mAh = 3 000 mAh" },
};

describe("evaluateAcceptance", () => {
  it("states conformity of the logged capacity under simple acceptance by default", () => {
    const result = evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(5.1) }));
    expect(result).toMatchObject({ criterionId: "rated-capacity", cycle: 1, outcome: "conforms", rule: "simple acceptance", limit: { value: 3, side: "lower" } });
    expect(result.measured?.value).toBeCloseTo(3.06, 12);
    expect(result.statement).toContain("Measured 3.060 Ah: conforms.");
  });

  it("does not conform below the limit", () => {
    expect(evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(4.9) })).outcome).toBe("does not conform");
  });

  it("applies the binary guard-band rule (ILAC-G8:09/2019 4.2.2) with the expanded uncertainty of the step's budget as guard band", () => {
    // Measured 3.03 Ah over 5.05 h at 0.6 A. Example B limits (docs/references.md §6) give U = 0.539 % = 0.0163 Ah, which
    // 3.03 Ah clears; clause-4 limits (Example A) give U = 1.1605 % = 0.0352 Ah, which it does not.
    const guarded = (sources: UncertaintySource[]) => {
      const budget = evaluateCapacityUncertainty({ capacityAh: 3.03, currentA: 0.6, durationS: 5.05 * 3600, sources });
      if (!budget.ok) throw new Error(budget.error.message);
      return evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(5.05) }), {
        rule: "binary guard band",
        uncertainty: { evaluated: true, quantity: "capacity", budget: budget.value },
      });
    };
    const exampleB = guarded([
      { quantity: "current", source: "channel", tolerance: { form: "percent-of-reading-and-range", percentOfReading: 0.05, percentOfRange: 0.05, range: 5 } },
      { quantity: "time", source: "time base", tolerance: { form: "percent-of-reading", percent: 0.01 } },
    ]);
    expect(exampleB.outcome).toBe("conforms");
    expect(exampleB.uncertainty).toMatchObject({ evaluated: true, quantity: "capacity", coverageFactor: 2 });
    const clauseFour = guarded([
      { quantity: "current", source: "clause 4", tolerance: { form: "percent-of-reading", percent: 1 } },
      { quantity: "time", source: "clause 4", tolerance: { form: "percent-of-reading", percent: 0.1 } },
    ]);
    // Inside the guard band the binary rule has no third outcome: does not conform.
    expect(clauseFour.outcome).toBe("does not conform");
    expect(clauseFour.expandedUncertainty).toBeCloseTo(0.011605 * 3.03, 5);
    expect(clauseFour.statement).toContain("acceptance limit of 3.035 Ah");
  });

  it("without a budget, a guard-band rule is not decided and simple acceptance decides, both saying why", () => {
    const notEvaluated = { evaluated: false as const, reason: "the cycler channel CH-1 states no current accuracy in the instrument register" };
    const guarded = evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(5.1) }), { rule: "non-binary guard band", uncertainty: notEvaluated });
    expect(guarded).toMatchObject({ outcome: "not decided", expandedUncertainty: null, uncertainty: notEvaluated });
    expect(guarded.statement).toBe(
      "Not decided: a guard band w = U needs the expanded uncertainty, and it was not evaluated (the cycler channel CH-1 states no current accuracy in the instrument register).",
    );
    const simple = evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(5.1) }), { rule: "simple acceptance", uncertainty: notEvaluated });
    expect(simple.outcome).toBe("conforms");
    expect(simple.statement).toMatch(/Measured 3\.060 Ah: conforms\. Measurement uncertainty not evaluated: the cycler channel CH-1 states no current accuracy/);
  });

  it("leaves a shortfall undecided when the discharge stopped before its end voltage", () => {
    const result = evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(4, 3.5) }));
    expect(result.outcome).toBe("not decided");
    expect(result.notes[0]).toContain("stopped before its end voltage");
    expect(evaluateAcceptance(capacity, contextOf({ step: steps.discharge, evidence: dischargeFor(5.5, 3.5) })).outcome).toBe("conforms");
  });

  it("is not decided without a log or without a resolved limit", () => {
    expect(evaluateAcceptance(capacity, contextOf({ step: steps.discharge }))).toMatchObject({ outcome: "not decided", measured: null, statement: "Not decided: no data log was uploaded." });
    expect(evaluateAcceptance({ ...capacity, minimum: null }, contextOf({ step: steps.discharge, evidence: dischargeFor(5.1) })).outcome).toBe("not decided");
  });

  it("judges a discharge duration (≥ 300 min at 0.2 It) and a recorded AC resistance", () => {
    const duration: ResolvedCriterion = { kind: "discharge-duration", id: "time", stepId: "discharge", minimum: valueOf(18_000, "s") };
    expect(evaluateAcceptance(duration, contextOf({ step: steps.discharge, evidence: dischargeFor(5) })).outcome).toBe("conforms");
    expect(evaluateAcceptance(duration, contextOf({ step: steps.discharge, evidence: dischargeFor(4.95) })).outcome).toBe("does not conform");
    const resistance: ResolvedCriterion = { kind: "resistance", id: "ac", stepId: "measure", maximum: valueOf(0.02, "Ω") };
    const measured = (acResistanceOhm: number) =>
      evaluateAcceptance(resistance, contextOf({ step: steps.measure, record: recordOf({ stepId: "measure", measured: { acResistanceOhm } }) }));
    expect(measured(0.018)).toMatchObject({ outcome: "conforms", limit: { side: "upper" } });
    expect(measured(0.018).statement).toContain("Measured 18.00 mΩ");
    expect(measured(0.021).outcome).toBe("does not conform");
    expect(evaluateAcceptance(resistance, contextOf({ step: steps.measure })).outcome).toBe("not decided");
  });

  it("judges Rdc from a logged pulse against a maximum", () => {
    // I1 = 0.6 A then I2 = 3 A; U1 = 3.9000 V, U2 = 3.8520 V → Rdc = 20.0 mΩ (docs/references.md §4 arithmetic).
    const pulse = evidenceOf(logOf([...levelOf(20, 3.9, -0.6), ...levelOf(5, 3.852, -3)]), { pulse: true });
    const criterion: ResolvedCriterion = { kind: "resistance", id: "dc", stepId: "pulse", maximum: valueOf(0.025, "Ω") };
    const result = evaluateAcceptance(criterion, contextOf({ step: steps.pulse, evidence: pulse }));
    expect(result.outcome).toBe("conforms");
    expect(result.measured?.value).toBeCloseTo(0.02, 9);
  });
});
