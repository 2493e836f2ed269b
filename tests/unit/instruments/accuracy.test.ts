import { describe, expect, it } from "vitest";
import { computeHalfWidth, evaluateCapacityUncertainty } from "@/lib/analysis/uncertainty";
import { accuracySpecificationSchema, findAccuracyProblems, type AccuracySpecification } from "@/lib/instruments/accuracy";
import { listUncertaintySources, toChannelAccuracy, toTolerance } from "@/lib/instruments/accuracy-tolerance";
import { describeAccuracy } from "@/lib/instruments/describe-accuracy";
import { instrumentInputSchema } from "@/lib/instruments/instrument-input";
import { readInstrumentForm } from "@/lib/instruments/instrument-form";

const cycler: AccuracySpecification = {
  current: { percentOfReading: 0.02, percentOfRange: 0.02, range: 10 },
  voltage: { percentOfReading: 0.01, percentOfRange: 0.01, range: 5 },
  time: { ppm: 50 },
};

describe("accuracySpecificationSchema", () => {
  it("accepts each quantity in its own shape", () => {
    const all = { ...cycler, resistance: { percentOfReading: 0.5, percentOfRange: 0.1, range: 0.3 }, temperature: { halfWidth: 0.3 }, mass: { halfWidth: 0.005 } };
    expect(accuracySpecificationSchema.parse(all)).toEqual(all);
  });

  it("names the field of a bad value", () => {
    const r = accuracySpecificationSchema.safeParse({ current: { percentOfReading: -0.1, percentOfRange: 0.02, range: 0 }, mass: { halfWidth: "a lot" } });
    expect(r.success).toBe(false);
    const issues = r.error!.issues.map((i) => [i.path.join("."), i.message]);
    expect(issues).toEqual([
      ["current.percentOfReading", "the percent of reading must not be negative"],
      ["current.range", "the range must be greater than 0"],
      ["mass.halfWidth", "the limit is a number"],
    ]);
  });

  it("refuses fields it does not know, so a typo is not silently dropped", () => {
    expect(accuracySpecificationSchema.safeParse({ time: { ppm: 50, percent: 1 } }).success).toBe(false);
    expect(accuracySpecificationSchema.safeParse({ humidity: { halfWidth: 2 } }).success).toBe(false);
  });
});

describe("findAccuracyProblems", () => {
  it("asks a cycler channel for current, voltage and time, and lets it add temperature", () => {
    expect(findAccuracyProblems("cycler-channel", cycler)).toEqual([]);
    expect(findAccuracyProblems("cycler-channel", { ...cycler, temperature: { halfWidth: 1 } })).toEqual([]);
    expect(findAccuracyProblems("cycler-channel", { voltage: cycler.voltage })).toEqual([
      { quantity: "current", message: "a cycler channel states its current accuracy" },
      { quantity: "time", message: "a cycler channel states its time accuracy" },
    ]);
  });

  it("refuses a quantity the kind does not measure", () => {
    expect(findAccuracyProblems("balance", { mass: { halfWidth: 0.01 }, current: cycler.current })).toEqual([
      { quantity: "current", message: "a balance does not measure current: leave it empty" },
    ]);
    expect(findAccuracyProblems("climate-chamber", {})).toEqual([{ quantity: "temperature", message: "a climate chamber states its temperature accuracy" }]);
  });
});

