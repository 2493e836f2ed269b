import { describe, expect, it } from "vitest";
import { planSampling, table2aSampleSizes, type CodeLetter, type InspectionLevel, type SamplingPlan } from "@/lib/lots/sampling";

function plan(lotSize: number, aql: number, inspectionLevel: InspectionLevel = "II"): SamplingPlan {
  const result = planSampling({ lotSize, aql, inspectionLevel, severity: "normal" });
  if (!result.ok) throw new Error(result.error.message);
  return result.plan;
}

// Source: docs/references.md §10 [published]: ISO 2859-1 Table 1 and Table 2-A, general inspection level II,
// normal inspection (the same tables in ANSI/ASQ Z1.4 and MIL-STD-105E). Both ends of every range.
const levelTwo: [from: number, to: number | null, codeLetter: CodeLetter, n: number][] = [
  [2, 8, "A", 2],
  [9, 15, "B", 3],
  [16, 25, "C", 5],
  [26, 50, "D", 8],
  [51, 90, "E", 13],
  [91, 150, "F", 20],
  [151, 280, "G", 32],
  [281, 500, "H", 50],
  [501, 1200, "J", 80],
  [1201, 3200, "K", 125],
  [3201, 10000, "L", 200],
  [10001, 35000, "M", 315],
  [35001, 150000, "N", 500],
  [150001, 500000, "P", 800],
  [500001, null, "Q", 1250],
];

describe("Table 1 at general inspection level II (docs/references.md §10, published)", () => {
  it.each(levelTwo)("lot %s to %s → code letter %s", (from, to, codeLetter) => {
    for (const lotSize of [from, to ?? 2_000_000]) expect(plan(lotSize, 1.0).initialCodeLetter).toBe(codeLetter);
  });

  // Source: docs/references.md §10 [published]: the sample size n of each code letter (Table 2-A's first column).
  it.each(levelTwo)("lot %s to %s: code letter %s has n = %s", (_from, _to, codeLetter, n) => {
    expect(table2aSampleSizes[codeLetter]).toBe(n);
  });
});

describe("Table 2-A plans (docs/references.md §10, published)", () => {
  it("lot 281–500 at AQL 1.0 → H, n = 50, Ac 1, Re 2", () => {
    for (const lotSize of [281, 400, 500]) {
      expect(plan(lotSize, 1.0)).toMatchObject({ codeLetter: "H", arrow: "none", sampleSize: 50, acceptanceNumber: 1, rejectionNumber: 2 });
    }
  });

  it("lot 281–500 at AQL 0.65 → arrow down to J, n = 80, Ac 1, Re 2", () => {
    const result = plan(400, 0.65);
    expect(result).toMatchObject({ initialCodeLetter: "H", codeLetter: "J", arrow: "down", sampleSize: 80, acceptanceNumber: 1, rejectionNumber: 2 });
    expect(result.explanation).toEqual(["lot of 400 at level II → code letter H (Table 1)", "AQL 0.65 at H: arrow down → J, n = 80, Ac 1, Re 2 (Table 2-A)"]);
  });

  it("lot 151–280 at AQL 0.65 → arrow up to F, n = 20, Ac 0, Re 1", () => {
    expect(plan(200, 0.65)).toMatchObject({ initialCodeLetter: "G", codeLetter: "F", arrow: "up", sampleSize: 20, acceptanceNumber: 0, rejectionNumber: 1 });
  });

  it("lot 51–90 at AQL 1.0 → E, n = 13, Ac 0, Re 1", () => {
    expect(plan(60, 1.0)).toMatchObject({ codeLetter: "E", arrow: "none", sampleSize: 13, acceptanceNumber: 0, rejectionNumber: 1 });
  });

  it("lot 3 201–10 000 at AQL 1.0 → L, n = 200, Ac 5, Re 6", () => {
    expect(plan(5000, 1.0)).toMatchObject({ codeLetter: "L", arrow: "none", sampleSize: 200, acceptanceNumber: 5, rejectionNumber: 6 });
  });

  // The rule is published (docs/references.md §10: "if the sample size reaches the lot size, inspect 100 %");
  // the path B ↓ C ↓ D ↓ E ↓ F at AQL 0.65 is recalled from memory, F 0.65 (n = 20, Ac 0, Re 1) is published.
  it("a lot of 12 at AQL 0.65 reaches n = 20 ≥ 12 → inspect all 12", () => {
    const result = plan(12, 0.65);
    expect(result).toMatchObject({ codeLetter: "F", tableSampleSize: 20, sampleSize: 12, hundredPercent: true, acceptanceNumber: 0, rejectionNumber: 1 });
    expect(result.explanation.at(-1)).toBe("n ≥ lot size → inspect all 12");
  });
});

describe("other cells of Table 1 and Table 2-A (recalled from memory, verify against the standard)", () => {
  // Recalled from memory: the other inspection levels of Table 1 for a lot of 400 (281–500).
  it.each([
    ["S-1", "B"],
    ["S-2", "C"],
    ["S-3", "D"],
    ["S-4", "E"],
    ["I", "F"],
    ["III", "J"],
  ] as const)("lot of 400 at level %s → code letter %s", (level, codeLetter) => {
    expect(plan(400, 1.0, level).initialCodeLetter).toBe(codeLetter);
  });

  // Recalled from memory: level III above 500 000 gives R, n = 2 000 (R 0.65: Ac 21, Re 22).
  it("lot of 600 000 at level III → R, n = 2 000", () => {
    expect(plan(600_000, 0.65, "III")).toMatchObject({ codeLetter: "R", sampleSize: 2000, acceptanceNumber: 21, rejectionNumber: 22 });
  });

  // Recalled from memory: plans often quoted for general-purpose inspection at level II.
  it.each([
    [400, 2.5, "H", 50, 3, 4],
    [400, 4.0, "H", 50, 5, 6],
    [1000, 2.5, "J", 80, 5, 6],
    [1000, 4.0, "J", 80, 7, 8],
    [2000, 2.5, "K", 125, 7, 8],
    [200, 1.5, "G", 32, 1, 2],
    [50000, 2.5, "N", 500, 21, 22],
  ] as const)("lot of %s at AQL %s → %s, n = %s, Ac %s, Re %s", (lotSize, aql, codeLetter, n, ac, re) => {
    expect(plan(lotSize, aql)).toMatchObject({ codeLetter, sampleSize: n, acceptanceNumber: ac, rejectionNumber: re });
  });

  // Recalled from memory: P 2.5 is an arrow up to N (21, 22 is the largest plan of the columns up to 10).
  it("lot of 200 000 at AQL 2.5 → P, arrow up to N, n = 500, Ac 21, Re 22", () => {
    expect(plan(200_000, 2.5)).toMatchObject({ initialCodeLetter: "P", codeLetter: "N", arrow: "up", sampleSize: 500, acceptanceNumber: 21 });
  });
});
