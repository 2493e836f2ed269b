import { describe, expect, it } from "vitest";
import {
  evaluateRun,
  listFindings,
  parseStoredEvaluation,
  summariseEnduranceCycles,
  toStoredEvaluation,
  type RunEvaluation,
  type RunEvaluationInput,
} from "@/lib/conformance";
import { enduranceInCyclesTemplate, type CycleBlockStep, type Procedure } from "@/protocols";
import { buildEnduranceRun } from "@/scenarios/endurance-run";

function evaluate(input: RunEvaluationInput): RunEvaluation {
  const result = evaluateRun(input);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.evaluation;
}

/** The template with its cycle block changed. */
function withBlock(change: Partial<CycleBlockStep>): Procedure {
  return {
    ...enduranceInCyclesTemplate,
    steps: enduranceInCyclesTemplate.steps.map((step) => (step.kind === "cycle-block" ? { ...step, ...change } : step)),
  };
}

describe("endurance in cycles, evaluated from the whole log", () => {
  it("finds each cycle's discharge capacity in a 60-cycle log of the 400-cycle template, and leaves the acceptance open", () => {
    const run = buildEnduranceRun({ cycles: 60, fadeMahPerCycle: 12 });
    const evaluation = evaluate(run.input);
    const endurance = evaluation.endurance!;
    expect(endurance.cycles).toHaveLength(60);
    // The generator's own capacities: 2 950 mAh − 12 mAh per cycle, +60 mAh on the check at 0.2 It (cycle 50).
    endurance.cycles.forEach((cycle, k) => expect((cycle.dischargeCapacityAh ?? 0) * 1000).toBeCloseTo(run.log.dischargeMah[k] as number, 6));
    expect(endurance.cycles[0]?.dischargeCapacityAh).toBeCloseTo(2.95, 6);
    expect(endurance.cycles[49]).toMatchObject({ cycle: 50, capacityCheck: true });
    // The log holds whole 60 s samples: 2 950 − 588 + 60 = 2 422 mAh at 0.6 A is 242 samples of 10 mAh, 2 420 mAh.
    expect(run.log.dischargeMah[49]).toBeCloseTo(2420, 9);
    expect(endurance.cycles[49]?.percentOfRated).toBeCloseTo((2420 / 3000) * 100, 6);
    expect(endurance.cycles[48]?.capacityCheck).toBe(false);
    expect(endurance).toMatchObject({ status: "in progress", cyclesLogged: 60, maxCycles: 400, checkEveryCycles: 50 });
    expect(endurance.stop).toMatchObject({ met: false, cycle: null });
    expect(endurance.acceptance.outcome).toBe("not decided");
    expect(endurance.acceptance.statement).toContain("the log shows 60 of 400 cycles");
    expect(endurance.acceptance.statement).toContain("Decision rule: simple acceptance");
    // The block is one step on the step sheet: found in the log, no unexplained phases left over.
    const block = evaluation.steps.find((step) => step.stepId === "cycles")!;
    expect(block.findings.find((finding) => finding.id.endsWith("/log-phase-found"))?.outcome).toBe("meets");
    expect(block.findings.find((finding) => finding.id.endsWith("/charge-voltage-within-limit"))?.outcome).toBe("meets");
    expect(listFindings(evaluation).find((finding) => finding.rule === "no-unexplained-log-phase")?.outcome).toBe("meets");
    expect(evaluation.verdict.specimenConforms).toBe("not decided");
  });

  it("stops at the first capacity check below the stop share (not at a cycle between checks) and states the cell does not conform", () => {
    const procedure = withBlock({ maxCycles: 100, capacityCheck: { everyCycles: 10, current: { multipleOfIt: 0.2 } } });
    const run = buildEnduranceRun({ procedure, cycles: 75, fadeMahPerCycle: 20 });
    const endurance = evaluate(run.input).endurance!;
    // Check cycles: 60 → 2 950 − 1 180 + 60 = 1 830 mAh (61.0 %), 70 → 1 630 mAh (54.3 %) < 60 % of 3 000 mAh.
    // Cycle 61 (1 750 mAh at 0.5 It) is below 1 800 mAh but is no capacity check.
    expect(endurance.stop).toMatchObject({ met: true, cycle: 70 });
    expect(endurance.stop.statement).toBe("Met at cycle 70: 1 630 mAh is 54.3 % of the rated capacity, below 60 % (1 800 mAh).");
    expect(endurance.status).toBe("stopped");
    expect(endurance.acceptance).toMatchObject({ outcome: "does not conform", cycle: 70 });
    expect(endurance.acceptance.statement).toContain("Decision rule: simple acceptance");
    expect(endurance.acceptance.clause).toContain("ISO/IEC 17025:2017 7.8.6");
    expect(endurance.acceptance.clause).toContain("IEC 61960-3:2017 7.6");
  });

  it("accepts after the last cycle at or above the acceptance share, and every cycle counts without separate checks", () => {
    const { capacityCheck: _dropped, ...block } = enduranceInCyclesTemplate.steps[1] as CycleBlockStep;
    void _dropped;
    const procedure = { ...enduranceInCyclesTemplate, steps: [enduranceInCyclesTemplate.steps[0]!, { ...block, maxCycles: 30 }] };
    const run = buildEnduranceRun({ procedure, cycles: 30, fadeMahPerCycle: 5 });
    const evaluation = evaluate(run.input);
    const endurance = evaluation.endurance!;
    expect(endurance.checkEveryCycles).toBeNull();
    expect(endurance.cycles.every((cycle) => cycle.capacityCheck)).toBe(true);
    expect(endurance).toMatchObject({ status: "completed", cyclesLogged: 30 });
    expect(endurance.acceptance).toMatchObject({ outcome: "conforms", cycle: 30 });
    // 2 950 − 145 = 2 805 mAh at 1.5 A, in whole 60 s samples of 25 mAh: 2 800 mAh.
    expect(endurance.acceptance.measuredAh).toBeCloseTo(2.8, 9);
    expect(evaluation.conformity).toEqual([]);
    expect(evaluation.verdict.reasons.join(" ")).toContain('capacity after the cycles of "Endurance cycles"');
  });

  it("leaves a guard-band rule undecided, saying the cycle's uncertainty is not evaluated", () => {
    const procedure = { ...withBlock({ maxCycles: 20, capacityCheck: { everyCycles: 10, current: { multipleOfIt: 0.2 } } }), decisionRule: "binary guard band" as const };
    const endurance = evaluate(buildEnduranceRun({ procedure, cycles: 20 }).input).endurance!;
    expect(endurance.acceptance.outcome).toBe("not decided");
    expect(endurance.acceptance.statement).toContain("expanded uncertainty of cycle 20");
  });

  it("is kept when the evaluation is stored and read back", () => {
    const evaluation = evaluate(buildEnduranceRun({ cycles: 12 }).input);
    const stored = JSON.parse(JSON.stringify(toStoredEvaluation(evaluation)));
    const read = parseStoredEvaluation(stored);
    expect(read.endurance).toEqual(evaluation.endurance);
  });

  it("summarises the cycles as the first, every K-th, the stop cycle and the last", () => {
    const cycles = Array.from({ length: 23 }, (_, k) => ({ cycle: k + 1, capacityCheck: false, chargeCapacityAh: null, dischargeCapacityAh: 1, percentOfRated: 50 }));
    expect(summariseEnduranceCycles({ cycles, checkEveryCycles: null, stop: { met: true, cycle: 17, statement: "" } }).map((c) => c.cycle)).toEqual([1, 10, 17, 20, 23]);
    expect(summariseEnduranceCycles({ cycles, checkEveryCycles: 5, stop: { met: false, cycle: null, statement: "" } }).map((c) => c.cycle)).toEqual([1, 5, 10, 15, 20, 23]);
  });
});
