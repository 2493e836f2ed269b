import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { LogColumns } from "@/lib/analysis";
import { evaluateRun, listFindings, readCellRating, type RunEvaluationInput } from "@/lib/conformance";
import { procedureTemplates } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, logStartedAt, resolveOrThrow } from "../../support/rated-capacity-run";

const lowRateCell = { ...inventedCell, maxContinuousDischargeCurrentA: 0.5, maxChargeCurrentA: undefined };
const cells = [inventedCell, lowRateCell];
const resolutions = procedureTemplates.flatMap((template) => cells.map((cell) => ({ cell, resolution: resolveOrThrow({ procedure: template.procedure, cell }) })));
const stepIds = [...new Set(resolutions.flatMap(({ resolution }) => resolution.steps.map((step) => step.id)))];
const cautionCodes = [...new Set(resolutions.flatMap(({ resolution }) => resolution.cautions.map((caution) => caution.code)))];
const nominalLog = buildRatedCapacityRun().log.columns;

const startMs = Date.parse(logStartedAt);
const timeArbitrary = fc.integer({ min: startMs - 3_600_000, max: startMs + 100_000_000 }).map((ms) => new Date(ms).toISOString());
const maybe = <T>(arbitrary: fc.Arbitrary<T>) => fc.option(arbitrary, { nil: undefined });
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
    options: maybe(
      fc.record(
        {
          gapAllowanceS: fc.integer({ min: 0, max: 10_000 }),
          decisionRule: fc.constantFrom("simple acceptance" as const, "guarded acceptance" as const),
          uncertainties: fc.constant({ "rated-capacity": { relativeExpanded: 0.0116 } }),
        },
        { requiredKeys: [] },
      ),
    ),
  })
  .map(({ pick, ...rest }) => {
    const chosen = resolutions[pick] ?? resolutions[0];
    if (!chosen) throw new Error("no resolutions");
    return {
      resolution: chosen.resolution,
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
      }),
      { numRuns: 120 },
    );
  }, 30_000);

  it("refuses junk records with field paths, never an exception", () => {
    fc.assert(
      fc.property(fc.array(fc.anything(), { minLength: 1, maxLength: 4 }), fc.anything(), (stepRecords, logStartedAt) => {
        const input = { resolution: resolutions[0]?.resolution, cellRating: readCellRating(inventedCell), stepRecords, logStartedAt } as unknown as RunEvaluationInput;
        const result = evaluateRun(input);
        if (!result.ok) expect(result.problems.every((problem) => typeof problem.path === "string" && problem.message.length > 0)).toBe(true);
      }),
      { numRuns: 200 },
    );
    expect(() => evaluateRun(null as unknown as RunEvaluationInput)).not.toThrow();
    expect(evaluateRun("run" as unknown as RunEvaluationInput).ok).toBe(false);
  }, 30_000);
});
