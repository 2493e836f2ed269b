import { describe, expect, it } from "vitest";
import { checkCurrentHold } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, steps } from "./context-fixtures";

/** A discharge of n samples at -current, with a few samples replaced. */
function discharge(n: number, currentA: number, stray: Record<number, number> = {}) {
  return logOf(levelOf(n, (k) => 3.9 - k * 0.001, (k) => stray[k] ?? -currentA));
}

describe("checkCurrentHold", () => {
  it("meets when the discharge current stays within ±1 % of 0.6 A", () => {
    const [finding] = checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(discharge(200, 0.603)) }));
    expect(finding).toMatchObject({ rule: "current-held", outcome: "meets", observed: { unit: "A" } });
    expect(finding?.observed.value).toBeCloseTo(0.603, 12);
  });

  it("deviates when the mean is off, and when too many samples stray", () => {
    expect(checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(discharge(200, 0.61)) }))[0]?.outcome).toBe("deviates");
    // 2 of 200 samples (1 %) at 0.7 A pass the default 2 % allowance; 6 of 200 (3 %) do not.
    const few = discharge(200, 0.6, { 50: -0.7, 51: -0.7 });
    const many = discharge(200, 0.6, Object.fromEntries([50, 51, 52, 120, 121, 122].map((k) => [k, -0.7])));
    expect(checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(few) }))[0]?.outcome).toBe("meets");
    const strayed = checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(many) }))[0];
    expect(strayed?.outcome).toBe("deviates");
    expect(strayed?.observed.text).toContain("6 outside the tolerance (3 %)");
    const lenient = checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(many), options: { currentOutlierShare: 0.05 } }));
    expect(lenient[0]?.outcome).toBe("meets");
  });

  it("judges a charge over its constant-current part only", () => {
    // CC at 1.5 A while the voltage rises, then CV at 4.2 V with the current decaying.
    const cc = levelOf(100, (k) => 3.7 + k * 0.004, 1.5);
    const cv = levelOf(100, 4.2, (k) => 1.5 * Math.exp(-k / 30));
    const [finding] = checkCurrentHold(contextOf({ step: steps.charge, evidence: evidenceOf(logOf([...cc, ...cv])) }));
    expect(finding).toMatchObject({ outcome: "meets" });
    expect(finding?.observed.value).toBeCloseTo(1.5, 9);
  });

  it("deviates for a discharge that changes level, and judges each pulse level", () => {
    const stepped = logOf([...levelOf(50, 3.9, -0.6), ...levelOf(10, 3.85, -3)]);
    expect(checkCurrentHold(contextOf({ step: steps.discharge, evidence: evidenceOf(stepped) }))[0]?.outcome).toBe("deviates");
    const pulse = checkCurrentHold(contextOf({ step: steps.pulse, evidence: evidenceOf(stepped, { pulse: true }) }));
    expect(pulse.map((f) => [f.id, f.outcome])).toEqual([
      ["pulse#1/current-held/baseCurrent", "meets"],
      ["pulse#1/current-held/pulseCurrent", "meets"],
    ]);
    const single = checkCurrentHold(contextOf({ step: steps.pulse, evidence: evidenceOf(discharge(50, 0.6), { pulse: true }) }));
    expect(single.map((f) => f.outcome)).toEqual(["deviates", "deviates"]);
  });

  it("cannot judge without a log; rests carry no current check", () => {
    expect(checkCurrentHold(contextOf({ step: steps.discharge }))[0]).toMatchObject({ outcome: "not assessable", observed: { text: "no data log was uploaded" } });
    expect(checkCurrentHold(contextOf({ step: steps.rest }))).toEqual([]);
  });
});
