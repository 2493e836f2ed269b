import { describe, expect, it } from "vitest";
import { evaluateRun, listFindings, type Finding, type RunEvaluation, type RunEvaluationInput } from "@/lib/conformance";
import { ratedCapacityAt20cTemplate, type Procedure } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, resolveOrThrow } from "@/scenarios/rated-capacity-run";

function evaluate(input: RunEvaluationInput): RunEvaluation {
  const result = evaluateRun(input);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.evaluation;
}

function findingOf(evaluation: RunEvaluation, id: string): Finding {
  const finding = listFindings(evaluation).find((candidate) => candidate.id === id);
  if (!finding) throw new Error(`no finding ${id}; have ${listFindings(evaluation).map((f) => f.id).join(", ")}`);
  return finding;
}

const outcomesOf = (evaluation: RunEvaluation, outcome: Finding["outcome"]) =>
  listFindings(evaluation)
    .filter((finding) => finding.outcome === outcome)
    .map((finding) => finding.id);

describe("evaluateRun on a rated-capacity run (IEC 61960-3 7.3.1 template, invented 3 000 mAh cell)", () => {
  const nominal = buildRatedCapacityRun();
  const evaluation = evaluate(nominal.input);

  it("finds every check met and the capacity conforming", () => {
    expect(outcomesOf(evaluation, "deviates")).toEqual([]);
    expect(outcomesOf(evaluation, "not assessable")).toEqual([]);
    expect(evaluation.verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "conforms", beyondRating: false });
    expect(evaluation.conformity).toEqual([expect.objectContaining({ criterionId: "rated-capacity", outcome: "conforms", cycle: 1 })]);
    expect(evaluation.repeat).toMatchObject({ status: "met", metInCycle: 1, cyclesRun: 1 });
  });

  it("checks each step with the rules that apply to it", () => {
    const rulesOf = (stepId: string) => evaluation.steps.find((step) => step.stepId === stepId)?.findings.map((f) => f.id.split("/").slice(1).join("/"));
    expect(rulesOf("rest")).toEqual([
      "step-recorded",
      "in-order-without-gap",
      "log-phase-found",
      "record-matches-log",
      "ambient-in-range",
      "duration-within-limits",
      "rest-window-within-limit",
      "set-point-matches/duration",
    ]);
    expect(rulesOf("charge")).toEqual([
      "step-recorded",
      "in-order-without-gap",
      "log-phase-found",
      "record-matches-log",
      "ambient-in-range",
      "set-point-matches/current",
      "set-point-matches/voltage",
      "set-point-matches/terminationCurrent",
      "current-held/current",
      "termination-reached",
      "charge-voltage-within-limit",
      "current-within-rating/current",
    ]);
    expect(evaluation.runFindings.map((f) => f.rule)).toEqual(["procedure-resolved", "records-fit-procedure", "no-unexplained-log-phase", "repeat-rule-followed"]);
  });

  it("matches each step to its log phase and reports the step results", () => {
    expect(evaluation.steps.map((step) => [step.stepId, step.logPhase?.kind])).toEqual([
      ["precondition", "discharge"],
      ["charge", "charge"],
      ["rest", "rest"],
      ["discharge", "discharge"],
    ]);
    const discharge = evaluation.steps[3];
    // 0.2 It of 3 000 mAh is 0.6 A (IEC 61434, docs/references.md §1); the log held it.
    expect(discharge?.results?.constantCurrent?.meanA).toBeCloseTo(0.6, 3);
    expect(findingOf(evaluation, "discharge#1/set-point-matches/current").expected).toMatchObject({ value: 0.6 });
    expect(discharge?.results?.capacityAh).toBeGreaterThan(3);
    expect(evaluation.acceptance[0]?.measured?.value).toBe(discharge?.results?.capacityAh);
    expect(discharge?.results?.meanVoltageV).toBeGreaterThan(3.5);
  });

  it("cites the procedure's clause and the tolerance clause", () => {
    expect(findingOf(evaluation, "discharge#1/set-point-matches/current").clause).toBe(
      "IEC 61960-3:2017 7.2, 7.3.1 (discharge current, as set in the procedure); IEC 61960-3 clause 4 (tolerances)",
    );
  });

  it("is deterministic: the same input gives the same output", () => {
    expect(JSON.stringify(evaluate(nominal.input))).toBe(JSON.stringify(evaluation));
  });
});

