import { describe, expect, it } from "vitest";
import { evaluateRun, listFindings, readCellRating, type Finding, type StepRecordInput } from "@/lib/conformance";
import { resolveProcedure, type CellSpecification, type Procedure } from "@/protocols";
import { inventedCell } from "@/scenarios/rated-capacity-run";

/** A small procedure: rest of at least 1 h, then a discharge at 0.2 It, at an ambient of 20–25 °C. */
const procedure: Procedure = {
  header: {
    title: "Practice checks",
    code: "TEST-PRACTICE",
    scope: "Checks of the conformance rules against the trade's common practice.",
    standard: "common practice",
    clause: "docs/references.md §12",
    ambient: { minC: 20, maxC: 25 },
  },
  steps: [
    { kind: "rest", id: "rest", label: "Rest", minDuration: { value: 1, unit: "h" } },
    { kind: "discharge", id: "discharge", label: "Discharge at 0.2 It", purpose: "measure", current: { multipleOfIt: 0.2 }, endVoltage: { spec: "endOfDischargeVoltage" } },
  ],
  acceptance: [],
};

function findingsOf({ cell = inventedCell, records }: { cell?: CellSpecification; records: StepRecordInput[] }): Finding[] {
  const resolved = resolveProcedure({ procedure, cellSpecification: cell });
  if (!resolved.ok) throw new Error("the practice procedure must resolve");
  const result = evaluateRun({ resolution: resolved.resolution, cellRating: readCellRating(cell), stepRecords: records });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return listFindings(result.evaluation);
}

function findingOf(findings: Finding[], id: string): Finding {
  const finding = findings.find((candidate) => candidate.id === id);
  if (!finding) throw new Error(`no finding ${id}`);
  return finding;
}

const rest = (minutes: number, celsius = 22): StepRecordInput => ({
  stepId: "rest",
  completed: true,
  startedAt: "2026-03-02T08:00:00Z",
  endedAt: new Date(Date.parse("2026-03-02T08:00:00Z") + minutes * 60_000).toISOString(),
  ambientReadings: [{ at: "2026-03-02T08:00:00Z", celsius }],
});
const discharge = (currentA: number): StepRecordInput => ({ stepId: "discharge", completed: true, programmed: { current: currentA, endVoltage: 2.5 } });

describe("conformance against common practice (docs/references.md §1, §12)", () => {
  it.each([
    [3000, 0.6],
    [2500, 0.5],
    [2000, 0.4],
    [5000, 1.0],
  ])("0.2 It of a %s mAh cell is %s A, and the programmed discharge is judged against it", (ratedCapacityMah, amperes) => {
    // common practice: the capacity discharge runs at 0.2 It; It = Cn / 1 h from IEC 61434 [published] (docs/references.md §1 table).
    const cell = { ...inventedCell, ratedCapacityMah, minimumCapacityMah: ratedCapacityMah * 0.95 };
    const on = findingOf(findingsOf({ cell, records: [rest(60), discharge(amperes)] }), "discharge#1/set-point-matches/current");
    expect(on.expected.value).toBeCloseTo(amperes, 12);
    expect(on.outcome).toBe("meets");
    const off = findingOf(findingsOf({ cell, records: [rest(60), discharge(amperes * 1.05)] }), "discharge#1/set-point-matches/current");
    expect(off.outcome).toBe("deviates");
  });

  it("a discharge above the datasheet's maximum continuous current gets a caution finding", () => {
    // common practice (docs/references.md §12): above the maximum continuous current only with acknowledgement, and marked so.
    const cell = { ...inventedCell, maxContinuousDischargeCurrentA: 0.5 };
    const finding = findingOf(findingsOf({ cell, records: [rest(60), discharge(0.6)] }), "discharge#1/current-within-rating/current");
    expect(finding).toMatchObject({ severity: "caution", outcome: "deviates", beyondRating: true });
    const within = findingOf(findingsOf({ records: [rest(60), discharge(0.6)] }), "discharge#1/current-within-rating/current");
    expect(within.outcome).toBe("meets");
  });

  it("a rest shorter than 1 h deviates", () => {
    // common practice (docs/references.md §12): rest at least 1 h after charge; the 1 h is the procedure's parameter.
    expect(findingOf(findingsOf({ records: [rest(59), discharge(0.6)] }), "rest#1/duration-within-limits").outcome).toBe("deviates");
    expect(findingOf(findingsOf({ records: [rest(60), discharge(0.6)] }), "rest#1/duration-within-limits").outcome).toBe("meets");
  });

  it.each([
    [19.5, "deviates"],
    [20, "meets"],
    [22.5, "meets"],
    [25, "meets"],
    [25.5, "deviates"],
  ])("an ambient reading of %s °C against 20–25 °C %s", (celsius, outcome) => {
    // common practice (docs/references.md §12): ambient 20–25 °C; the range is the procedure's parameter.
    expect(findingOf(findingsOf({ records: [rest(60, celsius), discharge(0.6)] }), "rest#1/ambient-in-range").outcome).toBe(outcome);
  });
});
