import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { LogColumns } from "@/lib/analysis";
import { evaluateRun, listFindings, readCellRating, type RunEvaluationInput, type RunInstrument } from "@/lib/conformance";
import { procedureTemplates } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, logStartedAt, resolveOrThrow } from "@/scenarios/rated-capacity-run";

const lowRateCell = { ...inventedCell, maxContinuousDischargeCurrentA: 0.5, maxChargeCurrentA: undefined };
const cells = [inventedCell, lowRateCell];
const resolutions = procedureTemplates.flatMap((template) => cells.map((cell) => ({ cell, resolution: resolveOrThrow({ procedure: template.procedure, cell }) })));
const stepIds = [...new Set(resolutions.flatMap(({ resolution }) => resolution.steps.map((step) => step.id)))];
const cautionCodes = [...new Set(resolutions.flatMap(({ resolution }) => resolution.cautions.map((caution) => caution.code)))];
const nominalLog = buildRatedCapacityRun().log.columns;

const startMs = Date.parse(logStartedAt);
const timeArbitrary = fc.integer({ min: startMs - 3_600_000, max: startMs + 100_000_000 }).map((ms) => new Date(ms).toISOString());
const maybe = <T>(arbitrary: fc.Arbitrary<T>) => fc.option(arbitrary, { nil: undefined });
/** Instruments a run may name: a fully stated cycler channel, one that states no time accuracy, a thermometer. */
const instrumentChoices: RunInstrument[] = [
  { identifier: "CH-1", kind: "cycler-channel", accuracy: { current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 }, voltage: { percentOfReading: 0.02, percentOfRange: 0.02, range: 5 }, time: { ppm: 100 } } },
  { identifier: "CH-0", kind: "cycler-channel", accuracy: { current: { percentOfReading: 1, percentOfRange: 0, range: 5 }, voltage: { percentOfReading: 1, percentOfRange: 0, range: 5 } } },
  { identifier: "TH-1", kind: "thermometer", accuracy: { temperature: { halfWidth: 0.5 } } },
];
const positive = fc.double({ min: 1e-6, max: 50_000, noNaN: true, noDefaultInfinity: true });

/** Records a person could type: right or wrong steps, cycles, times, readings and set-points. */
const recordArbitrary = fc.record(
  {
    stepId: fc.constantFrom(...stepIds, "not-in-procedure"),
    cycle: fc.integer({ min: 1, max: 7 }),
    startedAt: timeArbitrary,
    endedAt: timeArbitrary,
    ambientReadings: fc.array(fc.record({ at: timeArbitrary, celsius: fc.double({ min: -60, max: 90, noNaN: true }) }), { maxLength: 3 }),
    programmed: fc.record(
      { current: positive, voltage: positive, endVoltage: positive, terminationCurrent: positive, duration: positive, maxDuration: positive, baseCurrent: positive, temperature: fc.double({ min: -50, max: 80, noNaN: true }) },
      { requiredKeys: [] },
    ),
    measured: fc.record({ acResistanceOhm: positive }, { requiredKeys: [] }),
    pauseReason: fc.constantFrom("power cut", "channel swap"),
    completed: fc.boolean(),
    acknowledgedCautionCodes: fc.subarray(cautionCodes),
  },
  { requiredKeys: ["stepId", "completed"] },
);

/** Small logs, some with time that does not increase (unusable). */
const smallLogArbitrary: fc.Arbitrary<LogColumns> = fc
  .array(fc.tuple(fc.double({ min: -1, max: 30, noNaN: true }), fc.double({ min: 2, max: 4.3, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true })), { maxLength: 60 })
  .map((rows) => {
    let t = 0;
    const times = rows.map(([dt]) => (t += dt));
    return {
      timeS: Float64Array.from(times),
      voltageV: Float64Array.from(rows, ([, v]) => v),
      currentA: Float64Array.from(rows, ([, , c]) => c),
      length: rows.length,
    };
  });

