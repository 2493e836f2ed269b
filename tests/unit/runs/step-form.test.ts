import { describe, expect, it } from "vitest";
import { buildStepRecord, readStepForm, stampStepTime, stepFormSchema } from "@/components/runs/step-sheet/step-form";
import { stepRecordSchema, type StepRecord } from "@/lib/conformance";
import { resolveOrThrow } from "@/scenarios/rated-capacity-run";

const resolution = resolveOrThrow({});
const stepOf = (id: string) => resolution.steps.find((s) => s.id === id)!;
const runId = "5f0c8a8e-6b7e-4f0e-9d43-1f0a8c2b7d11";
const now = "2026-03-02T09:00:00.000Z";

function formOf(fields: Record<string, string | string[]>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries({ runId, cycle: "1", ...fields })) for (const x of [v].flat()) f.append(k, x);
  return f;
}
const parse = (fields: Record<string, string | string[]>) => stepFormSchema.parse(readStepForm(formOf(fields)));
const stamped: StepRecord = stepRecordSchema.parse({
  stepId: "rest",
  completed: false,
  startedAt: "2026-03-02T07:00:00.000Z",
  endedAt: "2026-03-02T09:30:00.000Z",
});
const running: StepRecord = { ...stamped, endedAt: undefined };

describe("buildStepRecord", () => {
  it("stamps a new ambient reading with the server's time and converts minutes to seconds", () => {
    const built = buildStepRecord({
      step: stepOf("rest"),
      before: stamped,
      form: parse({ stepId: "rest", readingCelsius: "21,5", readingInstrument: "TH-01", "programmed.duration": "90" }),
      cautionCodes: [],
      now,
    });
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    expect(built.record.ambientReadings).toEqual([{ at: now, celsius: 21.5, instrumentId: "TH-01" }]);
    expect(built.record.programmed).toEqual({ duration: 5400 });
    expect(built.record.startedAt).toBe(stamped.startedAt);
    expect(stepRecordSchema.safeParse(built.record).success).toBe(true);
  });

  it("refuses a tick without start, end and an ambient reading, naming each", () => {
    const built = buildStepRecord({ step: stepOf("rest"), before: null, form: parse({ stepId: "rest", completed: "on" }), cautionCodes: [], now });
    expect(built.ok).toBe(false);
    if (built.ok) return;
    expect(built.fieldErrors.completed).toEqual(["mark the start of the step first", "mark the end of the step first"]);
    expect(built.fieldErrors.readingCelsius).toEqual(["record at least one ambient reading before ticking the step"]);
  });

  it("refuses a tick until every caution of the step is acknowledged, and keeps only the step's codes", () => {
    const codes = ["charge-current-above-rating/charge/current"];
    const base = { stepId: "charge", completed: "on", readingCelsius: "20" };
    const missing = buildStepRecord({ step: stepOf("charge"), before: { ...stamped, stepId: "charge" }, form: parse(base), cautionCodes: codes, now });
    expect(missing.ok).toBe(false);
    const given = buildStepRecord({
      step: stepOf("charge"),
      before: { ...stamped, stepId: "charge" },
      form: parse({ ...base, acknowledged: [codes[0]!, "made-up/other/code"] }),
      cautionCodes: codes,
      now,
    });
    expect(given.ok && given.record.acknowledgedCautionCodes).toEqual(codes);
    expect(given.ok && given.record.completed).toBe(true);
  });

  it("refuses a set-point of zero and an end before the start", () => {
    const built = buildStepRecord({
      step: stepOf("discharge"),
      before: null,
      form: parse({ stepId: "discharge", "programmed.current": "0", startedAt: "2026-03-02T10:00:00Z", endedAt: "2026-03-02T09:00:00Z" }),
      cautionCodes: [],
      now,
    });
    expect(built.ok).toBe(false);
    if (built.ok) return;
    expect(Object.keys(built.fieldErrors).sort()).toEqual(["endedAt", "programmed.current"]);
  });

  it("refuses a typed number that is not one", () => {
    expect(stepFormSchema.safeParse(readStepForm(formOf({ stepId: "rest", readingCelsius: "warm" }))).success).toBe(false);
  });
});

