import { describe, expect, it } from "vitest";
import {
  describeFieldPath,
  errorId,
  fieldId,
  flattenFieldErrors,
  listPathAncestors,
  listServerErrors,
  selectOwnMessages,
} from "@/components/procedure-editor/field-paths";

describe("fieldId and errorId", () => {
  it("turn a zod path into DOM ids that differ per path", () => {
    expect(fieldId("definition.steps.2.current.value")).toBe("pf-definition-steps-2-current-value");
    expect(errorId("definition.steps.2.current.value")).toBe("pf-definition-steps-2-current-value-error");
    expect(fieldId("definition.steps.2")).not.toBe(fieldId("definition.steps.20"));
  });
});

describe("flattenFieldErrors", () => {
  it("lists every message of a react-hook-form error tree with its dot path", () => {
    const ref = { tagName: "INPUT", self: null as unknown };
    ref.self = ref; // a DOM node is circular; the walk must not enter it
    const errors = {
      definition: {
        header: { title: { type: "schema", message: "the title is required", ref } },
        steps: [
          undefined,
          { current: { value: { type: "schema", message: "a current must be greater than 0" } } },
        ],
      },
    };
    expect(flattenFieldErrors(errors)).toEqual([
      { path: "definition.header.title", message: "the title is required" },
      { path: "definition.steps.1.current.value", message: "a current must be greater than 0" },
    ]);
  });

  it("gives a field array's own error (root) the array's path, and a message above its children's", () => {
    const errors = {
      definition: {
        steps: { root: { type: "too_small", message: "a procedure needs at least one step" } },
        repeat: { message: "outer", type: "custom", stepIds: [{ message: "inner", type: "custom" }] },
      },
    };
    expect(flattenFieldErrors(errors)).toEqual([
      { path: "definition.steps", message: "a procedure needs at least one step" },
      { path: "definition.repeat", message: "outer" },
      { path: "definition.repeat.stepIds.0", message: "inner" },
    ]);
  });

  it("starts paths from a prefix and drops repeated messages", () => {
    const node = { message: "required", type: "x", root: { message: "required", type: "x" } };
    expect(flattenFieldErrors(node, "instructions")).toEqual([{ path: "instructions", message: "required" }]);
    expect(flattenFieldErrors(undefined)).toEqual([]);
  });
});

describe("selectOwnMessages and listPathAncestors", () => {
  it("keep only the messages of exactly one path", () => {
    const all = [
      { path: "definition.steps.0.current", message: "a" },
      { path: "definition.steps.0.current.value", message: "b" },
    ];
    expect(selectOwnMessages(all, "definition.steps.0.current")).toEqual(["a"]);
  });

  it("walk from a path up to its first part, for moving focus to the nearest control", () => {
    expect(listPathAncestors("definition.steps.2.current")).toEqual([
      "definition.steps.2.current",
      "definition.steps.2",
      "definition.steps",
      "definition",
    ]);
  });
});

describe("describeFieldPath", () => {
  it.each([
    ["definition.header.title", "Title"],
    ["definition.header.ambient.toleranceC", "Ambient › tolerance"],
    ["definition.steps", "Steps"],
    ["definition.steps.2.current.value", "Step 3 › current › value"],
    ["definition.steps.0.termination.current.multipleOfIt", "Step 1 › termination › current › multiple of It"],
    ["definition.acceptance.0.stepId", "Criterion 1 › step"],
    ["definition.repeat.stepIds.1", "Repeat rule › steps › 2"],
    ["definition.repeat", "Repeat rule"],
    ["cautions", "Safety cautions"],
    ["acknowledgedCautions", "Acknowledged cautions"],
    ["definition.steps.1.someNewField", "Step 2 › some new field"],
  ])("%s reads as %s", (path, words) => {
    expect(describeFieldPath(path)).toBe(words);
  });

  it("names the step by its label when the labels are given", () => {
    expect(describeFieldPath("definition.steps.1.endVoltage", ["Charge", "Capacity discharge"])).toBe(
      "Step 2 “Capacity discharge” › end voltage",
    );
  });
});

describe("listServerErrors", () => {
  it("keeps zod paths, joins several messages, and files whole-draft problems under root.server", () => {
    expect(
      listServerErrors({
        "definition.steps.2.current.value": ["a current must be greater than 0"],
        "definition.header.title": ["required", "too long"],
        form: ["The draft is not an object."],
        "definition.clause": [],
      }),
    ).toEqual([
      { path: "definition.steps.2.current.value", message: "a current must be greater than 0" },
      { path: "definition.header.title", message: "required too long" },
      { path: "root.server", message: "The draft is not an object." },
    ]);
    expect(listServerErrors(undefined)).toEqual([]);
  });
});
