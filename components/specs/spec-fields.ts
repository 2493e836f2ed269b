import type { CellSpecification } from "@/protocols";

type NumericKey = {
  [K in keyof CellSpecification]-?: NonNullable<CellSpecification[K]> extends number ? K : never;
}[keyof CellSpecification];

/** The datasheet's numeric values, in the order a datasheet usually lists them, with their units. */
export const SPEC_NUMBER_FIELDS: { key: NumericKey; label: string; unit: string; required: boolean; step: string }[] = [
  { key: "ratedCapacityMah", label: "Rated capacity", unit: "mAh", required: true, step: "1" },
  { key: "minimumCapacityMah", label: "Minimum capacity", unit: "mAh", required: false, step: "1" },
  { key: "nominalVoltageV", label: "Nominal voltage", unit: "V", required: true, step: "0.001" },
  { key: "chargeVoltageV", label: "Charge voltage", unit: "V", required: true, step: "0.001" },
  { key: "standardChargeCurrentA", label: "Standard charge current", unit: "A", required: true, step: "0.001" },
  { key: "maxChargeCurrentA", label: "Maximum charge current", unit: "A", required: false, step: "0.001" },
  { key: "chargeTerminationCurrentA", label: "Charge termination current", unit: "A", required: false, step: "0.001" },
  { key: "maxContinuousDischargeCurrentA", label: "Maximum continuous discharge current", unit: "A", required: true, step: "0.001" },
  { key: "endOfDischargeVoltageV", label: "End-of-discharge voltage", unit: "V", required: true, step: "0.001" },
  { key: "maxMassG", label: "Maximum mass", unit: "g", required: false, step: "0.1" },
  { key: "maxDiameterMm", label: "Maximum diameter (cylindrical)", unit: "mm", required: false, step: "0.01" },
  { key: "maxThicknessMm", label: "Maximum thickness (prismatic)", unit: "mm", required: false, step: "0.01" },
  { key: "maxWidthMm", label: "Maximum width (prismatic)", unit: "mm", required: false, step: "0.01" },
  { key: "maxHeightMm", label: "Maximum height", unit: "mm", required: true, step: "0.01" },
  { key: "maxAcResistanceMOhm", label: "Maximum AC resistance (1 kHz)", unit: "mΩ", required: false, step: "0.01" },
  { key: "maxDcResistanceMOhm", label: "Maximum DC resistance", unit: "mΩ", required: false, step: "0.01" },
];
