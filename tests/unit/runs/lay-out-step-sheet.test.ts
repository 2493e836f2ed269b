import { describe, expect, it } from "vitest";
import { layOutStepSheet } from "@/components/runs/step-sheet/lay-out-step-sheet";
import { stepRecordSchema, type StepRecordInput } from "@/lib/conformance";
import { ratedCapacityAt20cTemplate, type Procedure } from "@/protocols";
import { inventedCell, resolveOrThrow } from "@/scenarios/rated-capacity-run";

const resolution = resolveOrThrow({});
const record = (input: Partial<StepRecordInput> & { stepId: string }) => stepRecordSchema.parse({ completed: true, ...input });
const keys = (layout: ReturnType<typeof layOutStepSheet>) => layout.entries.map((e) => `${e.key}:${e.state}`);

describe("layOutStepSheet", () => {
  it("makes the first line current on a run with no records, the rest waiting", () => {
    const layout = layOutStepSheet({ resolution, stepRecords: [] });
    expect(keys(layout)).toEqual(["precondition#1:current", "charge#1:waiting", "rest#1:waiting", "discharge#1:waiting"]);
    expect(layout.entries.map((e) => e.line)).toEqual([1, 2, 3, 4]);
    expect(layout.allTicked).toBe(false);
    expect(layout.nextCycle).toBeNull();
  });

  it("moves the current line to the first unticked step, keeping an unticked record current", () => {
    const layout = layOutStepSheet({
      resolution,
      stepRecords: [record({ stepId: "precondition" }), record({ stepId: "charge", completed: false, notes: "started" })],
    });
    expect(keys(layout)).toEqual(["precondition#1:done", "charge#1:current", "rest#1:waiting", "discharge#1:waiting"]);
    expect(layout.entries[1]?.record?.notes).toBe("started");
  });

  it("keeps later lines waiting behind an unticked earlier one, even when they carry ticked records", () => {
    const layout = layOutStepSheet({ resolution, stepRecords: [record({ stepId: "rest" })] });
    expect(keys(layout)).toEqual(["precondition#1:current", "charge#1:waiting", "rest#1:done", "discharge#1:waiting"]);
  });

  it("offers the next cycle only once the last cycle shown is ticked, and lays out the cycle asked for", () => {
    const done = ["precondition", "charge", "rest", "discharge"].map((stepId) => record({ stepId }));
    const first = layOutStepSheet({ resolution, stepRecords: done });
    expect(first.allTicked).toBe(true);
    expect(first.nextCycle).toBe(2);

    const second = layOutStepSheet({ resolution, stepRecords: done, cyclesRequested: 2 });
    expect(second.cyclesShown).toBe(2);
    expect(keys(second).slice(4)).toEqual(["charge#2:current", "rest#2:waiting", "discharge#2:waiting"]);
    expect(second.entries.slice(4).every((e) => e.record === null && e.inRepeatBlock)).toBe(true);
    expect(second.allTicked).toBe(false);
    expect(second.nextCycle).toBeNull();
  });

  it("never shows fewer cycles than recorded nor more than the repeat rule allows", () => {
    const recorded = layOutStepSheet({ resolution, stepRecords: [record({ stepId: "charge", cycle: 3, completed: false })], cyclesRequested: 1 });
    expect(recorded.cyclesShown).toBe(3);
    const capped = layOutStepSheet({ resolution, stepRecords: [], cyclesRequested: 99 });
    expect(capped.cyclesShown).toBe(ratedCapacityAt20cTemplate.repeat?.maxCycles);
    expect(capped.entries).toHaveLength(1 + 3 * capped.cyclesShown);
  });

  it("shows one pass and never offers a cycle for a procedure without a repeat rule", () => {
    const single = resolveOrThrow({ procedure: { ...ratedCapacityAt20cTemplate, repeat: undefined } });
    const done = ["precondition", "charge", "rest", "discharge"].map((stepId) => record({ stepId }));
    const layout = layOutStepSheet({ resolution: single, stepRecords: done, cyclesRequested: 4 });
    expect(layout.cyclesShown).toBe(1);
    expect(layout.nextCycle).toBeNull();
    expect(layout.allTicked).toBe(true);
  });

  it("attaches each step's caution codes to its lines", () => {
    const strongCharge = { ...ratedCapacityAt20cTemplate, steps: ratedCapacityAt20cTemplate.steps.map((s) => (s.id === "charge" ? { ...s, current: { multipleOfIt: 5 } } : s)) } as Procedure;
    const flagged = resolveOrThrow({ procedure: strongCharge, cell: inventedCell, acknowledgedCautions: [] });
    const layout = layOutStepSheet({ resolution: flagged, stepRecords: [] });
    const charge = layout.entries.find((e) => e.key === "charge#1");
    expect(charge?.cautionCodes.length).toBeGreaterThan(0);
    expect(charge?.cautionCodes.every((code) => code.includes("/charge/"))).toBe(true);
    expect(layout.entries.find((e) => e.key === "rest#1")?.cautionCodes).toEqual([]);
  });
});
