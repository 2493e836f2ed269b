// Observation criteria of the transport tests, UN Manual of Tests and Criteria 38.3.4 (T1 to T5).
// Every value below is recalled, verify against the Manual's text (docs/references.md §14, §17): the
// template TPL-OBS holds them as parameters and names them "recalled, verify against the standard".
import { describe, expect, it } from "vitest";
import { computeMassLossPercent, computeVoltageSharePercent } from "@/lib/conformance";
import { findMassLossBand, findProcedureTemplate, procedureSchema, recalledMark, type ObserveStep } from "@/protocols";

function afterStep(): ObserveStep {
  const procedure = findProcedureTemplate("observation-before-after")?.procedure;
  const step = procedure?.steps.find((candidate) => candidate.id === "after");
  if (!step || step.kind !== "observe") throw new Error("TPL-OBS has an observation step 'after'");
  return step;
}

describe("UN 38.3.4 observation criteria in the template TPL-OBS (recalled, verify)", () => {
  const bands = afterStep().criteria?.massLoss?.bands ?? [];

  // Recalled, verify: M < 1 g → 0.5 %; 1 g ≤ M ≤ 75 g → 0.2 %; M > 75 g → 0.1 % (UN 38.3.4, T1–T5).
  it.each([
    [0.5, 0.5],
    [0.999, 0.5],
    [1, 0.2],
    [45, 0.2],
    [75, 0.2],
    [75.001, 0.1],
    [500, 0.1],
  ])("a cell of %s g may lose at most %s %% of its mass", (massG, limit) => {
    expect(findMassLossBand(bands, massG)?.band.maxLossPercent).toBe(limit);
  });

  // Recalled, verify: OCV after ≥ 90 % of the OCV immediately before (UN 38.3.4, T1–T4).
  it("asks the open-circuit voltage after to be at least 90 % of the voltage before", () => {
    expect(afterStep().criteria?.openCircuitVoltage?.atLeastPercentOfBefore).toBe(90);
  });

  // Recalled, verify: no leakage, no venting, no disassembly, no rupture, no fire (UN 38.3.4).
  it("asks for the five visual outcomes", () => {
    expect(afterStep().criteria?.visual).toEqual(["leakage", "venting", "disassembly", "rupture", "fire"]);
  });

  it("marks each recalled value in the template's notes", () => {
    const notes = findProcedureTemplate("observation-before-after")?.procedure.header.notes ?? [];
    const recalled = notes.filter((note) => note.includes(recalledMark));
    expect(recalled.some((note) => note.includes("0.5 %") && note.includes("0.2 %") && note.includes("0.1 %"))).toBe(true);
    expect(recalled.some((note) => note.includes("90 %"))).toBe(true);
    expect(recalled.some((note) => note.includes("no rupture"))).toBe(true);
  });

  it("is a valid procedure", () => {
    expect(procedureSchema.safeParse(findProcedureTemplate("observation-before-after")?.procedure).success).toBe(true);
  });
});

describe("mass loss and voltage share (definitions, arithmetic)", () => {
  // Mass loss = (M1 − M2) / M1 × 100 (UN 38.3.4, recalled, verify): 45.000 g → 44.910 g is 0.2 %.
  it("computes the mass loss as a share of the mass before", () => {
    expect(computeMassLossPercent(45, 44.91)).toBeCloseTo(0.2, 12);
    expect(computeMassLossPercent(80, 79.96)).toBeCloseTo(0.05, 12);
  });
  // 3.600 V before, 3.240 V after: 90 % (arithmetic).
  it("computes the voltage after as a share of the voltage before", () => {
    expect(computeVoltageSharePercent(3.6, 3.24)).toBeCloseTo(90, 12);
  });
});
