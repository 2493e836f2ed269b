import { describe, expect, it } from "vitest";
import { decideLot, type LotDecisionInput } from "@/lib/lots/sampling";

// Plan H at AQL 1.0: n = 50, Ac 1, Re 2.
const plan = { sampleSize: 50, acceptanceNumber: 1, rejectionNumber: 2 };

function decide(tested: number, nonconforming: number, p: LotDecisionInput["plan"] = plan) {
  const result = decideLot({ plan: p, tested, nonconforming });
  if (!result.ok) throw new Error(result.error.message);
  return result.decision;
}

describe("decideLot", () => {
  it("accepts with the whole sample tested and at most Ac nonconforming", () => {
    expect(decide(50, 0).verdict).toBe("accept");
    const decision = decide(50, 1);
    expect(decision).toMatchObject({ verdict: "accept", remaining: 0 });
    expect(decision.statement).toBe("1 nonconforming of 50 tested is within the acceptance number 1: accept.");
  });

  it("rejects as soon as the nonconforming reach Re, even before the sample is complete", () => {
    const early = decide(17, 2);
    expect(early).toMatchObject({ verdict: "reject", remaining: 0 });
    expect(early.statement).toBe("2 nonconforming of 17 tested reaches the rejection number 2: reject.");
    expect(decide(50, 3).verdict).toBe("reject");
  });

  it("stays pending until the sample is tested, saying how many remain", () => {
    const decision = decide(17, 1);
    expect(decision).toMatchObject({ verdict: "pending", remaining: 33 });
    expect(decision.statement).toBe("1 nonconforming of 17 tested; 33 still to test: pending.");
    expect(decide(0, 0)).toMatchObject({ verdict: "pending", remaining: 50 });
  });

  it("states the rule in words", () => {
    expect(decide(0, 0).rule).toBe(
      "Single sampling (ISO 2859-1): test 50 specimens; accept the lot with 1 or fewer nonconforming, reject it with 2 or more. " +
        "The lot is rejected as soon as 2 nonconforming are found, even before the whole sample is tested.",
    );
  });

  it("rejects with Ac 0 at the first nonconforming specimen", () => {
    expect(decide(1, 1, { sampleSize: 13, acceptanceNumber: 0, rejectionNumber: 1 }).verdict).toBe("reject");
  });

  it.each([
    [51, 0, "tested", "more than the sample of 50"],
    [-1, 0, "tested", "0 or more"],
    [10.5, 0, "tested", "whole number"],
    [10, 11, "nonconforming", "more than the 10 specimens tested"],
    [10, -1, "nonconforming", "0 or more"],
  ])("refuses %s tested with %s nonconforming (%s)", (tested, nonconforming, field, words) => {
    const result = decideLot({ plan, tested, nonconforming });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.field).toBe(field);
    expect(result.error.message).toContain(words);
  });

  it("refuses a plan whose numbers do not fit single sampling", () => {
    const result = decideLot({ plan: { sampleSize: 50, acceptanceNumber: 1, rejectionNumber: 4 }, tested: 0, nonconforming: 0 });
    expect(result.ok || result.error.field).toBe("plan");
  });
});
