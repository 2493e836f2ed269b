import { describe, expect, it } from "vitest";
import { buildRunCertificatePayload, readDecisionRule} from "@/lib/certificates/build-run-payload";
import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { evaluateChargeRetention, parseStoredEvaluation } from "@/lib/conformance";
import { findUnacknowledgedDeviations, readAcknowledgedDeviations } from "@/lib/certificates/review-coverage";
import { buildFixtureRecords } from "@/scenarios/run-certificate";

describe("buildRunCertificatePayload", () => {
  it("states every deviating finding with the reviewer's note, and counts the checks", () => {
    const { records } = buildFixtureRecords();
    const payload = buildRunCertificatePayload(records);
    const all = [...records.evaluation.value.runFindings, ...records.evaluation.value.steps.flatMap((s) => s.findings)];
    expect(payload.checks).toEqual({
      total: all.length,
      meets: all.filter((f) => f.outcome === "meets").length,
      deviates: all.filter((f) => f.outcome === "deviates").length,
      notAssessable: all.filter((f) => f.outcome === "not assessable").length,
    });
    expect(payload.deviations.length).toBeGreaterThan(0);
    expect(payload.deviations.map((d) => d.findingId).sort()).toEqual(all.filter((f) => f.outcome === "deviates").map((f) => f.id).sort());
    expect(payload.deviations.every((d) => d.reviewerNote?.startsWith("Door of the climate cabinet"))).toBe(true);
    expect(payload.deviations[0]).toMatchObject({ where: "Rest after charge", title: expect.stringMatching(/ambient/i) });
    expect(payload.conformity).toMatchObject({ procedureFollowed: "no", specimenConforms: "conforms", decisionRule: "simple acceptance" });
  });

  it("reports results of charge and discharge steps only, and the ambient of every step against its required range", () => {
    const { records } = buildFixtureRecords();
    const payload = buildRunCertificatePayload(records);
    expect(payload.results.map((r) => r.kind)).toEqual(["discharge", "charge", "discharge"]);
    const measured = payload.results.find((r) => r.stepId === "discharge");
    const source = records.evaluation.value.steps.find((s) => s.stepId === "discharge")?.results;
    expect(measured?.capacityMAh).toBe(source?.capacityMAh);
    expect(measured?.energyWh).toBe(source?.energyWh);
    const rest = payload.conditions.find((c) => c.stepId === "rest");
    expect(rest).toMatchObject({ readings: 3, minC: 22.4, maxC: 26.5, requiredMinC: 15, requiredMaxC: 25, outcome: "deviates" });
    expect(rest?.meanC).toBeCloseTo((22.4 + 26.5 + 23.1) / 3, 12);
    expect(payload.testing.from).toBe("2026-03-02T08:00:00.000Z");
  });

  it("leaves struck readings and physically implausible values out of the ambient mean (issue 12, 7d)", () => {
    const { records } = buildFixtureRecords();
    const rest = records.stepRecords.find((r) => r.stepId === "rest")!;
    const counted = rest.ambientReadings.map((a) => a.celsius);
    rest.ambientReadings = [
      ...rest.ambientReadings,
      { at: rest.ambientReadings[0]!.at, celsius: 500 },
      { at: rest.ambientReadings[0]!.at, celsius: 31, struck: { reason: "typing slip", at: "2026-03-03T10:00:00Z", by: "Ola" } },
    ];
    const condition = buildRunCertificatePayload(records).conditions.find((c) => c.stepId === "rest");
    expect(condition).toMatchObject({ readings: counted.length, minC: Math.min(...counted), maxC: Math.max(...counted) });
    expect(condition?.meanC).toBeCloseTo(counted.reduce((a, b) => a + b, 0) / counted.length, 12);
  });

  it("says whether each instrument's calibration covers every day of testing", () => {
    const { records } = buildFixtureRecords();
    records.instruments = [
      { ...records.instruments[0]!, identifier: "OK", calibratedOn: "2026-03-02", dueOn: "2026-03-02" },
      { ...records.instruments[0]!, identifier: "LATE", calibratedOn: "2026-03-03", dueOn: "2027-01-01" },
      { ...records.instruments[0]!, identifier: "DUE", calibratedOn: "2025-01-01", dueOn: "2026-03-01" },
    ];
    const payload = buildRunCertificatePayload(records);
    expect(payload.instruments.map((i) => [i.identifier, i.calibratedForTesting])).toEqual([
      ["OK", true],
      ["LATE", false],
      ["DUE", false],
    ]);
  });

  it("reads evaluations stored before the decision rule and the budgets were kept: simple acceptance, uncertainty not evaluated", () => {
    const { records } = buildFixtureRecords();
    // A row as the database hands it back, written before the evaluation had a format.
    const legacy = JSON.parse(JSON.stringify(records.evaluation.stored));
    delete legacy.format;
    delete legacy.decisionRule;
    delete legacy.uncertainty;
    delete legacy.uncertaintyNotEvaluated;
    legacy.acceptance = [];
    const read = parseStoredEvaluation(legacy);
    expect(readDecisionRule(read)).toBe("simple acceptance");
    const payload = buildRunCertificatePayload({ ...records, evaluation: { ...records.evaluation, value: read } });
    expect(payload.uncertainty).toEqual([]);
    expect(payload.uncertaintyNotEvaluated).toEqual([]);
    const guarded = parseStoredEvaluation({ ...legacy, acceptance: records.evaluation.value.acceptance.map((a) => ({ ...a, rule: "guarded acceptance" })) });
    expect(guarded.decisionRule).toBe("binary guard band");
    expect(readDecisionRule(guarded)).toBe("guarded acceptance");
  });

  it("states charge retention and recovery with their basis when the evaluation has them, and adds no field when it has none", () => {
    const { records } = buildFixtureRecords();
    expect("retention" in buildRunCertificatePayload(records)).toBe(false);
    // The fixture is a rated-capacity run: its two discharges stand in for the ones after storage and after recharging.
    const steps = records.evaluation.value.steps;
    records.evaluation.value.retention = evaluateChargeRetention(
      { afterStorageStepId: "precondition", recoveryStepId: "discharge", basis: { kind: "rated capacity", capacityAh: 3 } },
      steps,
      "IEC 61960-3:2017 7.4",
    );
    const capacityOf = (id: string) => steps.find((s) => s.stepId === id && s.cycle === 1)!.results!.capacityAh;
    const payload = buildRunCertificatePayload(records);
    expect(payload.retention?.basis).toBe("Both percentages are of the rated capacity, 3 000 mAh, as the procedure sets (IEC 61960-3:2017 7.4, charge retention and recovery).");
    expect(payload.retention?.rows.map((r) => r.name)).toEqual(["Charge retention (after storage)", "Charge recovery (after recharging)"]);
    expect(payload.retention?.rows[0]?.percent).toBeCloseTo((capacityOf("precondition") / 3) * 100, 12);
    expect(payload.retention?.rows[1]?.percent).toBeCloseTo((capacityOf("discharge") / 3) * 100, 12);
    expect(payload.retention?.rows[1]?.capacityMAh).toBeCloseTo(capacityOf("discharge") * 1000, 9);
  });

  it("is deterministic: the same records give the same hash; any stated value changes it", () => {
    const { records } = buildFixtureRecords();
    const hash = hashCanonicalJson(buildRunCertificatePayload(records));
    expect(hashCanonicalJson(buildRunCertificatePayload(buildFixtureRecords().records))).toBe(hash);
    expect(hashCanonicalJson(buildRunCertificatePayload({ ...records, customer: "Another Customer" }))).not.toBe(hash);
    expect(hashCanonicalJson(buildRunCertificatePayload({ ...records, replaces: { number: "C-00041", reason: "typo" } }))).not.toBe(hash);
  });
});

describe("review coverage", () => {
  it("finds deviating findings without a note; a blank note is no note", () => {
    const { records } = buildFixtureRecords();
    const evaluation = records.evaluation.value;
    const deviating = [...evaluation.runFindings, ...evaluation.steps.flatMap((s) => s.findings)].filter((f) => f.outcome === "deviates");
    expect(findUnacknowledgedDeviations(evaluation, [])).toHaveLength(deviating.length);
    expect(findUnacknowledgedDeviations(evaluation, deviating.map((f) => ({ findingId: f.id, note: "  " })))).toHaveLength(deviating.length);
    expect(findUnacknowledgedDeviations(evaluation, deviating.map((f) => ({ findingId: f.id, note: "seen" })))).toEqual([]);
  });

  it("reads only well-formed notes from the stored review", () => {
    expect(readAcknowledgedDeviations([{ findingId: "a", note: "n" }, { findingId: 3 }, null, "x"])).toEqual([{ findingId: "a", note: "n" }]);
    expect(readAcknowledgedDeviations({})).toEqual([]);
  });
});
