import { describe, expect, it } from "vitest";
import { correctionFormSchema, correctStepRecord, readCorrectionForm } from "@/components/runs/step-sheet/step-correction";
import { checkAmbient, stepRecordSchema, type StepRecord } from "@/lib/conformance";
import { resolveOrThrow } from "@/scenarios/rated-capacity-run";
import { contextOf } from "../conformance/context-fixtures";

const resolution = resolveOrThrow({});
const rest = resolution.steps.find((s) => s.id === "rest")!;
const discharge = resolution.steps.find((s) => s.id === "discharge")!;
const runId = "5f0c8a8e-6b7e-4f0e-9d43-1f0a8c2b7d11";
const now = "2026-03-03T10:00:00.000Z";

const ticked: StepRecord = stepRecordSchema.parse({
  stepId: "rest",
  completed: true,
  startedAt: "2026-03-02T07:00:00.000Z",
  endedAt: "2026-03-02T09:00:00.000Z",
  ambientReadings: [
    { at: "2026-03-02T07:30:00.000Z", celsius: 21 },
    { at: "2026-03-02T08:30:00.000Z", celsius: 31, note: "typed wrong" },
  ],
  programmed: {},
});

function formOf(fields: Record<string, string | string[]>) {
  const f = new FormData();
  for (const [k, v] of Object.entries({ runId, cycle: "1", ...fields })) for (const x of [v].flat()) f.append(k, x);
  return correctionFormSchema.parse(readCorrectionForm(f));
}

describe("correctStepRecord", () => {
  it("strikes a reading (kept, with who, when and why) and adds the right one; the struck one counts nowhere", () => {
    const corrected = correctStepRecord({
      step: rest,
      before: ticked,
      form: formOf({ stepId: "rest", strike: "1", readingCelsius: "22", readingAt: "2026-03-02T08:30:00.000Z", reason: "31 was a typing slip; the thermometer showed 22" }),
      by: "Ola Operator",
      now,
    });
    expect(corrected.ok).toBe(true);
    if (!corrected.ok) return;
    const readings = corrected.record.ambientReadings!;
    expect(readings).toHaveLength(3);
    expect(readings[1]).toEqual({ ...ticked.ambientReadings[1], struck: { reason: "31 was a typing slip; the thermometer showed 22", at: now, by: "Ola Operator" } });
    expect(readings[2]).toMatchObject({ celsius: 22, at: "2026-03-02T08:30:00.000Z" });
    const record = stepRecordSchema.parse(corrected.record);
    const [finding] = checkAmbient(contextOf({ step: rest, record }));
    expect(finding?.outcome).toBe("meets");
    expect(finding?.observed.text).toContain("(not counted: 1 struck as an error)");
    expect(finding?.observed.max).toBe(22);
  });

  it("replaces a set-point and keeps the old value as a correction", () => {
    const before = stepRecordSchema.parse({ ...ticked, stepId: "discharge", programmed: { current: 1 } });
    const corrected = correctStepRecord({ step: discharge, before, form: formOf({ stepId: "discharge", "programmed.current": "0.97", reason: "typed the planned value" }), by: "Ola", now });
    expect(corrected.ok && corrected.record.programmed).toEqual({ current: 0.97 });
    expect(corrected.ok && corrected.record.corrections).toEqual([{ field: "programmed.current", was: 1, now: 0.97, reason: "typed the planned value", at: now, by: "Ola" }]);
  });

  it("needs a reason, something to correct, and never leaves a ticked step without a counted reading", () => {
    const noReason = correctStepRecord({ step: rest, before: ticked, form: formOf({ stepId: "rest", strike: "1" }), by: "Ola", now });
    expect(!noReason.ok && noReason.fieldErrors.reason).toBeTruthy();
    const nothing = correctStepRecord({ step: rest, before: ticked, form: formOf({ stepId: "rest", reason: "x" }), by: "Ola", now });
    expect(nothing.ok).toBe(false);
    const all = correctStepRecord({ step: rest, before: ticked, form: formOf({ stepId: "rest", strike: ["0", "1"], reason: "both wrong" }), by: "Ola", now });
    expect(!all.ok && all.fieldErrors.strike).toBeTruthy();
    const implausible = correctStepRecord({
      step: rest,
      before: ticked,
      form: formOf({ stepId: "rest", readingCelsius: "500", readingAt: "2026-03-02T08:00:00.000Z", reason: "x" }),
      by: "Ola",
      now,
    });
    expect(!implausible.ok && implausible.fieldErrors.readingCelsius?.[0]).toMatch(/cannot be an ambient temperature/);
  });
});
