import { describe, expect, it } from "vitest";
import { evaluateObservations, toObservationConformity, type ObservedValues } from "@/lib/conformance";
import { checkObservationSteps, describeMassLossBand, findMassLossBand, observationCriteriaSchema, type MassLossBand, type ResolvedObserveStep, type ResolvedStep } from "@/protocols";
import { steps as resolvedSteps } from "./context-fixtures";

const bands: MassLossBand[] = [
  { upToG: 1, upToIncluded: false, maxLossPercent: 0.5 },
  { upToG: 75, upToIncluded: true, maxLossPercent: 0.2 },
  { maxLossPercent: 0.1 },
];

const before: ResolvedObserveStep = { ...resolvedSteps.observe, id: "before", label: "Observation before", index: 0, records: ["mass", "openCircuitVoltage", "visual"] };
const after: ResolvedObserveStep = {
  ...resolvedSteps.observe,
  id: "after",
  label: "Observation after",
  index: 1,
  compareWith: "before",
  criteria: { massLoss: { bands }, openCircuitVoltage: { atLeastPercentOfBefore: 90 }, visual: ["leakage", "venting", "disassembly", "rupture", "fire"] },
};
const allNoneSeen = { noneSeen: ["leakage", "venting", "disassembly", "rupture", "fire"] as const };

function judge(b: ObservedValues | undefined, a: ObservedValues | undefined, steps: ResolvedStep[] = [before, after]) {
  const records = [
    ...(b ? [{ stepId: "before", cycle: 1, observed: b }] : []),
    ...(a ? [{ stepId: "after", cycle: 1, observed: a }] : []),
  ];
  const result = evaluateObservations(steps, records, "UN Manual of Tests and Criteria 38.3.4");
  if (!result) throw new Error("expected observations");
  const byKind = (kind: string) => result.criteria.find((c) => c.kind === kind);
  return { result, mass: byKind("mass loss"), ocv: byKind("open-circuit voltage"), visual: byKind("visual state") };
}

describe("mass-loss bands", () => {
  it("puts a cell on an edge in the band the edge belongs to", () => {
    expect(findMassLossBand(bands, 0.9999)?.index).toBe(0);
    expect(findMassLossBand(bands, 1)?.index).toBe(1);
    expect(findMassLossBand(bands, 75)?.index).toBe(1);
    expect(findMassLossBand(bands, 75.0001)?.index).toBe(2);
  });
  it("says each band's range in words", () => {
    expect([0, 1, 2].map((i) => describeMassLossBand(bands, i))).toEqual(["below 1 g", "from 1 g up to 75 g", "above 75 g"]);
  });
  it("finds no band when the last one has an edge a cell lies beyond", () => {
    expect(findMassLossBand([{ upToG: 10, upToIncluded: true, maxLossPercent: 1 }], 11)).toBeNull();
  });
});

