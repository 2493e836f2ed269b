import { describe, expect, it } from "vitest";
import {
  describeResolvedKind,
  formatResolvedValue,
  formatSeconds,
  formatTolerances,
  listSetPoints,
} from "@/components/procedure-preview/format-resolved";
import { dcResistanceTemplate, ratedCapacityAt20cTemplate, resolveProcedure, type ProcedureResolution } from "@/protocols";
import { omitFields } from "../protocols/cell-fixtures";
import { inventedCell, prismaticLcoCell } from "@/scenarios/invented-cells";

function resolve(...args: Parameters<typeof resolveProcedure>): ProcedureResolution {
  const result = resolveProcedure(...args);
  if (!result.ok) throw new Error(JSON.stringify(result));
  return result.resolution;
}

describe("formatSeconds", () => {
  it.each([
    [90, "90 s"],
    [0.5, "0.5 s"],
    [120, "2 min"],
    [125, "2 min 5 s"],
    [3600, "1 h"],
    [5400, "1 h 30 min"],
    [18000, "5 h"],
    [672 * 3600, "672 h (28 days)"],
    [25 * 3600, "25 h"],
  ])("writes %d s as %s", (seconds, words) => {
    expect(formatSeconds(seconds)).toBe(words);
  });
});

describe("formatResolvedValue", () => {
  const source = { kind: "absolute", value: 1, unit: "x" } as const;
  it("writes each unit the lab's way, the unit beside the value", () => {
    expect(formatResolvedValue({ value: 0.6, unit: "A", source, explanation: "" })).toBe("0.6 A");
    expect(formatResolvedValue({ value: 4.2, unit: "V", source, explanation: "" })).toBe("4.20 V");
    expect(formatResolvedValue({ value: 0.025, unit: "Ω", source, explanation: "" })).toBe("25 mΩ");
    expect(formatResolvedValue({ value: 1000, unit: "Hz", source, explanation: "" })).toBe("1 kHz");
    expect(formatResolvedValue({ value: 50, unit: "Hz", source, explanation: "" })).toBe("50 Hz");
    expect(formatResolvedValue({ value: 3, unit: "Ah", source, explanation: "" })).toBe("3 000 mAh");
    expect(formatResolvedValue({ value: 14400, unit: "s", source, explanation: "" })).toBe("4 h");
  });
});

describe("listSetPoints", () => {
  // IEC 61434: It = Cn / 1 h, so 0.2 It of a 3 000 mAh cell is 0.6 A (docs/design.md §6).
  const resolution = resolve({ procedure: ratedCapacityAt20cTemplate, cellSpecification: inventedCell });

  it("gives each set-point of a discharge with its value and where it came from", () => {
    expect(listSetPoints(resolution.steps[3]!)).toEqual([
      { name: "Current", value: "0.6 A", explanation: "0.2 × It = 0.6 A from rated 3 000 mAh", missing: false },
      { name: "End voltage", value: "2.50 V", explanation: "end-of-discharge voltage = 2.50 V from the cell specification", missing: false },
    ]);
    expect(describeResolvedKind(resolution.steps[3]!)).toBe("discharge (measured)");
    expect(describeResolvedKind(resolution.steps[0]!)).toBe("discharge (precondition)");
  });

  it("gives a charge's current, voltage and termination, and a rest's span", () => {
    expect(listSetPoints(resolution.steps[1]!).map((p) => `${p.name}: ${p.value}`)).toEqual([
      "Current: 1.5 A",
      "Voltage: 4.20 V",
      "Ends at current: 0.06 A",
    ]);
    expect(listSetPoints(resolution.steps[2]!).map((p) => `${p.name}: ${p.value}`)).toEqual(["Shortest: 1 h", "Longest: 4 h"]);
  });

  it("gives the pulse levels of a DC resistance step", () => {
    const pulse = resolve({ procedure: dcResistanceTemplate, cellSpecification: inventedCell }).steps[2]!;
    expect(listSetPoints(pulse).map((p) => `${p.name}: ${p.value}`)).toEqual([
      "Base current: 0.6 A",
      "Base for: 10 s",
      "Pulse current: 3 A",
      "Pulse for: 1 s",
    ]);
  });

  it("marks a value the cell specification cannot supply as missing", () => {
    const cell = omitFields(prismaticLcoCell, "chargeTerminationCurrentA");
    const charge = resolve({ procedure: ratedCapacityAt20cTemplate, cellSpecification: cell }).steps[1]!;
    expect(listSetPoints(charge)[2]).toEqual({
      name: "Ends at current",
      value: "—",
      explanation: "not available for this cell; see the problems above",
      missing: true,
    });
  });
});

describe("formatTolerances", () => {
  it("says once where the tolerances come from when they share a source", () => {
    const resolution = resolve({ procedure: ratedCapacityAt20cTemplate, cellSpecification: inventedCell });
    expect(formatTolerances(resolution.steps[0]!.tolerances)).toEqual({
      text: "U ±1 %, I ±1 %, T ±2 °C, t ±0.1 %",
      source: "from IEC 61960-3 clause 4",
    });
  });

  it("says for each tolerance where it comes from when the sources differ", () => {
    const procedure = structuredClone(ratedCapacityAt20cTemplate);
    procedure.header.tolerances = { currentPercent: 2 };
    procedure.steps[0] = { ...procedure.steps[0]!, tolerances: { voltagePercent: 0.5 } };
    const tolerances = resolve({ procedure, cellSpecification: inventedCell }).steps[0]!.tolerances;
    expect(formatTolerances(tolerances)).toEqual({
      text: "U ±0.5 %, I ±2 %, T ±2 °C, t ±0.1 %",
      source: "U: set on the step; I: set on the procedure; T: IEC 61960-3 clause 4; t: IEC 61960-3 clause 4",
    });
  });
});
