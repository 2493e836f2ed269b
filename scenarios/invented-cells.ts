import type { CellSpecification } from "@/protocols";

// Invented cells, written once: the tests, the demo seed and the benchmark all use these.

/**
 * An invented 21700-size NMC cell of 3 000 mAh with typical datasheet values (docs/references.md §12,
 * common practice): CC-CV to 4.20 V at 1.5 A, end at 60 mA (C/50), end-of-discharge 2.50 V, 15 A continuous.
 * The rated-capacity run (rated-capacity-run.ts) is modelled on it.
 */
export const inventedCell: CellSpecification = {
  designation: "INR22/71",
  chemistry: { positiveElectrode: "N", label: "NMC" },
  shape: "cylindrical",
  ratedCapacityMah: 3000,
  minimumCapacityMah: 2900,
  nominalVoltageV: 3.6,
  chargeVoltageV: 4.2,
  standardChargeCurrentA: 1.5,
  maxChargeCurrentA: 4,
  chargeTerminationCurrentA: 0.06,
  maxContinuousDischargeCurrentA: 15,
  endOfDischargeVoltageV: 2.5,
  maxMassG: 48,
  maxDiameterMm: 21.4,
  maxHeightMm: 70.3,
  maxAcResistanceMOhm: 20,
};

/** An invented prismatic LCO cell of 1 100 mAh. */
export const prismaticLcoCell: CellSpecification = {
  chemistry: { positiveElectrode: "C", label: "LCO" },
  shape: "prismatic",
  ratedCapacityMah: 1100,
  nominalVoltageV: 3.7,
  chargeVoltageV: 4.2,
  standardChargeCurrentA: 0.55,
  maxContinuousDischargeCurrentA: 2.2,
  endOfDischargeVoltageV: 2.75,
  maxThicknessMm: 5.4,
  maxWidthMm: 34,
  maxHeightMm: 50.2,
};
