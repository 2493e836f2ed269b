import { describe, expect, it } from "vitest";
import { findSetPointsOutsideRange } from "@/lib/runs/check-instrument-ranges";
import { resolveOrThrow } from "@/scenarios/rated-capacity-run";

// The invented 3 000 mAh cell of the fixtures: 0.2 It = 0.6 A discharge, charge at its standard current, 4.2 V.
const resolution = resolveOrThrow({});
const channel = (range: { current?: number; voltage?: number }) => ({
  kind: "cycler-channel",
  identifier: "CH-9",
  accuracy: {
    ...(range.current !== undefined && { current: { percentOfReading: 0.05, percentOfRange: 0.05, range: range.current } }),
    ...(range.voltage !== undefined && { voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: range.voltage } }),
  },
});

describe("findSetPointsOutsideRange", () => {
  it("accepts set-points inside the channel's ranges, the range's limit included", () => {
    const largest = Math.max(...resolution.steps.flatMap((s) => ("current" in s && s.current ? [s.current.value] : [])));
    expect(findSetPointsOutsideRange(resolution, [channel({ current: largest, voltage: 5 })])).toEqual([]);
  });

  it("names each step whose current or voltage is above the range, by number and title", () => {
    const problems = findSetPointsOutsideRange(resolution, [channel({ current: 0.5, voltage: 4 })]);
    const discharge = resolution.steps.find((s) => s.id === "discharge")!;
    expect(problems).toContain(`step ${discharge.index + 1} “${discharge.label}”: its discharge current of 0.6 A is above the 0.5 A current range of cycler channel CH-9`);
    expect(problems.some((p) => /charge voltage of 4\.2 V is above the 4 V voltage range/.test(p))).toBe(true);
  });

  it("does not judge an instrument that states no range, nor one that is not a cycler channel", () => {
    expect(findSetPointsOutsideRange(resolution, [channel({})])).toEqual([]);
    expect(findSetPointsOutsideRange(resolution, [{ ...channel({ current: 0.01 }), kind: "thermometer" }])).toEqual([]);
  });
});
