import { describe, expect, it } from "vitest";
import { buildObservationFixturePayload } from "./fixture-observation-payload";

describe("certificate of an observation run", () => {
  it("states what the records show and names each criterion with its rule and source", () => {
    const payload = buildObservationFixturePayload({ rupture: true });
    const observations = payload.observations;
    expect(observations?.records.map((r) => r.stepLabel)).toEqual(["Observation before", "Observation after"]);
    expect(observations?.records[0]?.rows).toContainEqual({ name: "Mass", value: "45.000 g" });
    expect(observations?.criteria.map((c) => [c.name, c.outcome])).toEqual([
      ['Mass loss on "Observation after"', "conforms"],
      ['Open-circuit voltage on "Observation after"', "conforms"],
      ['Visual state on "Observation after"', "does not conform"],
    ]);
    expect(observations?.criteria[0]?.rule).toContain("≤ 0.2 %");
    expect(observations?.criteria[0]?.source).toBe("UN Manual of Tests and Criteria 38.3.4 (T1 to T5), criteria");
    expect(observations?.criteria[2]?.observed).toBe("not confirmed in the record: no rupture");
    expect(observations?.decisionRule).toMatch(/^Simple acceptance/);
    expect(payload.conformity.specimenConforms).toBe("does not conform");
  });

  it("conforms when every observation criterion is met", () => {
    expect(buildObservationFixturePayload().conformity.specimenConforms).toBe("conforms");
  });
});
