import { describe, expect, it } from "vitest";
import { describeCautionCode, describeCriterion } from "@/protocols";

const steps = [
  { id: "charge", label: "Standard charge" },
  { id: "rest", label: "Rest" },
  { id: "discharge", label: "Capacity discharge at 3 It" },
];

describe("describeCautionCode", () => {
  it("names the step by number and title and the field in words, never the code", () => {
    const words = describeCautionCode("discharge-current-above-rating/discharge/current", steps);
    expect(words).toBe("Step 3 “Capacity discharge at 3 It”, current: set above the cell's maximum continuous discharge current");
    expect(words).not.toMatch(/discharge-current|\/|above-rating/);
  });

  it("names the step by its id where no step list is at hand (the audit trail)", () => {
    expect(describeCautionCode("discharge-current-above-rating/discharge-max/current", [])).toBe(
      "The step “discharge-max”, current: set above the cell's maximum continuous discharge current",
    );
  });

  it("says so when the step is gone, and words nested fields", () => {
    expect(describeCautionCode("charge-current-above-rating/old/termination.current", steps)).toBe(
      "A step no longer in this version (old), termination current: set above the cell's charge-current rating",
    );
    expect(describeCautionCode("charge-below-zero-celsius/charge/ambient", steps)).toMatch(/^Step 1 “Standard charge”, ambient temperature: charging allowed below 0 °C$/);
  });
});

describe("describeCriterion with the step list", () => {
  it("names the step by number and title", () => {
    const words = describeCriterion({ kind: "capacity", id: "rated", stepId: "discharge", atLeastPercent: 100, of: "rated" }, steps);
    expect(words).toBe("Capacity of step 3 “Capacity discharge at 3 It” ≥ 100 % of the rated capacity");
  });
});