describe("the accuracy feeds the uncertainty code", () => {
  it("turns each part into the Tolerance shape of lib/analysis/uncertainty.ts", () => {
    expect(toTolerance(cycler, "current")).toEqual({ form: "percent-of-reading-and-range", percentOfReading: 0.02, percentOfRange: 0.02, range: 10 });
    expect(toTolerance({ temperature: { halfWidth: 0.5 } }, "temperature")).toEqual({ form: "absolute", halfWidth: 0.5 });
    // 50 ppm = 50 × 10⁻⁶ = 0.005 % (definition).
    expect(toTolerance(cycler, "time")).toEqual({ form: "percent-of-reading", percent: 0.005 });
    expect(toTolerance(cycler, "mass")).toBeNull();
  });

  it("gives the half-width the budget uses: ±(0.02 % of 0.97 A + 0.02 % of 10 A) = ±2.194 mA", () => {
    expect(computeHalfWidth(toTolerance(cycler, "current")!, 0.97)).toBeCloseTo(0.002194, 12);
  });

  it("builds a capacity budget from a cycler channel's sources", () => {
    const sources = listUncertaintySources({ accuracy: cycler, instrument: "CY1-CH01" });
    expect(sources.map((s) => [s.quantity, s.source])).toEqual([
      ["current", "CY1-CH01 current accuracy"],
      ["voltage", "CY1-CH01 voltage accuracy"],
      ["time", "CY1-CH01 time accuracy"],
    ]);
    // Capacity takes current and time only, so the voltage source is left to the energy budget.
    const budget = evaluateCapacityUncertainty({ capacityAh: 4.85, currentA: 0.97, durationS: 18_000, sources: sources.filter((s) => s.quantity !== "voltage") });
    expect(budget.ok).toBe(true);
    if (!budget.ok) return;
    // u_r(I) = (0.002194 / √3) / 0.97, u_r(t) = 0.00005 / √3; combined in quadrature, then k = 2 (GUM 5.1.6, 6.2.1).
    const uI = 0.002194 / Math.sqrt(3) / 0.97;
    const uT = 0.00005 / Math.sqrt(3);
    expect(budget.value.relativeExpandedUncertainty).toBeCloseTo(2 * Math.hypot(uI, uT), 12);
  });

  it("passes a current channel to the DC-resistance budget as a ChannelAccuracy", () => {
    expect(toChannelAccuracy(cycler.voltage!)).toEqual({ percentOfReading: 0.01, percentOfRange: 0.01, range: 5 });
  });
});

describe("describeAccuracy", () => {
  it("states each part in words with its unit", () => {
    expect(describeAccuracy({ ...cycler, mass: { halfWidth: 0.005 }, temperature: { halfWidth: 0.5 } }).map((p) => p.text)).toEqual([
      "Current ±(0.02 % of reading + 0.02 % of 10 A range)",
      "Voltage ±(0.01 % of reading + 0.01 % of 5 V range)",
      "Temperature ±0.5 °C",
      "Mass ±0.005 g",
      "Time ±50 ppm",
    ]);
  });
});

describe("instrumentInputSchema", () => {
  const valid = {
    kind: "cycler-channel",
    identifier: "CY9-CH01",
    serial: "X-1",
    firmware: "",
    accuracy: cycler,
    calibrationCertificate: "CAL-1",
    calibratedOn: "2026-01-10",
    dueOn: "2027-01-10",
  };

  it("keeps an empty firmware as none", () => {
    expect(instrumentInputSchema.parse(valid).firmware).toBeNull();
  });

  it("refuses a due date that is not after the calibration date, and accuracy that does not fit the kind", () => {
    const r = instrumentInputSchema.safeParse({ ...valid, kind: "balance", dueOn: "2026-01-10" });
    expect(r.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["dueOn", "The due date must be after the calibration date."],
      ["accuracy.current", "a balance does not measure current: leave it empty"],
      ["accuracy.voltage", "a balance does not measure voltage: leave it empty"],
      ["accuracy.mass", "a balance states its mass accuracy"],
      ["accuracy.time", "a balance does not measure time: leave it empty"],
    ]);
  });

  it("refuses an identifier a label printer could not carry and a date that does not exist", () => {
    const r = instrumentInputSchema.safeParse({ ...valid, identifier: "CY 1 / ch 1", dueOn: "2027-02-30" });
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["identifier", "dueOn"]);
  });
});

describe("readInstrumentForm", () => {
  it("reads the form's accuracy parts, leaves empty parts out and keeps bad numbers for the schema to name", () => {
    const form = new FormData();
    for (const [k, v] of Object.entries({
      kind: "cycler-channel",
      identifier: " CY9-CH02 ",
      "accuracy.current.percentOfReading": "0,05",
      "accuracy.current.percentOfRange": "0.05",
      "accuracy.current.range": "ten",
      "accuracy.voltage.percentOfReading": "",
      "accuracy.time.ppm": "100",
    })) {
      form.set(k, v);
    }
    const read = readInstrumentForm(form) as { identifier: string; accuracy: unknown };
    expect(read.identifier).toBe("CY9-CH02");
    expect(read.accuracy).toEqual({ current: { percentOfReading: 0.05, percentOfRange: 0.05, range: "ten" }, time: { ppm: 100 } });
    const r = instrumentInputSchema.safeParse(read);
    expect(r.error?.issues.find((i) => i.path.join(".") === "accuracy.current.range")?.message).toBe("the range is a number");
  });
});
