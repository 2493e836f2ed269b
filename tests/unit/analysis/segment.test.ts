import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { matchSteps } from "@/lib/analysis/match-steps";
import { segment, type Phase } from "@/lib/analysis/segment";
import { computeStepResults } from "@/lib/analysis/step-results";
import { generateSyntheticLog } from "@/lib/analysis/synthetic-log";
import { createLog } from "./log-arbitrary";
import { arbitraryPlan } from "./synthetic-plan";

/** A log from runs of (samples, current, voltage) at 1 s spacing. */
function createRunLog(runs: [samples: number, currentA: number, voltageV: number | ((k: number) => number)][]) {
  const samples: { t: number; v: number; i: number }[] = [];
  for (const [count, currentA, voltage] of runs) {
    for (let k = 0; k < count; k++) {
      samples.push({ t: samples.length, v: typeof voltage === "number" ? voltage : voltage(k), i: currentA });
    }
  }
  return createLog(samples);
}

const spans = (phases: Phase[]) => phases.map((p) => [p.kind, p.from, p.to]);

describe("segment", () => {
  it("splits by the sign and size of the current, covering the log without gaps", () => {
    const log = createRunLog([
      [10, 0, 3.6],
      [20, 1.5, 3.9],
      [10, 0.005, 3.95],
      [30, -0.6, 3.7],
    ]);
    const result = segment(log);
    expect(result.ok && spans(result.value)).toEqual([
      ["rest", 0, 9],
      ["charge", 10, 29],
      ["rest", 30, 39],
      ["discharge", 40, 69],
    ]);
    expect(result.ok && result.value[1]).toMatchObject({ startS: 10, endS: 29 });
  });

  it("merges a glitch into its neighbours, and keeps it when the glitch limit allows it", () => {
    const log = createRunLog([
      [10, 0, 3.6],
      [2, -0.5, 3.5],
      [10, 0, 3.6],
    ]);
    const merged = segment(log);
    expect(merged.ok && spans(merged.value)).toEqual([["rest", 0, 21]]);
    const kept = segment(log, { minPhaseSamples: 1 });
    expect(kept.ok && kept.value.map((p) => p.kind)).toEqual(["rest", "discharge", "rest"]);
  });

  it("merges chatter around the rest threshold and a short run at the start of the log", () => {
    const chatter = Array.from({ length: 8 }, (_, k) => [1, k % 2 === 0 ? 0.02 : 0, 3.6] as [number, number, number]);
    const log = createRunLog([[2, -1, 3.5], [10, 0, 3.6], ...chatter, [10, 0, 3.6], [15, 1, 3.8]]);
    const result = segment(log);
    expect(result.ok && spans(result.value)).toEqual([
      ["rest", 0, 29],
      ["charge", 30, 44],
    ]);
  });

  it("uses a duration limit for glitches when asked", () => {
    const log = createRunLog([
      [10, 0, 3.6],
      [4, -0.5, 3.5],
      [10, 0, 3.6],
    ]);
    const byDuration = segment(log, { minPhaseDurationS: 5 });
    expect(byDuration.ok && byDuration.value.length).toBe(1);
  });

  it("splits a CC-CV charge into its CC and CV parts", () => {
    const cc = 20;
    const log = createRunLog([
      [5, 0, 3.6],
      [cc, 1.5, (k) => 3.9 + (0.3 * (k + 1)) / cc],
      [30, Number.NaN, 4.2],
      [5, 0, 4.15],
    ]);
    // CV current decays from 1.4 A to 0.1 A over 30 samples.
    for (let k = 0; k < 30; k++) log.currentA[5 + cc + k] = 1.4 * Math.exp((Math.log(0.1 / 1.4) * k) / 29);
    const result = segment(log);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const charge = result.value[1]!;
    expect(charge.kind).toBe("charge");
    if (charge.kind !== "charge") return;
    // The last CC sample already sits at 4.2 V, on the plateau within 10 mV.
    expect(charge.constantCurrent).toEqual({ from: 5, to: 23 });
    expect(charge.constantVoltage).toEqual({ from: 24, to: 54 });
    expect(charge.pulse).toBeNull();
  });

  it("finds the whole CV part through voltage noise and a spike", () => {
    const log = generateSyntheticLog({
      cell: { capacityMAh: 3000, seriesResistanceOhm: 0.03, initialSoc: 0.3 },
      steps: [
        { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.06 },
        { kind: "rest", durationS: 600 },
      ],
      seed: 21,
      sampleIntervalS: 2,
      noise: { voltageV: 0.002 },
    });
    expect(log.ok).toBe(true);
    if (!log.ok) return;
    const { columns } = log.value;
    columns.voltageV[log.value.steps[0]!.to - 40] = 4.25;
    const phases = segment(columns);
    const charge = phases.ok ? phases.value[0] : undefined;
    expect(charge?.kind).toBe("charge");
    if (charge?.kind !== "charge" || !charge.constantVoltage) throw new Error("no CV part found");
    // CV starts where the current starts to fall from 1.5 A, not somewhere later in the decay …
    expect(columns.currentA[charge.constantVoltage.from]).toBeGreaterThan(1.45);
    // … and the CC part holds no decaying samples.
    const cc = computeStepResults(columns, charge);
    expect(cc.ok && cc.value.constantCurrent?.standardDeviationA).toBeLessThan(0.002);
  });

  it("finds no CV part in a CC-only charge that stops at the voltage limit", () => {
    const log = createRunLog([
      [5, 0, 3.6],
      [40, 1.5, (k) => 3.8 + 0.01 * k],
      [5, 0, 4.1],
    ]);
    const result = segment(log);
    const charge = result.ok ? result.value[1] : undefined;
    expect(charge).toMatchObject({ kind: "charge", constantCurrent: { from: 5, to: 44 }, constantVoltage: null });
  });

  it("returns typed errors for an empty log, time running backwards and bad options", () => {
    const empty = segment(createLog([]));
    expect(empty.ok || empty.error.code).toBe("invalid-input");
    const backwards = segment(createLog([{ t: 0, v: 3, i: 0 }, { t: -1, v: 3, i: 0 }]));
    expect(backwards.ok || backwards.error.code).toBe("time-not-increasing");
    const badOption = segment(createRunLog([[3, 0, 3]]), { cvMinCurrentDrop: 1.5 });
    expect(badOption.ok || badOption.error.code).toBe("invalid-input");
  });

  it("recovers the programmed steps of synthetic logs, sample for sample", () => {
    fc.assert(
      fc.property(arbitraryPlan, ({ options, expected, terminationA }) => {
        const log = generateSyntheticLog(options);
        if (!log.ok) throw new Error(log.error.message);
        const phases = segment(log.value.columns);
        if (!phases.ok) throw new Error(phases.error.message);
        const matching = matchSteps(expected, phases.value);
        if (!matching.ok) throw new Error(matching.error.message);
        expect(matching.value.unmatchedStepIds).toEqual([]);
        expect(matching.value.extraPhaseIndexes).toEqual([]);
        matching.value.steps.forEach((step, k) => {
          const phase = phases.value[step.phaseIndex!]!;
          const truth = log.value.steps[k]!;
          expect([phase.from, phase.to]).toEqual([truth.from, truth.to]);
          if (phase.kind === "charge") {
            expect(phase.constantCurrent).not.toBeNull();
            expect(phase.constantVoltage).not.toBeNull();
            const results = computeStepResults(log.value.columns, phase);
            // The step ends at the first sample at or under the termination current (noise 0.5 mA); with a
            // small resistance the CV current decays fast, so one sample interval may take it well under.
            const endCurrent = results.ok ? results.value.cvTerminationCurrentA : null;
            expect(endCurrent).toBeLessThanOrEqual(terminationA + 0.003);
            expect(endCurrent).toBeGreaterThan(terminationA * 0.5);
          }
        });
      }),
      { numRuns: 25 },
    );
  });
});
