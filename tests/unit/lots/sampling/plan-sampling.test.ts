import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { inspectionLevels, offeredAqlColumns, planSampling, type SamplingPlanInput } from "@/lib/lots/sampling";

const normal = (overrides: Partial<SamplingPlanInput>): SamplingPlanInput => ({
  lotSize: 400,
  inspectionLevel: "II",
  aql: 1.0,
  severity: "normal",
  ...overrides,
});

function errorOf(input: SamplingPlanInput) {
  const result = planSampling(input);
  expect(result.ok).toBe(false);
  return result.ok ? null : result.error;
}

describe("planSampling refuses impossible plans with a clear message", () => {
  it.each([0, -5, 2.5, Number.NaN])("lot size %s", (lotSize) => {
    const error = errorOf(normal({ lotSize }));
    expect(error?.field).toBe("lotSize");
    expect(error?.message).toContain("at least 1");
  });

  it("an AQL that is not a column of the table, naming the columns offered", () => {
    const error = errorOf(normal({ aql: 0.5 }));
    expect(error).toMatchObject({ field: "aql" });
    expect(error?.message).toContain("AQL 0.5 is not a column of Table 2-A");
    expect(error?.message).toContain("0.010, 0.015");
    expect(error?.message).toContain("6.5, 10.");
  });

  it("a standard AQL above 10, which is not offered", () => {
    expect(errorOf(normal({ aql: 25 }))?.message).toContain("does not offer");
  });

  it("an unknown inspection level", () => {
    expect(errorOf(normal({ inspectionLevel: "IV" as never }))).toMatchObject({ field: "inspectionLevel" });
  });

  it.each(["tightened", "reduced"] as const)("%s inspection: not offered yet", (severity) => {
    const error = errorOf(normal({ severity }));
    expect(error?.field).toBe("severity");
    expect(error?.message).toMatch(/inspection is not offered yet/);
  });
});

describe("planSampling", () => {
  it("takes AQLs written as the table heads them or as plain numbers", () => {
    const written = planSampling(normal({ aql: Number("1.0") }));
    const computed = planSampling(normal({ aql: 0.1 + 0.9 }));
    expect(written.ok && written.plan.aqlLabel).toBe("1.0");
    expect(computed.ok && computed.plan.aqlLabel).toBe("1.0");
  });

  it("explains each step in words, and inspects a small lot whole", () => {
    const result = planSampling(normal({ lotSize: 12, aql: 0.65 }));
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.plan.explanation).toEqual([
      "lot of 12 at level II → code letter B (Table 1)",
      "AQL 0.65 at B: arrow down past C, D, E → F, n = 20, Ac 0, Re 1 (Table 2-A)",
      "n ≥ lot size → inspect all 12",
    ]);
    expect(result.plan.source).toContain("ISO 2859-1");
  });

  it("reads a lot of 1 in Table 1's first range and inspects the one specimen", () => {
    const result = planSampling(normal({ lotSize: 1 }));
    expect(result.ok && result.plan).toMatchObject({ initialCodeLetter: "A", sampleSize: 1, hundredPercent: true });
    expect(result.ok && result.plan.explanation[0]).toContain("below Table 1's first range (2 to 8)");
    expect(result.ok && result.plan.explanation.at(-1)).toBe("n ≥ lot size → inspect the one specimen");
  });

  it("writes lot sizes with thousands spaced", () => {
    const result = planSampling(normal({ lotSize: 5000 }));
    expect(result.ok && result.plan.explanation[0]).toBe("lot of 5 000 at level II → code letter L (Table 1)");
  });

  const anyInput = fc.record({
    lotSize: fc.integer({ min: 1, max: 2_000_000 }),
    inspectionLevel: fc.constantFrom(...inspectionLevels),
    aql: fc.constantFrom(...offeredAqlColumns.map((c) => c.value)),
  });

  it("gives a plan for every lot size, level and offered AQL, never sampling more than the lot", () => {
    fc.assert(
      fc.property(anyInput, (input) => {
        const result = planSampling({ ...input, severity: "normal" });
        if (!result.ok) return false;
        const { plan } = result;
        expect(plan.rejectionNumber).toBe(plan.acceptanceNumber + 1);
        expect(plan.sampleSize).toBe(Math.min(plan.tableSampleSize, input.lotSize));
        expect(plan.hundredPercent).toBe(plan.tableSampleSize >= input.lotSize);
        expect(plan.arrow === "none").toBe(plan.codeLetter === plan.initialCodeLetter);
        return true;
      }),
      { seed: 2859, numRuns: 2000 },
    );
  });

  it("never asks a smaller sample of a larger lot at the same level and AQL", () => {
    fc.assert(
      fc.property(anyInput, fc.integer({ min: 1, max: 1_000_000 }), (input, extra) => {
        const small = planSampling({ ...input, severity: "normal" });
        const large = planSampling({ ...input, lotSize: input.lotSize + extra, severity: "normal" });
        return small.ok && large.ok && large.plan.tableSampleSize >= small.plan.tableSampleSize;
      }),
      { seed: 1999, numRuns: 2000 },
    );
  });
});
