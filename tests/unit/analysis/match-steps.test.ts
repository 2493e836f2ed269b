import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { matchSteps, type ExpectedStep, type MatchablePhase } from "@/lib/analysis/match-steps";

const pulse = { base: { from: 0, to: 1 }, pulse: { from: 2, to: 3 } };
const phase = (kind: MatchablePhase["kind"], withPulse = false): MatchablePhase => ({ kind, pulse: withPulse ? pulse : null });
const steps = (...kinds: ExpectedStep["kind"][]): ExpectedStep[] => kinds.map((kind, k) => ({ id: `s${k + 1}`, kind }));

describe("matchSteps", () => {
  it("matches a complete run one to one, in order", () => {
    const result = matchSteps(steps("charge", "rest", "pulse", "rest", "discharge"), [
      phase("charge"),
      phase("rest"),
      phase("discharge", true),
      phase("rest"),
      phase("discharge"),
    ]);
    expect(result.ok && result.value.steps.map((s) => s.phaseIndex)).toEqual([0, 1, 2, 3, 4]);
    expect(result.ok && result.value.unmatchedStepIds).toEqual([]);
    expect(result.ok && result.value.extraPhaseIndexes).toEqual([]);
  });

  it("reports a missing step and an extra phase", () => {
    const result = matchSteps(steps("charge", "rest", "discharge"), [phase("rest"), phase("charge"), phase("discharge"), phase("rest")]);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.unmatchedStepIds).toEqual(["s2"]);
    expect(result.value.extraPhaseIndexes).toEqual([0, 3]);
    expect(result.value.steps.map((s) => s.phaseIndex)).toEqual([1, null, 2]);
  });

  it("lets soak and measure take a rest or nothing, without calling them missing", () => {
    const result = matchSteps(steps("soak", "charge", "measure", "rest", "discharge"), [phase("charge"), phase("rest"), phase("discharge")]);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    // The one rest goes to the rest step, which wants it more than the measure step.
    expect(result.value.steps.map((s) => [s.stepId, s.phaseIndex, s.required])).toEqual([
      ["s1", null, false],
      ["s2", 0, true],
      ["s3", null, false],
      ["s4", 1, true],
      ["s5", 2, true],
    ]);
    expect(result.value.unmatchedStepIds).toEqual([]);
    const soaked = matchSteps(steps("soak", "charge"), [phase("rest"), phase("charge")]);
    expect(soaked.ok && soaked.value.steps[0]?.phaseIndex).toBe(0);
  });

  it("prefers two current levels for a pulse, and a plain discharge for a discharge step", () => {
    // A pulse from rest is a single-level discharge between two rests.
    const fromRest = matchSteps(steps("rest", "pulse", "rest"), [phase("rest"), phase("discharge"), phase("rest")]);
    expect(fromRest.ok && fromRest.value.steps.map((s) => s.phaseIndex)).toEqual([0, 1, 2]);
    const twoLevels = matchSteps(steps("pulse"), [phase("discharge"), phase("discharge", true)]);
    expect(twoLevels.ok && twoLevels.value.steps[0]?.phaseIndex).toBe(1);
    expect(matchSteps(steps("pulse"), [phase("rest")]).ok && matchSteps(steps("pulse"), [phase("rest")])).toMatchObject({
      value: { unmatchedStepIds: ["s1"] },
    });
    const both = matchSteps(steps("discharge", "pulse"), [phase("discharge", true), phase("discharge")]);
    // Matching both steps comes before match quality, so order decides here.
    expect(both.ok && both.value.steps.map((s) => s.phaseIndex)).toEqual([0, 1]);
    const oneDischarge = matchSteps(steps("discharge"), [phase("discharge", true), phase("discharge")]);
    expect(oneDischarge.ok && oneDischarge.value).toMatchObject({ steps: [{ phaseIndex: 1 }], extraPhaseIndexes: [0] });
    const ordered = matchSteps(steps("pulse", "discharge"), [phase("discharge", true), phase("discharge")]);
    expect(ordered.ok && ordered.value.steps.map((s) => s.phaseIndex)).toEqual([0, 1]);
  });

  it("matches every step of a run whose phases mirror the steps", () => {
    const kindArb = fc.constantFrom("charge", "discharge", "rest", "pulse" as const);
    fc.assert(
      fc.property(fc.array(kindArb, { maxLength: 40 }), (kinds) => {
        const phases = kinds.map((kind) => (kind === "pulse" ? phase("discharge", true) : phase(kind)));
        const result = matchSteps(steps(...kinds), phases);
        if (!result.ok) return false;
        return result.value.unmatchedStepIds.length === 0 && result.value.extraPhaseIndexes.length === 0;
      }),
    );
  });

  it("never pairs a step with a phase of the wrong kind and never reuses a phase", () => {
    const kindArb = fc.constantFrom<ExpectedStep["kind"]>("charge", "discharge", "rest", "pulse", "soak", "measure");
    const phaseArb = fc.record({ kind: fc.constantFrom<MatchablePhase["kind"]>("charge", "discharge", "rest"), withPulse: fc.boolean() });
    fc.assert(
      fc.property(fc.array(kindArb, { maxLength: 30 }), fc.array(phaseArb, { maxLength: 30 }), (kinds, drawn) => {
        const phases = drawn.map((p) => phase(p.kind, p.withPulse && p.kind !== "rest"));
        const result = matchSteps(steps(...kinds), phases);
        if (!result.ok) return false;
        const used = result.value.steps.flatMap((s) => (s.phaseIndex === null ? [] : [s.phaseIndex]));
        const increasing = used.every((index, k) => k === 0 || index > (used[k - 1] as number));
        const fits = result.value.steps.every((s) => {
          if (s.phaseIndex === null) return true;
          const p = phases[s.phaseIndex]!;
          if (s.kind === "soak" || s.kind === "measure" || s.kind === "rest") return p.kind === "rest";
          if (s.kind === "pulse") return p.kind !== "rest";
          return p.kind === s.kind;
        });
        return increasing && fits && used.length + result.value.extraPhaseIndexes.length === phases.length;
      }),
    );
  });
});
