import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaluateRun, type Finding, type FindingOutcome, type RunEvaluation } from "@/lib/conformance";
import { addCounts, describeCounts, groupFindings } from "@/lib/runs/group-findings";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";

const finding = (id: string, outcome: FindingOutcome, extra: Partial<Finding> = {}): Finding => ({
  id,
  stepId: null,
  cycle: null,
  rule: "step-recorded",
  title: `check ${id}`,
  expected: { text: "recorded" },
  observed: { text: outcome === "meets" ? "recorded" : "missing" },
  outcome,
  clause: "procedure",
  ...extra,
});

type Steps = Pick<RunEvaluation, "steps">["steps"];
const stepOf = (stepId: string, cycle: number, label: string, findings: Finding[]) => ({ stepId, cycle, label, findings }) as unknown as Steps[number];

describe("findings grouped by step", () => {
  it("puts the run as a whole first, then steps in run order, cycles named, steps without findings left out", () => {
    const groups = groupFindings({
      runFindings: [finding("run/a", "meets")],
      steps: [
        stepOf("charge", 1, "Charge", [finding("charge#1/a", "meets"), finding("charge#1/b", "meets")]),
        stepOf("rest", 1, "Rest", []),
        stepOf("discharge", 2, "Discharge", [finding("discharge#2/a", "deviates")]),
      ],
    });
    expect(groups.map((g) => [g.key, g.label])).toEqual([
      ["run", "The run as a whole"],
      ["charge#1", "Charge"],
      ["discharge#2", "Discharge (cycle 2)"],
    ]);
    expect(groups[1]?.counts).toEqual({ meets: 2, deviates: 0, "not assessable": 0 });
  });

  it("opens a group for a deviation, a check that could not be made or a step beyond the rating, and only then", () => {
    const groups = groupFindings({
      runFindings: [],
      steps: [
        stepOf("a", 1, "A", [finding("a", "meets")]),
        stepOf("b", 1, "B", [finding("b", "deviates")]),
        stepOf("c", 1, "C", [finding("c", "not assessable")]),
        stepOf("d", 1, "D", [finding("d", "meets", { beyondRating: true })]),
      ],
    });
    expect(groups.map((g) => g.needsAttention)).toEqual([false, true, true, true]);
    expect(groups[3]?.findings[0]).toMatchObject({ beyondRating: true, outcome: "meets" });
  });

  it("keeps words only: expected and observed texts, the safety mark", () => {
    const [group] = groupFindings({ runFindings: [finding("run/s", "meets", { severity: "caution", expected: { text: "≤ 4.2 V", value: 4.2, unit: "V" } })], steps: [] });
    expect(group?.findings[0]).toEqual({ id: "run/s", title: "check run/s", outcome: "meets", safety: true, beyondRating: false, expected: "≤ 4.2 V", observed: "recorded", clause: "procedure" });
  });

  it("loses no finding and counts none twice (property)", () => {
    const outcome = fc.constantFrom<FindingOutcome>("meets", "deviates", "not assessable");
    fc.assert(
      fc.property(fc.array(outcome, { maxLength: 5 }), fc.array(fc.array(outcome, { maxLength: 6 }), { maxLength: 8 }), (runOutcomes, stepOutcomes) => {
        const runFindings = runOutcomes.map((o, k) => finding(`run/${k}`, o));
        const steps = stepOutcomes.map((os, s) => stepOf(`s${s}`, 1, `Step ${s}`, os.map((o, k) => finding(`s${s}/${k}`, o))));
        const groups = groupFindings({ runFindings, steps });
        const ids = groups.flatMap((g) => g.findings.map((f) => f.id));
        expect(ids).toEqual([...runFindings, ...steps.flatMap((s) => s.findings)].map((f) => f.id));
        const all = addCounts(groups);
        expect(all.meets + all.deviates + all["not assessable"]).toBe(ids.length);
      }),
    );
  });

  it("groups a real evaluation: every finding of every step, in the order evaluateRun gave them", () => {
    const result = evaluateRun(buildRatedCapacityRun({ sampleIntervalS: 10 }).input);
    if (!result.ok) throw new Error("the built run should evaluate");
    const groups = groupFindings(result.evaluation);
    expect(groups.flatMap((g) => g.findings.map((f) => f.id))).toEqual([...result.evaluation.runFindings, ...result.evaluation.steps.flatMap((s) => s.findings)].map((f) => f.id));
    expect(groups.length).toBeGreaterThan(1);
  });
});

describe("count words", () => {
  it("says how many checks met, deviated or could not be assessed, leaving out what is zero", () => {
    expect(describeCounts({ meets: 13, deviates: 1, "not assessable": 0 })).toBe("14 checks: 13 meet, 1 deviates");
    expect(describeCounts({ meets: 1, deviates: 0, "not assessable": 2 })).toBe("3 checks: 1 meets, 2 not assessable");
    expect(describeCounts({ meets: 0, deviates: 2, "not assessable": 0 })).toBe("2 checks: 2 deviate");
  });
});