describe("evaluateRun variants", () => {
  it("a rest of 50 min deviates; the specimen's statement stands apart", () => {
    const evaluation = evaluate(buildRatedCapacityRun({ restS: 3000 }).input);
    expect(findingOf(evaluation, "rest#1/duration-within-limits")).toMatchObject({ outcome: "deviates" });
    expect(findingOf(evaluation, "rest#1/duration-within-limits").observed.value).toBeCloseTo(3000, -1);
    expect(outcomesOf(evaluation, "deviates")).toEqual(["rest#1/duration-within-limits", "rest#1/set-point-matches/duration"]);
    expect(evaluation.verdict).toMatchObject({ procedureFollowed: "no", specimenConforms: "conforms" });
  });

  it("one ambient reading at 27 °C deviates", () => {
    const run = buildRatedCapacityRun({ ambient: (stepId) => (stepId === "rest" ? [22, 27, 23] : [22.5]) });
    const evaluation = evaluate(run.input);
    expect(outcomesOf(evaluation, "deviates")).toEqual(["rest#1/ambient-in-range"]);
    expect(findingOf(evaluation, "rest#1/ambient-in-range").observed).toMatchObject({ max: 27 });
  });

  describe("a discharge at 1.2 × the cell's maximum continuous current", () => {
    // An invented cell whose datasheet allows 0.5 A continuous: 0.2 It = 0.6 A is 1.2 × that.
    const lowRateCell = { ...inventedCell, maxContinuousDischargeCurrentA: 0.5 };

    it("without acknowledgement is a caution finding that deviates", () => {
      const evaluation = evaluate(buildRatedCapacityRun({ cell: lowRateCell }).input);
      expect(findingOf(evaluation, "discharge#1/current-within-rating/current")).toMatchObject({
        outcome: "deviates",
        severity: "caution",
        beyondRating: true,
      });
      expect(evaluation.verdict).toMatchObject({ procedureFollowed: "no", beyondRating: true });
    });

    it("with acknowledgement meets, but the run is marked beyond the rating", () => {
      const codes = ["discharge-current-above-rating/precondition/current", "discharge-current-above-rating/discharge/current"];
      const onVersion = resolveOrThrow({ cell: lowRateCell, acknowledgedCautions: codes });
      expect(onVersion.ready).toBe(true);
      const evaluation = evaluate(buildRatedCapacityRun({ cell: lowRateCell, resolution: onVersion }).input);
      const finding = findingOf(evaluation, "discharge#1/current-within-rating/current");
      expect(finding).toMatchObject({ outcome: "meets", severity: "caution", beyondRating: true });
      expect(finding.note).toContain("Outside the cell's rating with acknowledgement");
      expect(evaluation.verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "conforms", beyondRating: true });
      expect(evaluation.verdict.reasons.at(-1)).toContain("Outside the cell's rating");

      // The operator's acknowledgement on the step record serves as well.
      const run = buildRatedCapacityRun({ cell: lowRateCell });
      const records = run.input.stepRecords.map((record) =>
        record.stepId === "discharge" ? { ...record, acknowledgedCautionCodes: ["discharge-current-above-rating/discharge/current"] } : record,
      );
      const byOperator = evaluate({ ...run.input, stepRecords: records });
      expect(findingOf(byOperator, "discharge#1/current-within-rating/current")).toMatchObject({ outcome: "meets", beyondRating: true });
      expect(findingOf(byOperator, "precondition#1/current-within-rating/current").outcome).toBe("deviates");
    });
  });

  it("a discharge stopped before the end voltage deviates, and leaves the capacity undecided", () => {
    const evaluation = evaluate(buildRatedCapacityRun({ stopDischargeAfterS: 3 * 3600 }).input);
    expect(outcomesOf(evaluation, "deviates")).toEqual(["discharge#1/end-voltage-reached"]);
    // Cycle 1 is not decided, so whether the block should have gone on cannot be told.
    expect(findingOf(evaluation, "run/repeat-rule-followed").outcome).toBe("not assessable");
    expect(findingOf(evaluation, "discharge#1/end-voltage-reached").observed.text).toContain("stopped before the end voltage");
    expect(evaluation.acceptance[0]).toMatchObject({ outcome: "not decided" });
    expect(evaluation.verdict).toMatchObject({ procedureFollowed: "no", specimenConforms: "not decided" });
  });

  it("a capacity below rated in all five cycles does not conform", () => {
    const evaluation = evaluate(buildRatedCapacityRun({ cellModel: { capacityMAh: 2600 }, cycles: 5, restS: 3700 }).input);
    expect(outcomesOf(evaluation, "deviates")).toEqual([]);
    expect(evaluation.acceptance.map((result) => result.outcome)).toEqual(Array(5).fill("does not conform"));
    expect(evaluation.repeat).toMatchObject({ status: "not met in any cycle", cyclesRun: 5, decisiveCycle: 5 });
    expect(evaluation.verdict).toMatchObject({ procedureFollowed: "yes", specimenConforms: "does not conform" });
    expect(evaluation.steps).toHaveLength(16);
  });

  it("without a log, the checks that need it are not assessable, with the reason, and nothing is decided", () => {
    const withoutLog: RunEvaluationInput = { ...buildRatedCapacityRun().input };
    delete withoutLog.log;
    const evaluation = evaluate(withoutLog);
    expect(evaluation.log).toEqual({ status: "no log", reason: "no data log was uploaded" });
    const open = listFindings(evaluation).filter((finding) => finding.outcome === "not assessable");
    expect(open.map((finding) => finding.id)).toContain("discharge#1/end-voltage-reached");
    expect(open.map((finding) => finding.id)).toContain("charge#1/current-held/current");
    expect(open.every((finding) => finding.observed.text.length > 0)).toBe(true);
    expect(outcomesOf(evaluation, "deviates")).toEqual([]);
    // What the records alone show is still judged: the rest's duration from its recorded times.
    expect(findingOf(evaluation, "rest#1/duration-within-limits").outcome).toBe("meets");
    expect(evaluation.verdict).toMatchObject({ procedureFollowed: "not decided", specimenConforms: "not decided" });
    expect(evaluation.steps.every((step) => step.results === null && step.logNote === "no data log was uploaded")).toBe(true);
  });

  it("re-evaluates a stored run against a newer procedure version, and says so", () => {
    const run = buildRatedCapacityRun();
    const newer: Procedure = {
      ...ratedCapacityAt20cTemplate,
      steps: ratedCapacityAt20cTemplate.steps.map((step) => (step.kind === "rest" ? { ...step, minDuration: { value: 3, unit: "h" } } : step)),
    };
    const evaluation = evaluate({
      ...run.input,
      resolution: resolveOrThrow({ procedure: newer }),
      evaluatedAgainst: { procedureVersionId: "rc20-v3", runProcedureVersionId: "rc20-v2", note: "rest lengthened" },
    });
    expect(evaluation.evaluatedAgainst).toEqual({ procedureVersionId: "rc20-v3", runProcedureVersionId: "rc20-v2", note: "rest lengthened", otherThanRunVersion: true });
    expect(evaluation.verdict.reasons[0]).toBe("Re-evaluated against procedure version rc20-v3, not version rc20-v2 that the run followed (rest lengthened).");
    expect(findingOf(evaluation, "rest#1/duration-within-limits").outcome).toBe("deviates");
    const same = evaluate({ ...run.input, evaluatedAgainst: { procedureVersionId: "rc20-v2", runProcedureVersionId: "rc20-v2" } });
    expect(same.evaluatedAgainst.otherThanRunVersion).toBe(false);
  });

  it("flags a record for a step the procedure does not have, and a missing record", () => {
    const run = buildRatedCapacityRun();
    const records = [...run.input.stepRecords.filter((record) => record.stepId !== "rest"), { stepId: "soak", completed: true }];
    const evaluation = evaluate({ ...run.input, stepRecords: records });
    expect(findingOf(evaluation, "run/records-fit-procedure").outcome).toBe("deviates");
    expect(findingOf(evaluation, "rest#1/step-recorded")).toMatchObject({ outcome: "deviates", observed: { text: "no step record" } });
  });

  it("refuses bad input with field paths instead of throwing", () => {
    const result = evaluateRun({ ...buildRatedCapacityRun().input, logStartedAt: "yesterday" });
    expect(result.ok).toBe(false);
    expect(result.ok || result.problems.map((problem) => problem.path)).toEqual(["logStartedAt"]);
  });
});
