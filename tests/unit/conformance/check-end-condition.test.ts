import { describe, expect, it } from "vitest";
import { checkEndCondition } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, recordOf, steps, valueOf } from "./context-fixtures";

/** A 0.6 A discharge whose voltage falls linearly from 4.0 V to `lastV`. */
function dischargeTo(lastV: number) {
  return logOf(levelOf(101, (k) => 4 - ((4 - lastV) * k) / 100, -0.6));
}

describe("checkEndCondition", () => {
  it("meets when the discharge ends at its end voltage within ±1 %", () => {
    const [finding] = checkEndCondition(contextOf({ step: steps.discharge, evidence: evidenceOf(dischargeTo(2.49)) }));
    expect(finding).toMatchObject({ rule: "end-voltage-reached", outcome: "meets", observed: { value: 2.49 }, expected: { min: 2.475, max: 2.525 } });
  });

  it("deviates when the discharge stops early, or goes below the end voltage", () => {
    const early = checkEndCondition(contextOf({ step: steps.discharge, evidence: evidenceOf(dischargeTo(3.4)) }))[0];
    expect(early?.outcome).toBe("deviates");
    expect(early?.observed.text).toContain("stopped before the end voltage");
    const deep = checkEndCondition(contextOf({ step: steps.discharge, evidence: evidenceOf(dischargeTo(2.3)) }))[0];
    expect(deep?.outcome).toBe("deviates");
    expect(deep?.observed.text).toContain("discharged below the end voltage");
  });

  it("meets when a CC-CV charge ends at the termination current, and deviates without a CV part", () => {
    const cc = levelOf(100, (k) => 3.7 + k * 0.004, 1.5);
    const cv = levelOf(200, 4.2, (k) => Math.max(0.0595, 1.5 * Math.exp(-k / 30)));
    expect(checkEndCondition(contextOf({ step: steps.charge, evidence: evidenceOf(logOf([...cc, ...cv])) }))[0]).toMatchObject({
      rule: "termination-reached",
      outcome: "meets",
      observed: { value: 0.0595 },
    });
    const cutShort = levelOf(60, 4.2, (k) => 1.5 * Math.exp(-k / 30));
    expect(checkEndCondition(contextOf({ step: steps.charge, evidence: evidenceOf(logOf([...cc, ...cutShort])) }))[0]?.outcome).toBe("deviates");
    const ccOnly = checkEndCondition(contextOf({ step: steps.charge, evidence: evidenceOf(logOf(cc)) }))[0];
    expect(ccOnly?.outcome).toBe("deviates");
    expect(ccOnly?.observed.text).toContain("no constant-voltage part");
  });

  it("judges a charge ended by time on its duration", () => {
    const timedCharge = { ...steps.charge, termination: { kind: "time" as const, duration: valueOf(7200, "s") } };
    const record = recordOf({ stepId: "charge", startedAt: "2026-03-02T08:00:00Z", endedAt: "2026-03-02T10:00:05Z" });
    expect(checkEndCondition(contextOf({ step: timedCharge, record }))[0]).toMatchObject({ outcome: "meets", observed: { value: 7205 } });
    const late = recordOf({ stepId: "charge", startedAt: "2026-03-02T08:00:00Z", endedAt: "2026-03-02T10:00:10Z" });
    expect(checkEndCondition(contextOf({ step: timedCharge, record: late }))[0]?.outcome).toBe("deviates");
  });

  it("cannot judge without a log; rests have no end condition", () => {
    expect(checkEndCondition(contextOf({ step: steps.discharge }))[0]?.outcome).toBe("not assessable");
    expect(checkEndCondition(contextOf({ step: steps.rest }))).toEqual([]);
  });
});