describe("buildStepRecord: plausibility and the step's time window", () => {
  const build = (fields: Record<string, string>, before: StepRecord | null = running) =>
    buildStepRecord({ step: stepOf("rest"), before, form: parse({ stepId: "rest", ...fields }), cautionCodes: [], now });

  it("refuses a value no ambient can take, e.g. 500 °C, with the plausible span in words", () => {
    const built = build({ readingCelsius: "500" });
    expect(built.ok).toBe(false);
    if (built.ok) return;
    expect(built.fieldErrors.readingCelsius?.[0]).toMatch(/^500 °C cannot be an ambient temperature \(readings lie between −60 °C and 150 °C\)/);
    expect(build({ readingCelsius: "-60.5" }).ok).toBe(false);
    expect(build({ readingCelsius: "-20" }).ok).toBe(false); // plausible, but outside 20–25 °C without a note
  });

  it("asks for a note when a reading lies outside the step's range, and keeps the note with the reading", () => {
    const range = stepOf("rest").ambient;
    const above = String(range.maxC + 6);
    const refused = build({ readingCelsius: above });
    expect(refused.ok).toBe(false);
    if (refused.ok) return;
    expect(refused.fieldErrors.readingNote?.[0]).toMatch(/is outside this step's range of .*: say in a note what happened/);
    const kept = build({ readingCelsius: above, readingNote: "chamber door open for a minute" });
    expect(kept.ok && kept.record.ambientReadings).toEqual([{ at: now, celsius: range.maxC + 6, note: "chamber door open for a minute" }]);
  });

  it("refuses a reading before the step is started", () => {
    const built = build({ readingCelsius: "21" }, null);
    expect(!built.ok && built.fieldErrors.readingCelsius).toEqual(["mark the start of the step before recording its ambient"]);
  });

  it("refuses a reading after the step ended unless back-dated inside the step with a reason", () => {
    const ended = { ...stamped, endedAt: "2026-03-02T08:30:00.000Z" };
    const late = build({ readingCelsius: "21" }, ended);
    expect(!late.ok && late.fieldErrors.readingAt?.[0]).toMatch(/^the step ended at .*give the time the reading was taken/);
    const noReason = build({ readingCelsius: "21", readingAt: "2026-03-02T08:00:00.000Z" }, ended);
    expect(!noReason.ok && noReason.fieldErrors.readingAtReason).toEqual(["say why the reading is entered late"]);
    const outside = build({ readingCelsius: "21", readingAt: "2026-03-02T08:45:00.000Z", readingAtReason: "written on paper first" }, ended);
    expect(!outside.ok && outside.fieldErrors.readingAt?.[0]).toMatch(/^the step ended at/);
    const backdated = build({ readingCelsius: "21", readingAt: "2026-03-02T08:00:00.000Z", readingAtReason: "written on paper first" }, ended);
    expect(backdated.ok && backdated.record.ambientReadings).toEqual([{ at: "2026-03-02T08:00:00.000Z", celsius: 21, backdatedReason: "written on paper first" }]);
  });

  it("keeps a changed start time as a correction beside the new one", () => {
    const built = buildStepRecord({
      step: stepOf("rest"),
      before: running,
      form: parse({ stepId: "rest", startedAt: "2026-03-02T07:05:00.000Z", timeChangeReason: "pressed late" }),
      cautionCodes: [],
      now,
      by: "Ola Operator",
    });
    expect(built.ok && built.record.corrections).toEqual([
      { field: "startedAt", was: running.startedAt, now: "2026-03-02T07:05:00.000Z", reason: "pressed late", at: now, by: "Ola Operator" },
    ]);
  });
});

describe("stampStepTime", () => {
  it("starts a step with a caution only once every caution is acknowledged, and records who and when", () => {
    const codes = ["charge-current-above-rating/charge/current"];
    const refused = stampStepTime({ before: null, stepId: "charge", cycle: 1, which: "start", now, cautionCodes: codes, acknowledged: [] });
    expect(refused).toMatchObject({ ok: false, message: expect.stringMatching(/tick “I have read this caution” before you start it/) });
    const started = stampStepTime({ before: null, stepId: "charge", cycle: 1, which: "start", now, cautionCodes: codes, acknowledged: codes, by: "Ola Operator" });
    expect(started).toMatchObject({ ok: true, record: { startedAt: now, acknowledgedCautionCodes: codes, cautionsAcknowledged: { by: "Ola Operator", at: now } } });
  });

  it("stamps a start once and an end only after a start", () => {
    const start = stampStepTime({ before: null, stepId: "rest", cycle: 1, which: "start", now });
    expect(start.ok && start.record.startedAt).toBe(now);
    expect(stampStepTime({ before: null, stepId: "rest", cycle: 1, which: "end", now }).ok).toBe(false);
    expect(stampStepTime({ before: stamped, stepId: "rest", cycle: 1, which: "start", now }).ok).toBe(false);
    expect(stampStepTime({ before: { ...stamped, endedAt: undefined }, stepId: "rest", cycle: 1, which: "end", now })).toMatchObject({ ok: true, record: { endedAt: now } });
  });
});
