import { describe, expect, it } from "vitest";
import { estimateStopCycle, findStopCycle, toRetentionPoints, type RetentionPoint } from "@/lib/analysis/retention-trend";

/** A straight fade: 98 % at cycle 1, 0.03 % of rated lost per cycle. It reaches 80 % at 1 + 18 / 0.03 = cycle 601. */
const linearFade = (cycles: number): RetentionPoint[] => Array.from({ length: cycles }, (_, k) => ({ cycle: k + 1, retentionPercent: 98 - 0.03 * k }));

describe("the retention trend", () => {
  it("gives retention as discharge capacity over rated", () => {
    expect(toRetentionPoints([{ cycle: 1, dischargeAh: 2.4 }], 3000)).toEqual([{ cycle: 1, retentionPercent: 80 }]);
  });

  it("estimates the crossing of a known straight fade, with the fit it used", () => {
    const estimate = estimateStopCycle(linearFade(200), 80);
    expect(estimate.kind).toBe("estimate");
    if (estimate.kind !== "estimate") return;
    // (80 − 98.03) / −0.03 = 601 (intercept at cycle 0 is 98.03 %): cycle 601 sits on 80 %, 602 is the first below.
    expect(estimate.cycle).toBe(602);
    expect(estimate.fit.slopePercentPerCycle).toBeCloseTo(-0.03, 10);
    expect(estimate.fit.interceptPercent).toBeCloseTo(98.03, 8);
    expect(estimate.fit.rSquared).toBeCloseTo(1, 10);
    // Only the latest 100 cycles are fitted.
    expect([estimate.fit.fromCycle, estimate.fit.toCycle, estimate.fit.points]).toEqual([101, 200, 100]);
  });

  it("gives no estimate from too few cycles or without a fade", () => {
    expect(estimateStopCycle(linearFade(4), 80)).toEqual({ kind: "too-few-cycles", needed: 5, have: 4 });
    const flat = Array.from({ length: 20 }, (_, k) => ({ cycle: k + 1, retentionPercent: 95 + (k % 2) * 0.1 }));
    expect(estimateStopCycle(flat, 80).kind).toBe("not-fading");
  });

  it("finds the first checked cycle below the stop share, or the cycle limit", () => {
    const points = linearFade(700);
    expect(findStopCycle(points, { stopBelowPercentOfRated: 80, checkEveryCycles: 1, maxCycles: null })).toEqual({ cycle: 602, kind: "below-share", retentionPercent: expect.closeTo(79.97, 9) });
    // Checked every 50 cycles: 650 is the first check below 80 %.
    expect(findStopCycle(points, { stopBelowPercentOfRated: 80, checkEveryCycles: 50, maxCycles: null })?.cycle).toBe(650);
    expect(findStopCycle(points, { stopBelowPercentOfRated: 80, checkEveryCycles: 1, maxCycles: 400 })).toEqual({ cycle: 400, kind: "cycle-limit" });
    expect(findStopCycle(linearFade(100), { stopBelowPercentOfRated: 80, checkEveryCycles: 1, maxCycles: 500 })).toBeNull();
  });
});
