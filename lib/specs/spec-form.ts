import type { CellSpecificationInput } from "./cell-specifications-input";

const NUMBER_KEYS = [
  "ratedCapacityMah",
  "minimumCapacityMah",
  "nominalVoltageV",
  "chargeVoltageV",
  "standardChargeCurrentA",
  "maxChargeCurrentA",
  "chargeTerminationCurrentA",
  "maxContinuousDischargeCurrentA",
  "endOfDischargeVoltageV",
  "maxMassG",
  "maxDiameterMm",
  "maxThicknessMm",
  "maxWidthMm",
  "maxHeightMm",
  "maxAcResistanceMOhm",
  "maxDcResistanceMOhm",
] as const;

/**
 * Turns the specification form into the shape the schema checks. Empty fields are left out (optional
 * values); a decimal comma is accepted; anything else not numeric stays a string so the schema names it.
 */
export function readSpecificationForm(form: FormData): unknown {
  const text = (k: string) => String(form.get(k) ?? "").trim();
  const data: Record<string, unknown> = {
    chemistry: { positiveElectrode: text("positiveElectrode"), label: text("chemistryLabel") },
    shape: text("shape"),
  };
  for (const key of NUMBER_KEYS) {
    const raw = text(key).replace(",", ".");
    if (raw === "") continue;
    const n = Number(raw);
    data[key] = Number.isFinite(n) ? n : raw;
  }
  return { maker: text("maker"), model: text("model"), data } satisfies Record<keyof CellSpecificationInput, unknown>;
}
