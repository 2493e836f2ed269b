// Endurance in cycles, IEC 61960-3:2017 (endurance-in-cycles clause, number recalled as 7.6). The values
// below are held by the template TPL-END400 as parameters of its cycle block; each is marked as in
// docs/references.md §18: recalled (verify against the standard's text), one from a published trade
// summary, one common practice. It = Cn / 1 h (IEC 61434, published) turns the multiples into amperes.
import { describe, expect, it } from "vitest";
import { findProcedureTemplate, readEnduranceLimits, recalledMark, resolveProcedure, type CycleBlockStep } from "@/protocols";
import { inventedCell } from "@/scenarios/invented-cells";

function block(): CycleBlockStep {
  const step = findProcedureTemplate("endurance-in-cycles")?.procedure.steps.find((candidate) => candidate.kind === "cycle-block");
  if (step?.kind !== "cycle-block") throw new Error("TPL-END400 has a cycle block");
  return step;
}
const notes = () => findProcedureTemplate("endurance-in-cycles")?.procedure.header.notes ?? [];

describe("IEC 61960-3 endurance in cycles in the template TPL-END400", () => {
  it("cites the clause, with its number marked recalled", () => {
    const header = findProcedureTemplate("endurance-in-cycles")?.procedure.header;
    expect(header).toMatchObject({ standard: "IEC 61960-3:2017", clause: "7.6 (endurance in cycles)" });
    expect(notes()).toContain(`Clause number 7.6 for endurance in cycles: ${recalledMark}.`);
  });

  // Published in a trade summary of IEC 61960 (docs/references.md §2): 400 cycles for a cell.
  it("runs at most 400 cycles", () => {
    expect(block().maxCycles).toBe(400);
    expect(notes().some((note) => note.startsWith("400 cycles for a cell") && note.includes("published in a trade summary"))).toBe(true);
  });

  // Recalled, verify: discharge at 0.5 It A to the end-of-discharge voltage; rests of 0.5 h to 4 h.
  it("discharges each cycle at 0.5 It to the end-of-discharge voltage and rests 0.5 h to 4 h", () => {
    expect(block().discharge).toEqual({ current: { multipleOfIt: 0.5 }, endVoltage: { spec: "endOfDischargeVoltage" } });
    expect(block().restAfterCharge).toEqual({ minDuration: { value: 0.5, unit: "h" }, maxDuration: { value: 4, unit: "h" } });
    expect(block().restAfterDischarge).toEqual({ minDuration: { value: 0.5, unit: "h" }, maxDuration: { value: 4, unit: "h" } });
    expect(notes()).toContain(`Discharge of each cycle at 0.5 It A to the end-of-discharge voltage: ${recalledMark}.`);
    expect(notes()).toContain(`Rest of 0.5 h to 4 h after each charge and after each discharge: ${recalledMark}.`);
  });

  // Recalled, verify: a capacity check at 0.2 It A every 50 cycles.
  it("checks the capacity at 0.2 It every 50 cycles", () => {
    expect(block().capacityCheck).toEqual({ everyCycles: 50, current: { multipleOfIt: 0.2 } });
    expect(notes()).toContain(`Capacity check every 50 cycles: that cycle discharges at 0.2 It A: ${recalledMark}.`);
  });

  // Recalled, verify: stop below 60 % of rated; accepted with at least 60 % after the last cycle.
  it("stops below 60 % of the rated capacity and accepts at 60 % or more", () => {
    expect(block()).toMatchObject({ stopBelowPercentOfRated: 60, acceptAtLeastPercentOfRated: 60 });
    expect(notes()).toContain(`The test ends when a capacity check gives less than 60 % of the rated capacity: ${recalledMark}.`);
    expect(notes()).toContain(`Accepted when the capacity after the last cycle is at least 60 % of the rated capacity: ${recalledMark}.`);
  });

  // IEC 61434 (published): It = 3.0 A for 3 000 mAh, so 0.5 It = 1.5 A and 0.2 It = 0.6 A; 60 % of 3 000 mAh = 1 800 mAh.
  it("resolves on a 3 000 mAh cell to 1.5 A cycles, 0.6 A checks and a 1 800 mAh limit", () => {
    const result = resolveProcedure({ procedure: findProcedureTemplate("endurance-in-cycles")!.procedure, cellSpecification: inventedCell });
    if (!result.ok) throw new Error("the template resolves");
    const step = result.resolution.steps.find((candidate) => candidate.kind === "cycle-block");
    if (step?.kind !== "cycle-block") throw new Error("a resolved cycle block");
    expect(step.discharge.current?.value).toBeCloseTo(1.5, 12);
    expect(step.capacityCheck?.current?.value).toBeCloseTo(0.6, 12);
    const limits = readEnduranceLimits(result.resolution)!;
    expect((limits.acceptAtLeastPercentOfRated / 100) * limits.ratedCapacityMAh).toBeCloseTo(1800, 9);
  });
});
