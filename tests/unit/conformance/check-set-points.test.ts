import { describe, expect, it } from "vitest";
import { checkSetPoints } from "@/lib/conformance";
import { contextOf, recordOf, steps } from "./context-fixtures";

describe("checkSetPoints", () => {
  it("meets when each programmed value is within ±1 % of the resolved one (IEC 61960-3 clause 4 default)", () => {
    const record = recordOf({ stepId: "discharge", programmed: { current: 0.606, endVoltage: 2.49 } });
    const findings = checkSetPoints(contextOf({ step: steps.discharge, record }));
    expect(findings.map((f) => [f.id, f.outcome])).toEqual([
      ["discharge#1/set-point-matches/current", "meets"],
      ["discharge#1/set-point-matches/endVoltage", "meets"],
    ]);
    expect(findings[0]?.expected).toMatchObject({ value: 0.6, min: 0.594, max: 0.606, unit: "A" });
    expect(findings[0]?.clause).toContain("IEC 61960-3 clause 4 (tolerances)");
  });

  it("deviates just outside the tolerance", () => {
    const record = recordOf({ stepId: "discharge", programmed: { current: 0.6061, endVoltage: 2.7 } });
    expect(checkSetPoints(contextOf({ step: steps.discharge, record })).map((f) => f.outcome)).toEqual(["deviates", "deviates"]);
  });

  it("uses the step's own tolerance when it sets one", () => {
    const loose = { ...steps.discharge, tolerances: { ...steps.discharge.tolerances, currentPercent: { value: 5, from: "step" as const } } };
    const record = recordOf({ stepId: "discharge", programmed: { current: 0.62, endVoltage: 2.5 } });
    const [current] = checkSetPoints(contextOf({ step: loose, record }));
    expect(current).toMatchObject({ outcome: "meets", expected: { min: 0.57, max: 0.63 } });
    expect(current?.clause).toContain("tolerance set in the step");
  });

  it("lists the charge's set-points, termination included, and leaves unrecorded ones open", () => {
    const record = recordOf({ stepId: "charge", programmed: { current: 1.5, voltage: 4.2 } });
    const findings = checkSetPoints(contextOf({ step: steps.charge, record }));
    expect(findings.map((f) => [f.id.split("/").pop(), f.outcome])).toEqual([
      ["current", "meets"],
      ["voltage", "meets"],
      ["terminationCurrent", "not assessable"],
    ]);
    expect(findings[2]?.observed.text).toBe("the programmed termination current was not recorded");
  });

  it("takes a programmed rest time anywhere between the shortest and longest rest", () => {
    const of = (duration: number) => checkSetPoints(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", programmed: { duration } }) }))[0]?.outcome;
    expect(of(3600)).toBe("meets");
    expect(of(14_400)).toBe("meets");
    expect(of(3000)).toBe("deviates");
    expect(of(15_000)).toBe("deviates");
  });

  it("checks a soak's chamber temperature against its range, and every pulse set-point", () => {
    const soak = checkSetPoints(contextOf({ step: steps.soak, record: recordOf({ stepId: "soak", programmed: { duration: 60_000, temperature: -25 } }) }));
    expect(soak.map((f) => f.outcome)).toEqual(["meets", "deviates"]);
    const pulse = checkSetPoints(
      contextOf({ step: steps.pulse, record: recordOf({ stepId: "pulse", programmed: { baseCurrent: 0.6, baseDuration: 10, pulseCurrent: 3, pulseDuration: 1 } }) }),
    );
    expect(pulse.map((f) => f.outcome)).toEqual(["meets", "meets", "meets", "meets"]);
    expect(checkSetPoints(contextOf({ step: steps.measure }))).toEqual([]);
  });

  it("cannot compare with a set-point the cell specification could not supply", () => {
    const unresolved = { ...steps.discharge, endVoltage: null };
    const record = recordOf({ stepId: "discharge", programmed: { current: 0.6, endVoltage: 2.5 } });
    expect(checkSetPoints(contextOf({ step: unresolved, record }))[1]).toMatchObject({ outcome: "not assessable", observed: { value: 2.5 } });
    expect(checkSetPoints(contextOf({ step: steps.discharge, record: null })).map((f) => f.observed.text)).toEqual(["no step record", "no step record"]);
  });
});
