import { ACCURACY_QUANTITIES, type AccuracyQuantity } from "./accuracy";
import type { InstrumentInput } from "./instrument-input";

/** The form fields of each accuracy part, named by their path in the input (`accuracy.current.range`). */
export const ACCURACY_FIELDS: Record<AccuracyQuantity, readonly string[]> = {
  current: ["percentOfReading", "percentOfRange", "range"],
  voltage: ["percentOfReading", "percentOfRange", "range"],
  resistance: ["percentOfReading", "percentOfRange", "range"],
  temperature: ["halfWidth"],
  mass: ["halfWidth"],
  time: ["ppm"],
};

/**
 * Turns the instrument form into the shape the schema checks. An accuracy part with every field
 * empty is left out; a decimal comma is accepted; text that is not a number stays text so the
 * schema names the field.
 */
export function readInstrumentForm(form: FormData): unknown {
  const text = (k: string) => String(form.get(k) ?? "").trim();
  const accuracy: Record<string, Record<string, unknown>> = {};
  for (const quantity of ACCURACY_QUANTITIES) {
    const fields = ACCURACY_FIELDS[quantity];
    const raw = fields.map((f) => text(`accuracy.${quantity}.${f}`).replace(",", "."));
    if (raw.every((r) => r === "")) continue;
    accuracy[quantity] = Object.fromEntries(fields.map((f, i) => [f, readNumber(raw[i] ?? "")]));
  }
  return {
    kind: text("kind"),
    identifier: text("identifier"),
    serial: text("serial"),
    firmware: text("firmware"),
    accuracy,
    calibrationCertificate: text("calibrationCertificate"),
    calibratedOn: text("calibratedOn"),
    dueOn: text("dueOn"),
  } satisfies Record<keyof InstrumentInput, unknown>;
}

function readNumber(raw: string): unknown {
  if (raw === "") return undefined;
  const n = Number(raw);
  return Number.isFinite(n) ? n : raw;
}
