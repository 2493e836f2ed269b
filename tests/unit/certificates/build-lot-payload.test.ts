import { mean, min, max, sampleStandardDeviation } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { buildLotCertificatePayload } from "@/lib/certificates/build-lot-payload";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { buildLotFixturePayload, buildLotFixtureRecords, LOT_CAPACITIES_MAH, LOT_POSITIONS } from "./fixture-lot-payload";

describe("the lot certificate payload", () => {
  it("states the ISO 2859-1 plan of a lot of 60 at level II, AQL 1.0: E, n = 13, Ac 0, Re 1 (docs/references.md §10)", () => {
    const p = buildLotFixturePayload();
    expect(p).toMatchObject({ subject: "lot", title: "Lot certificate", number: "C-00077", customer: "Quayside Packs Ltd" });
    expect(p.samplingPlan).toMatchObject({ inspectionLevel: "II", aql: "1.0", severity: "normal", codeLetter: "E", sampleSize: 13, acceptanceNumber: 0, rejectionNumber: 1, hundredPercent: false, hundredPercentNote: null });
    expect(p.samplingPlan.source).toMatch(/ISO 2859-1/);
    expect(p.samplingPlan.explanation[0]).toMatch(/lot of 60 at level II → code letter E/);
    expect(p.lot).toEqual({ identifier: "L-2026-021", supplier: "Larkfield Supply", quantityReceived: 60, receivedOn: "2026-03-02" });
    expect(p.draw).toMatchObject({ method: "random", seed: "2026", positions: LOT_POSITIONS });
    expect(p.draw.description).toMatch(/13 cells of the tray positions 1 to 60 drawn at random by Tomas Lindqvist with seed 2026/);
  });

  it("accepts with 0 nonconforming of 13 and rejects with 1, the rule in words", () => {
    const accepted = buildLotFixturePayload();
    expect(accepted.lotDecision).toMatchObject({ verdict: "accept", words: "lot accepted" });
    expect(accepted.lotDecision.statement).toBe("0 nonconforming of 13 tested is within the acceptance number 0: accept.");
    expect(accepted.lotDecision.rule).toMatch(/accept the lot with 0 or fewer nonconforming, reject it with 1 or more/);
    const rejected = buildLotFixturePayload({ nonconforming: true });
    expect(rejected.lotDecision).toMatchObject({ verdict: "reject", words: "lot rejected" });
    expect(rejected.sample[2]?.result).toBe("does not conform");
    expect(rejected.counts.nonconforming).toBe(1);
  });

  it("gives each drawn cell its run, its run's certificate and its 0.2 It capacity: the last cycle, never a 0.5 It discharge", () => {
    const p = buildLotFixturePayload();
    expect(p.sample).toHaveLength(13);
    expect(p.sample[0]).toMatchObject({ position: 41, specimen: "L-2026-021-41", run: "R-00100", runCertificate: "C-00070", result: "conforms" });
    // The second cycle of run 0 counts (3 061 mAh), not its first (2 850 mAh).
    expect(p.sample[0]?.capacityMAh).toBeCloseTo(3061, 6);
    expect(p.sample[5]?.capacityMAh).toBeCloseTo(3020, 6);
    expect(p.sample[5]?.currentA).toBeCloseTo(0.6024, 9);
    // Run 4's 0.5 It discharge (2 950 mAh at 1.5 A) is not its rated-capacity result.
    expect(p.sample[4]?.capacityMAh).toBeCloseTo(3044, 6);
    expect(p.sample[4]?.currentA).toBeLessThan(0.61);
    expect(p.sample.slice(1).every((c) => c.runCertificate === null)).toBe(true);
    expect(p.sample.map((c) => c.capacityMAh)).toEqual(LOT_CAPACITIES_MAH.map((x) => expect.closeTo(x, 6)));
  });

  it("states the 0.2 It statistics of the sample with Cpl against the minimum capacity, recomputed here by simple-statistics", () => {
    const s = buildLotFixturePayload().statistics!;
    expect(s.count).toBe(13);
    expect(s.meanMAh).toBeCloseTo(mean(LOT_CAPACITIES_MAH), 9);
    expect(s.standardDeviationMAh).toBeCloseTo(sampleStandardDeviation(LOT_CAPACITIES_MAH), 9);
    expect(s.minMAh).toBeCloseTo(min(LOT_CAPACITIES_MAH), 9);
    expect(s.maxMAh).toBeCloseTo(max(LOT_CAPACITIES_MAH), 9);
    const atOrAbove = LOT_CAPACITIES_MAH.filter((x) => x >= 3000).length;
    expect(s).toMatchObject({ ratedCapacityMAh: 3000, countAtOrAboveRated: atOrAbove, minimumCapacityMAh: 2900 });
    expect(s.shareAtOrAboveRated).toBeCloseTo(atOrAbove / 13, 12);
    // Cpl = (mean − LSL) / (3 s), NIST/SEMATECH e-Handbook §6.1.6 [published formula].
    expect(s.cpl).toBeCloseTo((mean(LOT_CAPACITIES_MAH) - 2900) / (3 * sampleStandardDeviation(LOT_CAPACITIES_MAH)), 9);
    expect(s.cplFormula).toBe("Cpl = (mean − LSL) / (3 s)");
    expect(s.cplSource).toMatch(/NIST\/SEMATECH/);
    expect(s.note).toMatch(/rough figure/);
  });

  it("names the decision rule of the cells, the dates of testing first to last, and that the decision rests on the sample", () => {
    const p = buildLotFixturePayload();
    expect(p.cellDecisionRules).toEqual(["simple acceptance"]);
    expect(p.testing).toEqual({ from: "2026-03-04T07:30:00.000Z", to: "2026-03-10T19:10:00.000Z" });
    expect(p.method.procedures).toEqual([{ code: "TPL-RC20", title: "Rated capacity at 20 °C", version: 2, standard: "IEC 61960-3:2017", clause: "7.2, 7.3.1" }]);
    expect(p.sampleStatement).toMatch(/The lot decision rests on the sample: 13 cells drawn/);
    expect(p.statements.resultsRelateToItem).toBe("The results relate only to the cells tested; the lot decision rests on the sample.");
    expect(p.approval).toEqual({ printedName: "Rhea Okafor", meaning: "approved", meaningWords: "approved: authorised the certificate for issue", signedAt: "2026-03-20T10:15:00.000Z" });
  });

  it("says why there are no statistics when no sampled run has a 0.2 It discharge, and notes a 100 % inspection", () => {
    const records = buildLotFixtureRecords();
    const p = buildLotCertificatePayload({ ...records, results: records.results.filter((r) => r.currentA > 1) });
    expect(p.statistics).toBeNull();
    expect(p.statisticsNote).toMatch(/only one|0\.2 It/);
    expect(p.sample.every((c) => c.capacityMAh === null)).toBe(true);
    const small = buildLotCertificatePayload({ ...records, plan: { ...records.plan, lotSize: 5, sampleSize: 5, hundredPercent: true } });
    expect(small.samplingPlan.hundredPercentNote).toMatch(/n = 13 reaches the lot size of 5: every cell of the lot is inspected \(100 %\)/);
  });

  it("is a pure function of its records (same records, same hash) and refuses a pending decision", () => {
    expect(hashCanonicalJson(buildLotFixturePayload())).toBe(hashCanonicalJson(buildLotFixturePayload()));
    const records = buildLotFixtureRecords();
    expect(() => buildLotCertificatePayload({ ...records, decision: { ...records.decision, verdict: "pending" } })).toThrow(/pending/);
  });
});