describe("evaluateObservations", () => {
  it("meets every criterion with a loss exactly on the limit and a voltage exactly on the share", () => {
    // 45 g cell: limit 0.2 %; 45 → 44.91 g is a loss of exactly 0.2 %. 3.6 V → 3.24 V is exactly 90 %.
    const { mass, ocv, visual } = judge({ massG: 45, openCircuitVoltageV: 3.6 }, { massG: 44.91, openCircuitVoltageV: 3.24, visual: { noneSeen: [...allNoneSeen.noneSeen] } });
    expect(mass?.outcome).toBe("conforms");
    expect(mass?.limit).toBe(0.2);
    expect(mass?.rule).toContain("≤ 0.2 %");
    expect(mass?.rule).toContain("from 1 g up to 75 g");
    expect(mass?.observed).toBe("45.000 g before, 44.910 g after: a loss of 0.200 %");
    expect(ocv?.outcome).toBe("conforms");
    expect(ocv?.observed).toBe("3.600 V before, 3.240 V after: 90.000 %");
    expect(visual?.outcome).toBe("conforms");
    expect(mass?.source).toBe("UN Manual of Tests and Criteria 38.3.4");
  });

  it("fails a loss just above the limit and a voltage just below the share", () => {
    const { mass, ocv } = judge({ massG: 45, openCircuitVoltageV: 3.6 }, { massG: 44.9, openCircuitVoltageV: 3.239 });
    expect(mass?.outcome).toBe("does not conform");
    expect(mass?.value).toBeCloseTo(0.2222, 4);
    expect(ocv?.outcome).toBe("does not conform");
  });

  it("chooses the band by the mass before: 75 g takes 0.2 %, 75.5 g takes 0.1 %", () => {
    // 0.15 % loss: meets 0.2 % (75 g, edge included), fails 0.1 % (75.5 g).
    expect(judge({ massG: 75 }, { massG: 75 * (1 - 0.0015) }).mass?.outcome).toBe("conforms");
    expect(judge({ massG: 75.5 }, { massG: 75.5 * (1 - 0.0015) }).mass?.outcome).toBe("does not conform");
    // A 0.8 g cell may lose 0.5 %: 0.4 % meets.
    expect(judge({ massG: 0.8 }, { massG: 0.8 * (1 - 0.004) }).mass?.outcome).toBe("conforms");
  });

  it("counts a gain in mass as meeting the limit and says it is a gain", () => {
    const { mass } = judge({ massG: 45 }, { massG: 45.01 });
    expect(mass?.outcome).toBe("conforms");
    expect(mass?.observed).toContain("a gain of");
  });

  it("fails the visual criterion for an outcome the operator did not confirm, naming it", () => {
    const { visual } = judge({ massG: 45 }, { massG: 45, visual: { noneSeen: ["leakage", "venting", "disassembly", "fire"] } });
    expect(visual?.outcome).toBe("does not conform");
    expect(visual?.observed).toBe("not confirmed in the record: no rupture");
  });

  it("leaves a criterion not decided when a value is missing, and says which", () => {
    const { mass, ocv, visual } = judge(undefined, { massG: 45 });
    expect(mass?.outcome).toBe("not decided");
    expect(mass?.observed).toBe('no mass recorded on "before"');
    expect(ocv?.outcome).toBe("not decided");
    expect(visual?.outcome).toBe("not decided");
  });

  it("gives the specimen's verdict a statement per criterion", () => {
    const conformity = toObservationConformity(judge({ massG: 45 }, { massG: 44.9 }).result);
    expect(conformity.map((c) => c.outcome)).toEqual(["does not conform", "not decided", "not decided"]);
    expect(conformity[0]?.criterionId).toBe('mass loss on "Observation after"');
  });

  it("is absent for a procedure without observation steps", () => {
    expect(evaluateObservations([resolvedSteps.rest], [])).toBeUndefined();
  });
});

describe("observation steps in a procedure", () => {
  const issues = (steps: { kind: string; id: string }[]) => {
    const found: string[] = [];
    checkObservationSteps(steps, { addIssue: (issue) => found.push(issue.message) });
    return found;
  };
  it("refuses a mass-loss criterion without an earlier observation to compare with", () => {
    expect(issues([{ kind: "observe", id: "after", records: ["mass"], criteria: { massLoss: { bands } } } as never])).toEqual([
      "the mass-loss criterion compares with an earlier observation step: choose it",
    ]);
  });
  it("refuses a comparison with a step that does not record the quantity", () => {
    const steps = [
      { kind: "observe", id: "before", records: ["visual"] },
      { kind: "observe", id: "after", records: ["mass"], compareWith: "before", criteria: { massLoss: { bands } } },
    ];
    expect(issues(steps as never)).toEqual(['"before" does not record the mass']);
  });
  it("refuses bands out of order and a last band with an edge", () => {
    const result = checkBands([{ upToG: 75, maxLossPercent: 0.2 }, { upToG: 1, maxLossPercent: 0.5 }]);
    expect(result).toContain("the bands must go from light to heavy cells");
    expect(result).toContain("the last band has no upper edge: it takes every heavier cell");
  });
});

function checkBands(list: MassLossBand[]): string[] {
  const parsed = observationCriteriaSchema.safeParse({ massLoss: { bands: list } });
  return parsed.success ? [] : parsed.error.issues.map((issue) => issue.message);
}
