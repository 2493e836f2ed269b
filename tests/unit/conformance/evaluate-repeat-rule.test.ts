import { describe, expect, it } from "vitest";
import { evaluateRepeatRule, type AcceptanceResult, type ConformityOutcome } from "@/lib/conformance";
import type { RepeatRule } from "@/protocols";

const rule: RepeatRule = { label: "Capacity cycle", stepIds: ["charge", "rest", "discharge"], maxCycles: 5, stopWhenMet: "rated-capacity" };

function resultsOf(...outcomes: ConformityOutcome[]): AcceptanceResult[] {
  return outcomes.map((outcome, k) => ({
    criterionId: "rated-capacity",
    kind: "capacity",
    stepId: "discharge",
    cycle: k + 1,
    limit: null,
    measured: null,
    outcome,
    rule: "simple acceptance",
    expandedUncertainty: null,
    uncertainty: { evaluated: false, reason: "not needed by the repeat rule" },
    statement: outcome,
    clause: "",
    notes: [],
  }));
}

const evaluate = (outcomes: ConformityOutcome[], cyclesRun = outcomes.length) =>
  evaluateRepeatRule({ rule, cyclesRun, results: resultsOf(...outcomes), citation: null });

describe("evaluateRepeatRule", () => {
  it("stops at the first cycle that meets the criterion", () => {
    const { outcome, finding } = evaluate(["does not conform", "conforms"]);
    expect(outcome).toMatchObject({ status: "met", metInCycle: 2, decisiveCycle: 2, specimenOutcome: "conforms", cyclesRun: 2 });
    expect(finding).toMatchObject({ rule: "repeat-rule-followed", outcome: "meets", stepId: null });
  });

  it("deviates when cycles ran on after the criterion was met", () => {
    const { outcome, finding } = evaluate(["conforms", "conforms", "does not conform"]);
    expect(outcome.metInCycle).toBe(1);
    expect(finding.outcome).toBe("deviates");
    expect(finding.observed.text).toContain("2 more cycles ran");
  });

  it("does not conform when all allowed cycles ran without meeting it", () => {
    const { outcome, finding } = evaluate(Array<ConformityOutcome>(5).fill("does not conform"));
    expect(outcome).toMatchObject({ status: "not met in any cycle", decisiveCycle: 5, specimenOutcome: "does not conform" });
    expect(finding.outcome).toBe("meets");
  });

  it("is not decided, and deviates, when the block stopped early without meeting it", () => {
    const { outcome, finding } = evaluate(["does not conform", "does not conform"]);
    expect(outcome).toMatchObject({ status: "stopped early", specimenOutcome: "not decided" });
    expect(finding.outcome).toBe("deviates");
  });

  it("deviates when more cycles ran than allowed, judging only the allowed ones", () => {
    const { outcome, finding } = evaluate([...Array<ConformityOutcome>(5).fill("does not conform"), "conforms"]);
    expect(outcome).toMatchObject({ status: "not met in any cycle", specimenOutcome: "does not conform", cyclesRun: 6 });
    expect(finding.outcome).toBe("deviates");
  });

  it("cannot tell whether to go on when a cycle is not decided", () => {
    const { outcome, finding } = evaluate(["not decided"]);
    expect(outcome).toMatchObject({ status: "not decided", specimenOutcome: "not decided" });
    expect(finding.outcome).toBe("not assessable");
    expect(evaluate([], 0).outcome.status).toBe("not decided");
  });
});
