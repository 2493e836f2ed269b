import { describe, expect, it } from "vitest";
import {
  createCriterion,
  createRepeatRule,
  createStep,
  createUniqueId,
  listStepRange,
  parseNumberInput,
  splitNotes,
  toggleAcknowledgement,
} from "@/components/procedure-editor/draft-values";
import { listSchemaProblems } from "@/components/procedure-editor/schema-problems";
import { stepKinds, stepSchema, type StepKind } from "@/protocols";

describe("parseNumberInput", () => {
  it("reads blank as not given and anything else as a number", () => {
    expect(parseNumberInput("")).toBeUndefined();
    expect(parseNumberInput("   ")).toBeUndefined();
    expect(parseNumberInput("0.2")).toBe(0.2);
    expect(parseNumberInput("-1")).toBe(-1);
    expect(parseNumberInput("1e3")).toBe(1000);
    expect(parseNumberInput("abc")).toBeNaN();
  });
});

describe("createUniqueId", () => {
  it("takes the base when free, else the first free numbered one", () => {
    expect(createUniqueId("rest", [])).toBe("rest");
    expect(createUniqueId("rest", ["rest"])).toBe("rest-2");
    expect(createUniqueId("rest", ["rest", "rest-2", "rest-3"])).toBe("rest-4");
  });
});

// A new step fills in datasheet references and leaves every number to the engineer.
const blanksOf: Record<StepKind, string[]> = {
  charge: [],
  discharge: ["current.multipleOfIt"],
  rest: ["minDuration.value"],
  soak: ["temperature.nominalC", "temperature.toleranceC", "minDuration.value"],
  pulse: ["baseCurrent.multipleOfIt", "baseDuration.value", "pulseCurrent.multipleOfIt", "pulseDuration.value"],
  measure: [],
  observe: [],
  "cycle-block": [
    "restAfterCharge.minDuration.value",
    "discharge.current.multipleOfIt",
    "restAfterDischarge.minDuration.value",
    "maxCycles",
    "stopBelowPercentOfRated",
    "acceptAtLeastPercentOfRated",
  ],
};

describe("createStep", () => {
  it.each(stepKinds)("makes a %s step whose only problems are its blank numbers, each 'required'", (kind) => {
    const step = createStep(kind, [kind]);
    expect(step.kind).toBe(kind);
    expect(step.id).toBe(`${kind}-2`);
    const result = stepSchema.safeParse(step);
    const problems = result.success ? [] : listSchemaProblems(result.error.issues);
    expect(problems).toEqual(blanksOf[kind].map((path) => ({ path, message: "required" })));
  });

  it("fills a charge with the cell's own charge values", () => {
    expect(createStep("charge", [])).toMatchObject({
      current: { spec: "standardChargeCurrent" },
      voltage: { spec: "chargeVoltage" },
      termination: { kind: "current", current: { spec: "chargeTerminationCurrent" } },
    });
  });
});

describe("createCriterion", () => {
  const steps = [
    { id: "charge", kind: "charge" },
    { id: "pulse", kind: "pulse" },
    { id: "discharge", kind: "discharge" },
  ];
  it("judges the first step of a kind it can judge", () => {
    expect(createCriterion("capacity", { existingIds: [], steps })).toMatchObject({ kind: "capacity", id: "capacity", stepId: "discharge", of: "rated" });
    expect(createCriterion("discharge-duration", { existingIds: [], steps })).toMatchObject({ id: "duration", stepId: "discharge" });
    expect(createCriterion("resistance", { existingIds: ["resistance"], steps })).toMatchObject({
      id: "resistance-2",
      stepId: "pulse",
      atMost: { spec: "maxDcResistance" },
    });
  });

  it("points an AC measurement's limit at the AC resistance field, and leaves the step empty when none fits", () => {
    expect(createCriterion("resistance", { existingIds: [], steps: [{ id: "ac", kind: "measure" }] })).toMatchObject({ atMost: { spec: "maxAcResistance" } });
    expect(createCriterion("capacity", { existingIds: [], steps: [] }).stepId).toBe("");
  });
});

describe("createRepeatRule", () => {
  it("stops at the first criterion and chooses no steps yet", () => {
    expect(createRepeatRule(["rated-capacity", "other"])).toMatchObject({ stepIds: [], stopWhenMet: "rated-capacity" });
    expect(createRepeatRule([]).stopWhenMet).toBe("");
  });
});

describe("listStepRange", () => {
  const ids = ["precondition", "charge", "rest", "discharge"];
  it("is the consecutive block from the first to the last step", () => {
    expect(listStepRange(ids, "charge", "discharge")).toEqual(["charge", "rest", "discharge"]);
    expect(listStepRange(ids, "rest", "rest")).toEqual(["rest"]);
  });
  it("is empty when the last comes before the first or a step is unknown", () => {
    expect(listStepRange(ids, "discharge", "charge")).toEqual([]);
    expect(listStepRange(ids, "gone", "rest")).toEqual([]);
  });
});

describe("splitNotes", () => {
  it("keeps one trimmed note per non-blank line, and no list when there is none", () => {
    expect(splitNotes(" first \n\n second\n")).toEqual(["first", "second"]);
    expect(splitNotes("\n  \n")).toBeUndefined();
  });
});

describe("toggleAcknowledgement", () => {
  it("adds a code once and removes it", () => {
    expect(toggleAcknowledgement(["a"], "b", true)).toEqual(["a", "b"]);
    expect(toggleAcknowledgement(["a", "b"], "a", true)).toEqual(["b", "a"]);
    expect(toggleAcknowledgement(["a", "b"], "a", false)).toEqual(["b"]);
    expect(toggleAcknowledgement([], "a", false)).toEqual([]);
  });
});
