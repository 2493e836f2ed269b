import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  createReference,
  readReferenceMode,
  readTemperatureMode,
  switchTemperatureMode,
} from "@/components/procedure-editor/reference-values";

describe("readReferenceMode and createReference", () => {
  it("tell how a reference is written from its keys", () => {
    expect(readReferenceMode({ multipleOfIt: 0.2 })).toBe("it");
    expect(readReferenceMode({ spec: "chargeVoltage" })).toBe("spec");
    expect(readReferenceMode({ value: 4.2, unit: "V" })).toBe("absolute");
    expect(readReferenceMode(undefined)).toBe("absolute");
  });

  it("start each way of writing with its own keys, in the quantity's units and fields", () => {
    expect(createReference("current", "it")).toEqual({ multipleOfIt: undefined });
    expect(createReference("current", "spec")).toEqual({ spec: "standardChargeCurrent" });
    expect(createReference("voltage", "spec")).toEqual({ spec: "chargeVoltage" });
    expect(createReference("resistance", "absolute")).toEqual({ value: undefined, unit: "mOhm" });
    // Only a current can be a multiple of It; anything else falls back to a specification field.
    expect(createReference("voltage", "it")).toEqual({ spec: "chargeVoltage" });
    for (const quantity of ["current", "voltage", "resistance"] as const) {
      for (const mode of ["spec", "absolute"] as const) expect(readReferenceMode(createReference(quantity, mode))).toBe(mode);
    }
  });
});

describe("switchTemperatureMode", () => {
  it("rewrites 20 °C ± 5 °C as 15 °C to 25 °C and back (bounds = nominal ∓ tolerance)", () => {
    expect(switchTemperatureMode({ nominalC: 20, toleranceC: 5 }, "bounds")).toEqual({ minC: 15, maxC: 25 });
    expect(switchTemperatureMode({ minC: 15, maxC: 25 }, "nominal")).toEqual({ nominalC: 20, toleranceC: 5 });
    expect(readTemperatureMode({ minC: 15, maxC: 25 })).toBe("bounds");
    expect(readTemperatureMode({ nominalC: 20, toleranceC: 5 })).toBe("nominal");
  });

  it("leaves blanks when the range is not complete or not a range", () => {
    expect(switchTemperatureMode({ nominalC: 20 }, "bounds")).toEqual({ minC: undefined, maxC: undefined });
    expect(switchTemperatureMode({ minC: 25, maxC: 15 }, "nominal")).toEqual({ nominalC: undefined, toleranceC: undefined });
    expect(switchTemperatureMode(undefined, "nominal")).toEqual({ nominalC: undefined, toleranceC: undefined });
  });

  it("returns to the same range after a round trip", () => {
    fc.assert(
      fc.property(fc.integer({ min: -400, max: 1200 }), fc.integer({ min: 1, max: 400 }), (nominalTenths, toleranceTenths) => {
        const start = { nominalC: nominalTenths / 10, toleranceC: toleranceTenths / 10 };
        const back = switchTemperatureMode(switchTemperatureMode(start, "bounds"), "nominal") as typeof start;
        expect(back.nominalC).toBeCloseTo(start.nominalC, 9);
        expect(back.toleranceC).toBeCloseTo(start.toleranceC, 9);
      }),
    );
  });
});
