import { describe, expect, it } from "vitest";
import { groupProblemsByPath, listSchemaProblems } from "@/components/procedure-editor/schema-problems";
import { procedureDraftSchema } from "@/lib/procedures/procedure-input";
import { ratedCapacityAt20cTemplate, type Procedure } from "@/protocols";

function problemsOf(change: (procedure: Procedure) => unknown) {
  const definition = structuredClone(ratedCapacityAt20cTemplate);
  const changed = change(definition) ?? definition;
  const result = procedureDraftSchema.safeParse({ definition: changed });
  return result.success ? [] : listSchemaProblems(result.error.issues);
}

// The refusals the issue names: each comes back with the field's path and a plain message.
describe("listSchemaProblems on a draft", () => {
  it("puts a negative current at its own value", () => {
    expect(problemsOf((p) => void (p.steps[3] = { ...p.steps[3]!, current: { value: -2, unit: "A" } } as never))).toEqual([
      { path: "definition.steps.3.current.value", message: "a current must be greater than 0" },
    ]);
  });

  it("puts a blank multiple of It at the multiple, not at the whole current", () => {
    expect(problemsOf((p) => void (p.steps[3] = { ...p.steps[3]!, current: { multipleOfIt: undefined } } as never))).toEqual([
      { path: "definition.steps.3.current.multipleOfIt", message: "required" },
    ]);
  });

  it("puts an end voltage at or above the charge voltage at the discharge's end voltage", () => {
    const problems = problemsOf((p) => {
      p.steps[1] = { ...p.steps[1]!, voltage: { value: 4.2, unit: "V" } } as never;
      p.steps[3] = { ...p.steps[3]!, endVoltage: { value: 4.3, unit: "V" } } as never;
    });
    expect(problems).toEqual([{ path: "definition.steps.3.endVoltage", message: 'the end voltage must be below the charge voltage of step "charge"' }]);
  });

  it("puts a longest rest shorter than the shortest at the longest", () => {
    const problems = problemsOf((p) => void (p.steps[2] = { ...p.steps[2]!, maxDuration: { value: 30, unit: "min" } } as never));
    expect(problems).toEqual([{ path: "definition.steps.2.maxDuration", message: "the longest rest (30 min) is shorter than the shortest rest (1 h)" }]);
  });

  it("names an unknown specification field at the field name", () => {
    const problems = problemsOf((p) => void (p.steps[3] = { ...p.steps[3]!, endVoltage: { spec: "cutoffVoltage" } } as never));
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe("definition.steps.3.endVoltage.spec");
    expect(problems[0]?.message).toContain('"cutoffVoltage" is not a voltage field of the cell specification');
  });

  it("refuses an empty step list at the list", () => {
    const problems = problemsOf((p) => ({ ...p, steps: [], acceptance: [], repeat: undefined }));
    expect(problems).toEqual([{ path: "definition.steps", message: "a procedure needs at least one step" }]);
  });

  it("keeps the union's own message when the value fits none of its forms", () => {
    const problems = problemsOf((p) => void (p.steps[3] = { ...p.steps[3]!, current: { amps: 2 } } as never));
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe("definition.steps.3.current");
    expect(problems[0]?.message).toMatch(/^a current is a multiple of It/);
  });

  it("finds no problem in a template", () => {
    expect(problemsOf(() => undefined)).toEqual([]);
  });
});

describe("groupProblemsByPath", () => {
  it("keeps one entry per path and joins different messages once", () => {
    expect(
      groupProblemsByPath([
        { path: "a", message: "one" },
        { path: "a", message: "two" },
        { path: "a", message: "one" },
        { path: "b", message: "three" },
      ]),
    ).toEqual({ a: { type: "schema", message: "one · two" }, b: { type: "schema", message: "three" } });
  });
});