const inputArbitrary: fc.Arbitrary<RunEvaluationInput> = fc
  .record({
    pick: fc.nat({ max: resolutions.length - 1 }),
    stepRecords: fc.array(recordArbitrary, { maxLength: 14 }),
    log: fc.oneof(fc.constant(undefined), fc.constant(nominalLog), smallLogArbitrary),
    logStartedAt: maybe(timeArbitrary),
    options: maybe(fc.record({ gapAllowanceS: fc.integer({ min: 0, max: 10_000 }) }, { requiredKeys: [] })),
    decisionRule: fc.constantFrom("simple acceptance" as const, "binary guard band" as const, "non-binary guard band" as const),
    instruments: fc.subarray(instrumentChoices),
  })
  .map(({ pick, decisionRule, ...rest }) => {
    const chosen = resolutions[pick] ?? resolutions[0];
    if (!chosen) throw new Error("no resolutions");
    return {
      resolution: { ...chosen.resolution, decisionRule },
      instruments: rest.instruments,
      cellRating: readCellRating(chosen.cell),
      ...(rest.log !== undefined && { log: rest.log }),
      stepRecords: rest.stepRecords,
      ...(rest.logStartedAt !== undefined && { logStartedAt: rest.logStartedAt }),
      ...(rest.options !== undefined && { options: rest.options }),
    };
  });

describe("evaluateRun properties", () => {
  it("never throws, and gives the same output for the same input", () => {
    fc.assert(
      fc.property(inputArbitrary, (input) => {
        const first = evaluateRun(input);
        const second = evaluateRun(input);
        expect(JSON.stringify(second)).toBe(JSON.stringify(first));
        if (!first.ok) throw new Error(`valid records were refused: ${JSON.stringify(first.problems)}`);
        const findings = listFindings(first.evaluation);
        expect(new Set(findings.map((finding) => finding.id)).size).toBe(findings.length);
        const { procedureFollowed } = first.evaluation.verdict;
        const outcomes = new Set(findings.map((finding) => finding.outcome));
        expect(procedureFollowed === "no").toBe(outcomes.has("deviates"));
        expect(procedureFollowed === "yes").toBe(!outcomes.has("deviates") && !outcomes.has("not assessable"));

        // Budgets belong to logged discharge and pulse steps, and only a cycler channel gives them.
        const { evaluation } = first;
        if (!input.instruments?.some((instrument) => instrument.kind === "cycler-channel")) expect(evaluation.uncertainty).toEqual([]);
        for (const entry of evaluation.uncertainty) {
          const step = evaluation.steps.find((candidate) => candidate.stepId === entry.stepId && candidate.cycle === entry.cycle);
          expect(step?.kind).toBe(entry.quantity === "dc-resistance" ? "pulse" : "discharge");
          expect(entry.budget.expandedUncertainty).toBeGreaterThanOrEqual(0);
        }
        // Guarded acceptance guards: a conforming result clears its limit by U; without U nothing conforms.
        expect(evaluation.decisionRule).toBe(input.resolution.decisionRule);
        for (const result of evaluation.acceptance) {
          expect(result.rule).toBe(evaluation.decisionRule);
          if (evaluation.decisionRule === "simple acceptance" || result.outcome !== "conforms") continue;
          expect(result.expandedUncertainty).not.toBeNull();
          const { limit, measured } = result;
          if (limit?.value === undefined || measured?.value === undefined || result.expandedUncertainty === null) throw new Error("a conforming result has a limit, a value and U");
          const clearance = (limit.side === "lower" ? 1 : -1) * (measured.value - limit.value);
          expect(clearance).toBeGreaterThanOrEqual(result.expandedUncertainty - 1e-12);
        }
      }),
      { numRuns: 120 },
    );
  }, 30_000);

  it("refuses junk records with field paths, never an exception", () => {
    // Junk handed in as if it were an input, the way an unchecked caller would.
    const pretendInput = (junk: unknown) => junk as Parameters<typeof evaluateRun>[0];
    fc.assert(
      fc.property(fc.array(fc.anything(), { minLength: 1, maxLength: 4 }), fc.anything(), (stepRecords, logStartedAt) => {
        const input = pretendInput({ resolution: resolutions[0]?.resolution, cellRating: readCellRating(inventedCell), stepRecords, logStartedAt });
        const result = evaluateRun(input);
        if (!result.ok) expect(result.problems.every((problem) => typeof problem.path === "string" && problem.message.length > 0)).toBe(true);
      }),
      { numRuns: 200 },
    );
    expect(() => evaluateRun(pretendInput(null))).not.toThrow();
    expect(evaluateRun(pretendInput("run")).ok).toBe(false);
  }, 30_000);
});
