import { describe, expect, it } from "vitest";
import { checkCurrentHold, checkPulseTiming } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, steps } from "./context-fixtures";

/**
 * A synthetic DC resistance pulse (IEC 61960-3 7.7 shape, docs/references.md §4, recalled): a rest, then
 * 0.6 A for `baseS`, then 3 A for `pulseS`, then a rest, sampled every `dtS`. Rdc 20 mΩ: U1 3.9000 V, U2 3.8520 V.
 */
function pulseLog({ baseS, pulseS, dtS }: { baseS: number; pulseS: number; dtS: number }) {
  const n = (s: number) => Math.round(s / dtS);
  const rows = [...levelOf(n(5), 3.912, 0), ...levelOf(n(baseS), 3.9, -0.6), ...levelOf(n(pulseS), 3.852, -3), ...levelOf(n(5), 3.91, 0)];
  return logOf(rows, rows.map((_, k) => k * dtS));
}

describe("checkPulseTiming (issue 12, 3d)", () => {
  it("meets when each level lasted as programmed at 0.1 s sampling, U1 and U2 read at the end of their levels", () => {
    const findings = checkPulseTiming(contextOf({ step: steps.pulse, evidence: evidenceOf(pulseLog({ baseS: 10, pulseS: 1, dtS: 0.1 }), { phaseIndex: 1, pulse: true }) }));
    expect(findings.map((f) => [f.id, f.outcome])).toEqual([
      ["pulse#1/pulse-timing/base", "meets"],
      ["pulse#1/pulse-timing/pulse", "meets"],
    ]);
    expect(findings[0]?.observed.value).toBeCloseTo(10, 6);
    expect(findings[1]?.observed.value).toBeCloseTo(1, 6);
    expect(findings[1]?.observed.text).toContain("U2 read at its last sample");
  });

  it("deviates when the pulse lasted 2 s where 1 s is programmed (the old checks looked at the current levels only)", () => {
    const evidence = evidenceOf(pulseLog({ baseS: 10, pulseS: 2, dtS: 0.1 }), { phaseIndex: 1, pulse: true });
    // Before: both current levels held → meets.
    expect(checkCurrentHold(contextOf({ step: steps.pulse, evidence })).map((f) => f.outcome)).toEqual(["meets", "meets"]);
    const [base, pulse] = checkPulseTiming(contextOf({ step: steps.pulse, evidence }));
    expect(base?.outcome).toBe("meets");
    expect(pulse?.outcome).toBe("deviates");
    expect(pulse?.observed.value).toBeCloseTo(2, 9);
  });

  it("a log sampled every 1 s cannot show a 1 s pulse: not assessable with the reason, where the current check said 'deviates'", () => {
    const evidence = evidenceOf(pulseLog({ baseS: 10, pulseS: 1, dtS: 1 }), { phaseIndex: 1, pulse: true });
    expect(evidence.kind === "found" && evidence.dcResistance).toBe(null);
    const held = checkCurrentHold(contextOf({ step: steps.pulse, evidence }));
    expect(held.map((f) => f.outcome)).toEqual(["not assessable", "not assessable"]);
    expect(held[1]?.observed.text).toBe(
      "the log was sampled every 1 s, too slowly to see a level of 1 s: it needs at least 3 samples, one every 0.333 s or faster",
    );
    expect(checkPulseTiming(contextOf({ step: steps.pulse, evidence })).map((f) => f.outcome)).toEqual(["not assessable", "not assessable"]);
  });

  it("judges pulse steps only, and needs the log", () => {
    expect(checkPulseTiming(contextOf({ step: steps.discharge }))).toEqual([]);
    expect(checkPulseTiming(contextOf({ step: steps.pulse })).map((f) => f.outcome)).toEqual(["not assessable", "not assessable"]);
  });
});
