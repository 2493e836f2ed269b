import { describe, expect, it } from "vitest";
import { checkDurations, observeDuration } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, recordOf, steps, valueOf } from "./context-fixtures";

const timed = (startedAt: string, endedAt: string) => recordOf({ stepId: "rest", startedAt, endedAt });

describe("checkDurations", () => {
  it("measures a rest from its recorded times without a log", () => {
    const [finding] = checkDurations(contextOf({ step: steps.rest, record: timed("2026-03-02T08:00:00Z", "2026-03-02T10:00:00Z") }));
    expect(finding).toMatchObject({ rule: "duration-within-limits", outcome: "meets", observed: { value: 7200, unit: "s" } });
    expect(finding?.observed.text).toContain("from the recorded start and end");
  });

  it("deviates for a rest shorter than its shortest time, or longer than its longest", () => {
    const short = checkDurations(contextOf({ step: steps.rest, record: timed("2026-03-02T08:00:00Z", "2026-03-02T08:50:00Z") }));
    expect(short[0]).toMatchObject({ outcome: "deviates", observed: { value: 3000 } });
    const long = checkDurations(contextOf({ step: steps.rest, record: timed("2026-03-02T08:00:00Z", "2026-03-02T12:30:00Z") }));
    expect(long[0]?.outcome).toBe("deviates");
  });

  it("widens the limits by the time tolerance (±0.1 %): 3 597 s passes a 1 h minimum, 3 596 s does not", () => {
    const of = (end: string) => checkDurations(contextOf({ step: steps.rest, record: timed("2026-03-02T08:00:00Z", end) }))[0]?.outcome;
    expect(of("2026-03-02T08:59:57Z")).toBe("meets");
    expect(of("2026-03-02T08:59:56Z")).toBe("deviates");
  });

  it("prefers the log phase to the recorded times", () => {
    const columns = logOf(levelOf(4000, 4.1, 0), undefined);
    const evidence = evidenceOf(columns);
    const context = contextOf({ step: steps.rest, record: timed("2026-03-02T08:00:00Z", "2026-03-02T08:10:00Z"), evidence });
    expect(observeDuration(context)).toEqual({ seconds: 3999, source: "from the data log" });
    expect(checkDurations(context)[0]?.outcome).toBe("meets");
  });

  it("cannot judge without log and times; reversed times are not used", () => {
    expect(checkDurations(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest" }) }))[0]?.outcome).toBe("not assessable");
    const reversed = checkDurations(contextOf({ step: steps.rest, record: timed("2026-03-02T10:00:00Z", "2026-03-02T08:00:00Z") }));
    expect(reversed[0]).toMatchObject({ outcome: "not assessable" });
    expect(reversed[0]?.observed.text).toContain("the recorded end is before the recorded start");
  });

  it("checks a discharge's time limit only when the step sets one", () => {
    expect(checkDurations(contextOf({ step: steps.discharge }))).toEqual([]);
    const limited = { ...steps.discharge, maxDuration: valueOf(3600, "s") };
    const record = recordOf({ stepId: "discharge", startedAt: "2026-03-02T08:00:00Z", endedAt: "2026-03-02T09:30:00Z" });
    expect(checkDurations(contextOf({ step: limited, record }))[0]).toMatchObject({ outcome: "deviates", expected: { max: 3603.6 } });
    expect(checkDurations(contextOf({ step: steps.pulse }))).toEqual([]);
  });
});
