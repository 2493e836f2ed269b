import { describe, expect, it } from "vitest";
import { checkInstrumentTolerances, type RunInstrument } from "@/lib/conformance";
import { ratedCapacityAt20cTemplate, resolveProcedure } from "@/protocols";
import { inventedCell } from "@/scenarios/rated-capacity-run";

// IEC 61960-3 clause 4 measurement tolerances, docs/references.md §3 (recalled for 61960-3; published via IEC 61951-2:2022
// clause 4): current ±1 %, voltage ±1 %, time ±0.1 %, temperature ±2 °C, all sources of error included.
const resolved = resolveProcedure({ procedure: ratedCapacityAt20cTemplate, cellSpecification: inventedCell });
if (!resolved.ok) throw new Error("the template resolves on the invented cell");
const resolution = resolved.resolution;

const channel = (current: RunInstrument["accuracy"]["current"], ppm = 100): RunInstrument => ({
  identifier: "CH-1",
  kind: "cycler-channel",
  accuracy: { current, voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 }, time: { ppm } },
});

describe("checkInstrumentTolerances (issue 12, 2)", () => {
  it("meets for a channel of ±(0.05 % + 0.05 % of 5 A): 0.467 % at 0.6 A (arithmetic)", () => {
    const finding = checkInstrumentTolerances([channel({ percentOfReading: 0.05, percentOfRange: 0.05, range: 5 })], resolution, null)!;
    expect(finding).toMatchObject({ rule: "instruments-meet-tolerances", outcome: "meets" });
  });

  it("flags a channel of ±(0.1 % + 0.1 % of 20 A) at 0.6 A: 0.1 + 3.333 = 3.433 % > 1 % (arithmetic)", () => {
    const finding = checkInstrumentTolerances([channel({ percentOfReading: 0.1, percentOfRange: 0.1, range: 20 })], resolution, null)!;
    expect(finding.outcome).toBe("deviates");
    expect(finding.observed.text).toContain("CH-1: ±3.433 % at 0.6 A");
    expect(finding.clause).toContain("IEC 61960-3 clause 4 (recalled");
  });

  it("flags a time base of 2 000 ppm (0.2 % > 0.1 %), and a thermometer of ±3 °C (> 2 °C)", () => {
    const slow = checkInstrumentTolerances([channel({ percentOfReading: 0.05, percentOfRange: 0.05, range: 5 }, 2000)], resolution, null)!;
    expect(slow.observed.text).toContain("time ±0.2 %, more than the ±0.1 % allowed");
    const thermometer: RunInstrument = { identifier: "TH-1", kind: "thermometer", accuracy: { temperature: { halfWidth: 3 } } };
    expect(checkInstrumentTolerances([thermometer], resolution, null)).toMatchObject({ outcome: "deviates", observed: { text: "TH-1: ±3 °C, more than the ±2 °C allowed" } });
  });

  it("makes no finding when no accuracy is stated (the budget says it is not evaluated)", () => {
    const bare: RunInstrument = { identifier: "CH-2", kind: "cycler-channel", accuracy: {} };
    expect(checkInstrumentTolerances([bare], resolution, null)).toBeNull();
  });
});
