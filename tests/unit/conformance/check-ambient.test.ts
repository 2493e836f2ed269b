import { describe, expect, it } from "vitest";
import { checkAmbient } from "@/lib/conformance";
import { contextOf, recordOf, steps } from "./context-fixtures";

const reading = (celsius: number, minute = 0) => ({ at: `2026-03-02T08:${String(minute).padStart(2, "0")}:00Z`, celsius });

describe("checkAmbient", () => {
  it("meets when every reading lies in the range, the limits included", () => {
    const record = recordOf({ stepId: "rest", ambientReadings: [reading(20), reading(22.4, 30), reading(25, 59)] });
    const [finding] = checkAmbient(contextOf({ step: steps.rest, record }));
    expect(finding).toMatchObject({ rule: "ambient-in-range", outcome: "meets", observed: { min: 20, max: 25, unit: "°C" } });
    expect(finding?.expected).toMatchObject({ min: 20, max: 25 });
    expect(finding?.id).toBe("rest#1/ambient-in-range");
  });

  it("deviates when one reading is outside, and names it", () => {
    const record = recordOf({ stepId: "rest", ambientReadings: [reading(22), reading(25.1, 12), reading(23, 40)] });
    const [finding] = checkAmbient(contextOf({ step: steps.rest, record }));
    expect(finding?.outcome).toBe("deviates");
    expect(finding?.observed.text).toContain("outside the range: 25.1 °C at 2026-03-02T08:12:00Z");
    const below = checkAmbient(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", ambientReadings: [reading(19.9)] }) }));
    expect(below[0]?.outcome).toBe("deviates");
  });

  it("cannot judge a step without readings or without a record", () => {
    expect(checkAmbient(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest" }) }))[0]).toMatchObject({
      outcome: "not assessable",
      observed: { text: "no ambient reading was recorded for this step" },
    });
    expect(checkAmbient(contextOf({ step: steps.rest, record: null }))[0]).toMatchObject({ outcome: "not assessable", observed: { text: "no step record" } });
  });

  it("judges a soak against its own temperature", () => {
    const cold = checkAmbient(contextOf({ step: steps.soak, record: recordOf({ stepId: "soak", ambientReadings: [reading(-19.5)] }) }));
    expect(cold[0]).toMatchObject({ outcome: "meets", title: "Soak temperature within its range" });
    const warm = checkAmbient(contextOf({ step: steps.soak, record: recordOf({ stepId: "soak", ambientReadings: [reading(-17)] }) }));
    expect(warm[0]?.outcome).toBe("deviates");
  });
});

describe("checkAmbient leaves out what is not an ambient", () => {
  it("does not count a reading struck as an error, and says so", () => {
    const struck = { ...reading(31, 10), struck: { reason: "typing slip", at: "2026-03-02T09:00:00Z", by: "Ola" } };
    const [finding] = checkAmbient(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", ambientReadings: [reading(21), struck, reading(22, 20)] }) }));
    expect(finding).toMatchObject({ outcome: "meets", observed: { min: 21, max: 22 } });
    expect(finding?.observed.text).toMatch(/^2 readings, /);
    expect(finding?.observed.text).toContain("not counted: 1 struck as an error");
  });

  it("never counts a physically implausible value (outside −60…150 °C) stored before entry was checked", () => {
    const [finding] = checkAmbient(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", ambientReadings: [reading(500), reading(22, 5)] }) }));
    expect(finding).toMatchObject({ outcome: "meets", observed: { min: 22, max: 22 } });
    expect(finding?.observed.text).toContain("not counted: 1 outside −60…150 °C");
    const [none] = checkAmbient(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", ambientReadings: [reading(500)] }) }));
    expect(none?.outcome).toBe("not assessable");
  });
});
