import { describe, expect, it } from "vitest";
import { checkOrderAndGap, checkRecordMatchesLog, checkStepRecorded, findTimeSpan, type PlacedStep } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, recordOf, steps } from "./context-fixtures";

function placed(input: { stepId: "charge" | "rest"; startedAt?: string; endedAt?: string; pauseReason?: string; logStartMs?: number }): PlacedStep {
  const { logStartMs, ...fields } = input;
  const context = contextOf({ step: steps[input.stepId], record: recordOf(fields), ...(logStartMs !== undefined && { logStartMs }) });
  return { context, span: findTimeSpan(context) };
}

describe("checkStepRecorded", () => {
  it("wants a ticked record whose end is not before its start", () => {
    expect(checkStepRecorded(contextOf({ step: steps.rest }))).toMatchObject({ rule: "step-recorded", outcome: "meets" });
    expect(checkStepRecorded(contextOf({ step: steps.rest, record: null })).outcome).toBe("deviates");
    expect(checkStepRecorded(contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", completed: false }) })).outcome).toBe("deviates");
    const reversed = recordOf({ stepId: "rest", startedAt: "2026-03-02T09:00:00Z", endedAt: "2026-03-02T08:00:00Z" });
    expect(checkStepRecorded(contextOf({ step: steps.rest, record: reversed })).outcome).toBe("deviates");
  });
});

describe("checkOrderAndGap", () => {
  const charge = placed({ stepId: "charge", startedAt: "2026-03-02T08:00:00Z", endedAt: "2026-03-02T10:00:00Z" });

  it("meets for a step that starts when the previous one ends, or within the pause allowance", () => {
    const rest = placed({ stepId: "rest", startedAt: "2026-03-02T10:00:00Z", endedAt: "2026-03-02T11:00:00Z" });
    expect(checkOrderAndGap({ previous: charge, current: rest })).toMatchObject({ outcome: "meets", observed: { value: 0 } });
    const later = placed({ stepId: "rest", startedAt: "2026-03-02T10:10:00Z", endedAt: "2026-03-02T11:00:00Z" });
    expect(checkOrderAndGap({ previous: charge, current: later }).outcome).toBe("meets");
  });

  it("deviates for a pause longer than the allowance, stating its reason when one is recorded (issue 12, 3a: no longer 'meets')", () => {
    const late = placed({ stepId: "rest", startedAt: "2026-03-02T10:10:01Z", endedAt: "2026-03-02T11:00:00Z" });
    expect(checkOrderAndGap({ previous: charge, current: late })).toMatchObject({ outcome: "deviates", observed: { value: 601 } });
    const explained = placed({ stepId: "rest", startedAt: "2026-03-02T10:30:00Z", endedAt: "2026-03-02T11:00:00Z", pauseReason: "chamber door alarm" });
    const finding = checkOrderAndGap({ previous: charge, current: explained });
    expect(finding.outcome).toBe("deviates");
    expect(finding.observed.text).toContain("reason recorded: chamber door alarm");
    expect(finding.note).toBe("Pause explained by the operator: chamber door alarm");
  });

  it("deviates for a step started before the previous one ended (out of order)", () => {
    const early = placed({ stepId: "rest", startedAt: "2026-03-02T09:30:00Z", endedAt: "2026-03-02T11:00:00Z" });
    const finding = checkOrderAndGap({ previous: charge, current: early });
    expect(finding.outcome).toBe("deviates");
    expect(finding.observed.text).toContain("before the previous step ended");
  });

  it("cannot compare without times, or across clocks", () => {
    const untimed = placed({ stepId: "rest" });
    expect(checkOrderAndGap({ previous: charge, current: untimed }).outcome).toBe("not assessable");
    const onLog = contextOf({ step: steps.rest, evidence: evidenceOf(logOf(levelOf(10, 4.1, 0))) });
    const fromLog: PlacedStep = { context: onLog, span: findTimeSpan(onLog) };
    expect(checkOrderAndGap({ previous: charge, current: fromLog }).observed.text).toContain("from the log and the other's from the wall clock");
  });

  it("moves recorded times onto the log's time base when the log's start is known", () => {
    const logStartMs = Date.parse("2026-03-02T08:00:00Z");
    const span = findTimeSpan(placed({ stepId: "rest", startedAt: "2026-03-02T08:01:00Z", endedAt: "2026-03-02T08:02:30Z", logStartMs }).context);
    expect(span).toEqual({ startS: 60, endS: 150, base: "log", source: "record" });
  });
});

describe("checkRecordMatchesLog", () => {
  const logStartMs = Date.parse("2026-03-02T08:00:00Z");
  // A rest from 0 s to 1 799 s of the log.
  const evidence = evidenceOf(logOf(levelOf(1800, 4.1, 0)));
  const contextFor = (startedAt: string, endedAt: string) =>
    contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", startedAt, endedAt }), evidence, logStartMs });

  it("meets when the recorded times lie within the agreement of the log phase's", () => {
    expect(checkRecordMatchesLog(contextFor("2026-03-02T08:02:00Z", "2026-03-02T08:30:00Z"))[0]).toMatchObject({ outcome: "meets" });
  });

  it("deviates when they do not (the log or the record belongs to something else)", () => {
    const [finding] = checkRecordMatchesLog(contextFor("2026-03-02T09:00:00Z", "2026-03-02T09:29:59Z"));
    expect(finding).toMatchObject({ outcome: "deviates", observed: { value: 3600 } });
  });

  it("cannot compare without the log's start time, and is silent for a step the log does not show", () => {
    const noStart = contextOf({ step: steps.rest, record: recordOf({ stepId: "rest", startedAt: "2026-03-02T08:00:00Z", endedAt: "2026-03-02T08:30:00Z" }), evidence });
    expect(checkRecordMatchesLog(noStart)[0]?.outcome).toBe("not assessable");
    expect(checkRecordMatchesLog(contextOf({ step: steps.rest }))).toEqual([]);
  });
});
