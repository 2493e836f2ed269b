import type { ObservedValues, StepCorrection } from "@/lib/conformance";
import type { ResolvedObserveStep } from "@/protocols";
import type { StepForm } from "./step-form";

/** The observation fields of the step form: name, words, where the value sits in the record, and a plausible range. */
export const OBSERVATION_FIELDS = [
  { name: "massG", quantity: "mass", label: "Mass", unit: "g", min: 0, max: 100_000, words: "the mass" },
  { name: "openCircuitVoltageV", quantity: "openCircuitVoltage", label: "Open-circuit voltage", unit: "V", min: 0, max: 10, words: "the open-circuit voltage" },
  { name: "diameterOrThickness", quantity: "dimensions", label: "Diameter or thickness", unit: "mm", min: 0, max: 2_000, words: "the diameter or thickness" },
  { name: "width", quantity: "dimensions", label: "Width (prismatic cells)", unit: "mm", min: 0, max: 2_000, words: "the width" },
  { name: "height", quantity: "dimensions", label: "Height", unit: "mm", min: 0, max: 2_000, words: "the height" },
] as const;

type FieldName = (typeof OBSERVATION_FIELDS)[number]["name"];

function readStored(observed: ObservedValues | undefined, name: FieldName): number | undefined {
  if (name === "massG" || name === "openCircuitVoltageV") return observed?.[name];
  return observed?.dimensionsMm?.[name];
}

export function listObservationFields(step: ResolvedObserveStep) {
  return OBSERVATION_FIELDS.filter((field) => step.records.includes(field.quantity));
}

/** The stored value of an observation field, for the form's default. */
export function readObservedField(observed: ObservedValues | undefined, name: FieldName): number | undefined {
  return readStored(observed, name);
}

/**
 * What the operator typed on an observation step, merged into what was recorded: a value is checked
 * against a range it can take; a value already recorded is changed only with a reason, and the old one is
 * kept as a correction beside the new (records are never erased). A tick needs every value the step asks for.
 */
export function buildObserved({
  step,
  before,
  form,
  now,
  by,
}: {
  step: ResolvedObserveStep;
  before: ObservedValues | undefined;
  form: StepForm;
  now: string;
  by: string;
}): { ok: true; observed: ObservedValues | undefined; corrections: StepCorrection[] } | { ok: false; fieldErrors: Record<string, string[]> } {
  const fieldErrors: Record<string, string[]> = {};
  const corrections: StepCorrection[] = [];
  const values: Partial<Record<FieldName, number>> = {};
  for (const field of listObservationFields(step)) {
    const key = `observed.${field.name}`;
    const typed = form.observed[field.name];
    const stored = readStored(before, field.name);
    if (typed === undefined) {
      if (stored !== undefined) values[field.name] = stored;
      continue;
    }
    if (typed <= field.min || typed > field.max) {
      fieldErrors[key] = [`write ${field.words} in ${field.unit}: greater than ${field.min} ${field.unit} and at most ${field.max.toLocaleString("en-GB")} ${field.unit}`];
      continue;
    }
    if (stored !== undefined && stored !== typed) {
      if (!form.observationChangeReason) {
        fieldErrors.observationChangeReason = [`${field.words} was recorded as ${stored} ${field.unit}: say why it changes (the old value is kept beside the new)`];
        continue;
      }
      corrections.push({ field: key, was: stored, now: typed, reason: form.observationChangeReason, at: now, by });
    }
    values[field.name] = typed;
  }
  const hadVisual = before?.visual !== undefined;
  // The inspection is recorded once a box is ticked or the step is ticked off: saving a mass first does not record "none confirmed".
  const inspecting = form.visualShown === "1" && step.records.includes("visual") && (hadVisual || form.completed !== undefined || form.visualNoneSeen.length > 0);
  const visual = inspecting ? { noneSeen: [...form.visualNoneSeen] } : before?.visual;
  if (hadVisual && visual && JSON.stringify([...(before?.visual?.noneSeen ?? [])].sort()) !== JSON.stringify([...visual.noneSeen].sort())) {
    if (!form.observationChangeReason) fieldErrors.observationChangeReason = ["the visual state was recorded before: say why it changes (the old record is kept beside the new)"];
    else corrections.push({ field: "observed.visual", was: (before?.visual?.noneSeen ?? []).join(", ") || "none confirmed", now: visual.noneSeen.join(", ") || "none confirmed", reason: form.observationChangeReason, at: now, by });
  }
  if (form.completed) {
    for (const field of listObservationFields(step)) {
      if (values[field.name] === undefined && field.name !== "width" && !fieldErrors[`observed.${field.name}`]) {
        fieldErrors[`observed.${field.name}`] = [`record ${field.words} before ticking the step`];
      }
    }
  }
  if (Object.keys(fieldErrors).length > 0) return { ok: false, fieldErrors };
  const dimensionsMm = {
    ...(values.diameterOrThickness !== undefined && { diameterOrThickness: values.diameterOrThickness }),
    ...(values.width !== undefined && { width: values.width }),
    ...(values.height !== undefined && { height: values.height }),
  };
  const observed: ObservedValues = {
    ...(values.massG !== undefined && { massG: values.massG }),
    ...(values.openCircuitVoltageV !== undefined && { openCircuitVoltageV: values.openCircuitVoltageV }),
    ...(Object.keys(dimensionsMm).length > 0 && { dimensionsMm }),
    ...(visual !== undefined && { visual }),
  };
  return { ok: true, observed: Object.keys(observed).length > 0 ? observed : undefined, corrections };
}
