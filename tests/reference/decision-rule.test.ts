import { describe, expect, it } from "vitest";
import { evaluateCapacityUncertainty } from "@/lib/analysis/uncertainty";
import { evaluateConformity, type DecisionRule } from "@/lib/conformance/decision-rule";

// Source: ILAC-G8:09/2019 clause 4.2 [published; clause numbers and outcome words checked against a public
// copy of the guide, pages 9–10]: 4.2.1 binary statement for simple acceptance (w = 0, pass / fail),
// 4.2.2 binary statement with guard band (AL = TL moved inward by w, pass / fail), 4.2.3 non-binary
// statement with guard band (pass / conditional pass / conditional fail / fail). Here w = U (k = 2).
// Worked table: docs/references.md §7, TL = 3.000 Ah (lower limit, 100 % of rated), U = 1.1605 % of the measured
// value (Example A of §6, JCGM 100 arithmetic). Our words: "conforms" for the guide's pass, "does not
// conform" for its fail.
const U_RELATIVE = 0.011605;
const table: [measuredAh: number, simple: string, binary: string, nonBinary: string][] = [
  [3.06, "conforms", "conforms", "conforms"],
  [3.02, "conforms", "does not conform", "conditional pass"],
  [3.0, "conforms", "does not conform", "conditional pass"],
  [2.99, "does not conform", "does not conform", "conditional fail"],
  [2.95, "does not conform", "does not conform", "does not conform"],
];

function decide(measured: number, rule: DecisionRule, uRelative = U_RELATIVE) {
  return evaluateConformity({ measured, limit: { side: "lower", value: 3.0 }, rule, expandedUncertainty: uRelative * measured, unit: "Ah" });
}

function outcomeOf(result: ReturnType<typeof decide>): string {
  if (!result.ok) throw new Error(result.error.message);
  return result.value.outcome;
}

describe("ILAC-G8:09/2019 4.2 decision rules for a lower limit (docs/references.md §7 worked table)", () => {
  it.each(table)("%s Ah: 4.2.1 simple %s; 4.2.2 binary w = U %s; 4.2.3 non-binary %s", (measured, simple, binary, nonBinary) => {
    expect(outcomeOf(decide(measured, "simple acceptance"))).toBe(simple);
    expect(outcomeOf(decide(measured, "binary guard band"))).toBe(binary);
    expect(outcomeOf(decide(measured, "non-binary guard band"))).toBe(nonBinary);
  });

  // The same table with U taken from the Example A budget itself (docs/references.md §6: 1.1605 %, made at each measured Q).
  it.each(table)("%s Ah with U from the Example A budget: %s / %s / %s", (measured, simple, binary, nonBinary) => {
    const budget = evaluateCapacityUncertainty({
      capacityAh: measured,
      currentA: 0.6,
      durationS: (measured / 0.6) * 3600,
      sources: [
        { quantity: "current", source: "clause 4 current", tolerance: { form: "percent-of-reading", percent: 1 } },
        { quantity: "time", source: "clause 4 time", tolerance: { form: "percent-of-reading", percent: 0.1 } },
      ],
    });
    if (!budget.ok) throw new Error(budget.error.message);
    for (const [rule, expected] of [["simple acceptance", simple], ["binary guard band", binary], ["non-binary guard band", nonBinary]] as const) {
      const result = evaluateConformity({ measured, limit: { side: "lower", value: 3.0 }, rule, expandedUncertainty: budget.value.expandedUncertainty, unit: "Ah" });
      expect(outcomeOf(result)).toBe(expected);
    }
  });

  it("the binary rule with a guard band has no third outcome (ILAC-G8:09/2019 4.2.2)", () => {
    for (let q = 2.9; q <= 3.1; q += 0.001) expect(["conforms", "does not conform"]).toContain(outcomeOf(decide(q, "binary guard band")));
  });

  it("names each rule with its clause in the statement, and its acceptance limit", () => {
    const simple = decide(3.02, "simple acceptance");
    expect(simple.ok && simple.value.statement).toMatch(/^Decision rule: simple acceptance \(binary statement, guard band w = 0\) \(ILAC-G8:09\/2019 4\.2\.1\)\./);
    const binary = decide(3.02, "binary guard band");
    if (!binary.ok) throw new Error("refused");
    expect(binary.value.statement).toContain("binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)");
    expect(binary.value.statement).toContain("acceptance limit of 3.035 Ah");
    expect(binary.value.statement).toMatch(/Measured 3\.020 Ah: does not conform\.$/);
    expect(binary.value.acceptanceLimit).toBeCloseTo(3.0 + U_RELATIVE * 3.02, 12);
    const nonBinary = decide(2.99, "non-binary guard band");
    if (!nonBinary.ok) throw new Error("refused");
    expect(nonBinary.value.statement).toContain("(ILAC-G8:09/2019 4.2.3)");
    expect(nonBinary.value.statement).toMatch(/Measured 2\.990 Ah: conditional fail\.$/);
  });
});

// The same table mirrored for an upper limit (a maximum DC resistance of 20.0 mΩ, U = 1.1605 %): arithmetic from
// ILAC-G8:09/2019 4.2 (figures 3–5 are drawn for an upper limit), not a published numeric example.
describe("ILAC-G8:09/2019 4.2 decision rules for an upper limit (mirror of the §7 table)", () => {
  const mirrored: [measuredOhm: number, simple: string, binary: string, nonBinary: string][] = [
    [0.0196, "conforms", "conforms", "conforms"],
    [0.0199, "conforms", "does not conform", "conditional pass"],
    [0.02, "conforms", "does not conform", "conditional pass"],
    [0.0201, "does not conform", "does not conform", "conditional fail"],
    [0.0205, "does not conform", "does not conform", "does not conform"],
  ];
  it.each(mirrored)("%s Ω: %s / %s / %s", (measured, simple, binary, nonBinary) => {
    for (const [rule, expected] of [["simple acceptance", simple], ["binary guard band", binary], ["non-binary guard band", nonBinary]] as const) {
      const result = evaluateConformity({ measured, limit: { side: "upper", value: 0.02 }, rule, expandedUncertainty: U_RELATIVE * measured, unit: "Ω", decimals: 5 });
      expect(result.ok && result.value.outcome).toBe(expected);
    }
  });
});

describe("decision rule input errors", () => {
  it("refuses a guard-band rule without an uncertainty, and a negative uncertainty", () => {
    for (const rule of ["binary guard band", "non-binary guard band"] as const) {
      const missing = evaluateConformity({ measured: 3, limit: { side: "lower", value: 3 }, rule, unit: "Ah" });
      expect(missing.ok || missing.error.code).toBe("invalid-input");
    }
    const negative = evaluateConformity({ measured: 3, limit: { side: "lower", value: 3 }, rule: "simple acceptance", expandedUncertainty: -1, unit: "Ah" });
    expect(negative.ok || negative.error.code).toBe("invalid-input");
  });
});
