import { describe, expect, it } from "vitest";
import { evaluateCapacityUncertainty } from "@/lib/analysis/uncertainty";
import { evaluateConformity, type DecisionRule } from "@/lib/conformance/decision-rule";

// Source: REFERENCES.md §7 (ISO/IEC 17025:2017 7.8.6; ILAC-G8:09/2019; JCGM 106:2012): limit 100 % of 3.000 Ah,
// U = 1.16 % of the measured value (Example A of §6).
const table: [measuredAh: number, simple: string, guarded: string][] = [
  [3.06, "conforms", "conforms"],
  [3.02, "conforms", "not decided"],
  [3.0, "conforms", "not decided"],
  [2.99, "does not conform", "does not conform"],
];

function decide(measured: number, rule: DecisionRule) {
  return evaluateConformity({
    measured,
    limit: { side: "lower", value: 3.0 },
    rule,
    expandedUncertainty: 0.0116 * measured,
    unit: "Ah",
  });
}

describe("decision rule for a lower limit (REFERENCES.md §7 table)", () => {
  it.each(table)("%s Ah: simple acceptance %s, guarded acceptance %s", (measured, simple, guarded) => {
    const simpleResult = decide(measured, "simple acceptance");
    const guardedResult = decide(measured, "guarded acceptance");
    expect(simpleResult.ok && simpleResult.value.outcome).toBe(simple);
    expect(guardedResult.ok && guardedResult.value.outcome).toBe(guarded);
  });

  // The same table with U taken from the Example A budget itself (REFERENCES.md §6: 1.1605 %, made at each measured Q).
  it.each(table)("%s Ah with U from the Example A budget: simple %s, guarded %s", (measured, simple, guarded) => {
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
    for (const [rule, expected] of [["simple acceptance", simple], ["guarded acceptance", guarded]] as const) {
      const result = evaluateConformity({ measured, limit: { side: "lower", value: 3.0 }, rule, expandedUncertainty: budget.value.expandedUncertainty, unit: "Ah" });
      expect(result.ok && result.value.outcome).toBe(expected);
    }
  });

  it("states the rule applied in plain words", () => {
    // REFERENCES.md §7: the certificate states which rule was applied.
    const simple = decide(3.02, "simple acceptance");
    expect(simple.ok && simple.value.statement).toMatch(/^Decision rule: simple acceptance \(ILAC-G8:09\/2019, guard band zero\)/);
    const result = decide(3.02, "guarded acceptance");
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.statement).toContain("guarded acceptance");
    expect(result.value.statement).toContain("acceptance limit of 3.035 Ah");
    expect(result.value.statement).toMatch(/Measured 3\.020 Ah: not decided\.$/);
    expect(result.value.acceptanceLimit).toBeCloseTo(3.0 + 0.0116 * 3.02, 12);
  });
});

// The same table mirrored for an upper limit (a maximum DC resistance of 20.0 mΩ, U = 1.16 %): arithmetic from §7,
// not a published example.
describe("decision rule for an upper limit (mirror of the §7 table)", () => {
  const mirrored: [measuredOhm: number, simple: string, guarded: string][] = [
    [0.0196, "conforms", "conforms"],
    [0.0199, "conforms", "not decided"],
    [0.02, "conforms", "not decided"],
    [0.0201, "does not conform", "does not conform"],
  ];
  it.each(mirrored)("%s Ω: simple %s, guarded %s", (measured, simple, guarded) => {
    for (const [rule, expected] of [["simple acceptance", simple], ["guarded acceptance", guarded]] as const) {
      const result = evaluateConformity({ measured, limit: { side: "upper", value: 0.02 }, rule, expandedUncertainty: 0.0116 * measured, unit: "Ω", decimals: 5 });
      expect(result.ok && result.value.outcome).toBe(expected);
    }
  });
});

describe("decision rule input errors", () => {
  it("refuses guarded acceptance without an uncertainty, and a negative uncertainty", () => {
    const missing = evaluateConformity({ measured: 3, limit: { side: "lower", value: 3 }, rule: "guarded acceptance", unit: "Ah" });
    expect(missing.ok || missing.error.code).toBe("invalid-input");
    const negative = evaluateConformity({ measured: 3, limit: { side: "lower", value: 3 }, rule: "simple acceptance", expandedUncertainty: -1, unit: "Ah" });
    expect(negative.ok || negative.error.code).toBe("invalid-input");
  });
});
