import { describe, expect, it } from "vitest";
import {
  enduranceInCyclesTemplate,
  readEnduranceLimits,
  resolveProcedure,
  validateProcedure,
  type CycleBlockStep,
  type Procedure,
} from "@/protocols";
import { inventedCell, prismaticLcoCell } from "@/scenarios/invented-cells";

const template = enduranceInCyclesTemplate;
const templateBlock = template.steps[1] as CycleBlockStep;

function withBlock(change: Record<string, unknown>): Procedure {
  return { ...template, steps: [template.steps[0]!, { ...templateBlock, ...change } as CycleBlockStep] };
}

function problemsOf(procedure: unknown) {
  const result = validateProcedure(procedure);
  return result.ok ? [] : result.problems;
}

describe("a cycle-block step", () => {
  it("is refused in plain words when its numbers do not fit together", () => {
    expect(problemsOf(withBlock({ maxCycles: 120 }))).toEqual([
      { path: "steps.1.maxCycles", message: "the number of cycles (120) must be a multiple of the capacity-check interval (50), so that the last cycle is a capacity check" },
    ]);
    expect(problemsOf(withBlock({ maxCycles: 30 }))).toEqual([
      { path: "steps.1.capacityCheck.everyCycles", message: "a capacity check every 50 cycles never comes within 30 cycles" },
    ]);
    expect(problemsOf(withBlock({ stopBelowPercentOfRated: 70 }))).toEqual([
      {
        path: "steps.1.stopBelowPercentOfRated",
        message: "the stop share (70 %) is above the acceptance share (60 %): the test would stop a cell that still meets the acceptance criterion",
      },
    ]);
    expect(problemsOf(withBlock({ maxCycles: 12.5 }))).toEqual([{ path: "steps.1.maxCycles", message: "the number of cycles is a whole number of cycles" }]);
    expect(problemsOf(withBlock({ acceptAtLeastPercentOfRated: 0 }))).toEqual([
      { path: "steps.1.acceptAtLeastPercentOfRated", message: "the acceptance share of the rated capacity must be above 0 %" },
    ]);
    expect(problemsOf(withBlock({ restAfterCharge: { minDuration: { value: 2, unit: "h" }, maxDuration: { value: 30, unit: "min" } } }))).toEqual([
      { path: "steps.1.restAfterCharge.maxDuration", message: "the longest rest after charge (30 min) is shorter than the shortest (2 h)" },
    ]);
    expect(
      problemsOf(withBlock({ charge: { ...templateBlock.charge, current: { multipleOfIt: 0.02 }, termination: { kind: "current", current: { multipleOfIt: 0.02 } } } })),
    ).toEqual([{ path: "steps.1.charge.termination.current", message: "the termination current must be below the charge current" }]);
  });

  it("is refused inside a repeat rule, and a second block is refused", () => {
    const repeated = { ...template, repeat: { label: "again", stepIds: ["cycles"], maxCycles: 2, stopWhenMet: "x" }, acceptance: [] };
    expect(problemsOf(repeated).map((problem) => problem.message)).toContain('the cycle block "cycles" repeats itself; leave it out of the repeated block');
    const twice = { ...template, steps: [...template.steps, { ...templateBlock, id: "more" }] };
    expect(problemsOf(twice)).toContainEqual({ path: "steps.2.kind", message: "a procedure has at most one cycle block" });
  });

  it("resolves to currents, voltages and limits for a cell, and names the part of the cycle a missing value belongs to", () => {
    const result = resolveProcedure({ procedure: template, cellSpecification: inventedCell });
    if (!result.ok) throw new Error("resolves");
    expect(result.resolution.errors).toEqual([]);
    expect(readEnduranceLimits(result.resolution)).toEqual({
      stepId: "cycles",
      maxCycles: 400,
      checkEveryCycles: 50,
      stopBelowPercentOfRated: 60,
      acceptAtLeastPercentOfRated: 60,
      ratedCapacityMAh: 3000,
    });
    // The prismatic cell states no termination current.
    const prismatic = resolveProcedure({ procedure: template, cellSpecification: prismaticLcoCell });
    if (!prismatic.ok) throw new Error("resolves");
    expect(prismatic.resolution.errors.map((error) => [error.path, error.code])).toEqual([
      ["steps.1.charge.termination.current", "specification-value-missing/cycles/charge.termination.current"],
    ]);
    expect(prismatic.resolution.errors[0]?.message).toMatch(/^Step 2 "Endurance cycles" \(charge of each cycle\): /);
  });

  it("asks for an acknowledgement when the cycle's discharge is above the cell's rating", () => {
    const result = resolveProcedure({ procedure: withBlock({ discharge: { current: { multipleOfIt: 6 }, endVoltage: { spec: "endOfDischargeVoltage" } } }), cellSpecification: inventedCell });
    expect(result.ok && result.resolution.cautionsNeedingAcknowledgement).toEqual(["discharge-current-above-rating/cycles/discharge.current"]);
  });

  it("gives no endurance limits to a procedure without a block", () => {
    const result = resolveProcedure({ procedure: { ...template, steps: [template.steps[0]!] }, cellSpecification: inventedCell });
    expect(result.ok && readEnduranceLimits(result.resolution)).toBeNull();
  });
});
