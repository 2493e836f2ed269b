import { describe, expect, it } from "vitest";
import { planRunSequence } from "@/lib/conformance";
import { recordOf } from "./context-fixtures";
import { resolveOrThrow } from "@/scenarios/rated-capacity-run";

const resolution = resolveOrThrow({});
const planOf = (records: Parameters<typeof recordOf>[0][]) => planRunSequence({ resolution, stepRecords: records.map(recordOf) });
const order = (plan: ReturnType<typeof planOf>) => plan.planned.map((entry) => `${entry.step.id}#${entry.cycle}`);

describe("planRunSequence", () => {
  it("lays out the procedure once when the records show one cycle", () => {
    const plan = planOf([{ stepId: "precondition" }, { stepId: "charge" }]);
    expect(order(plan)).toEqual(["precondition#1", "charge#1", "rest#1", "discharge#1"]);
    expect(plan.cyclesRun).toBe(1);
    expect(plan.planned.map((entry) => entry.record !== null)).toEqual([true, true, false, false]);
    expect(plan.planned.map((entry) => entry.inRepeatBlock)).toEqual([false, true, true, true]);
  });

  it("repeats the block up to the highest cycle recorded, gaps included", () => {
    const plan = planOf([{ stepId: "discharge", cycle: 3 }, { stepId: "charge", cycle: 1 }]);
    expect(plan.cyclesRun).toBe(3);
    expect(order(plan)).toEqual([
      "precondition#1",
      "charge#1",
      "rest#1",
      "discharge#1",
      "charge#2",
      "rest#2",
      "discharge#2",
      "charge#3",
      "rest#3",
      "discharge#3",
    ]);
  });

  it("reports records that fit no planned step and uses the first of duplicates", () => {
    const plan = planOf([
      { stepId: "soak" },
      { stepId: "precondition", cycle: 2 },
      { stepId: "rest", notes: "first" },
      { stepId: "rest", notes: "second" },
    ]);
    expect(plan.recordProblems).toEqual([
      'Record 1 (step "soak", cycle 1): the procedure has no such step',
      'Record 2 (step "precondition", cycle 2): this step is not repeated, so it has only cycle 1',
      'Record 4 (step "rest", cycle 1): a record for this step and cycle came earlier; only the first is used',
    ]);
    expect(plan.planned.find((entry) => entry.step.id === "rest")?.record?.notes).toBe("first");
  });
});
