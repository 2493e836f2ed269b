import type { Role } from "@/db/schema";
import type { CellSpecification } from "@/protocols";
import { inventedCell } from "./invented-cells";

/**
 * The demo is set in an invented lab. Every name, address and e-mail here is made up; the e-mail
 * domain is reserved for examples (RFC 2606).
 */
export const DEMO_LAB = {
  name: "Brackwater Cell Test Laboratory",
  address: "7 Tannery Lane, Brackwater Industrial Park, Eastmoor EM4 2QT",
  accreditation: "Demo only: no accreditation",
};

export const DEMO_USERS: { email: string; displayName: string; role: Role; password: string }[] = [
  { email: "admin@brackwater.example", displayName: "Ines Varga", role: "admin", password: "brass key ledger cabinet" },
  { email: "engineer@brackwater.example", displayName: "Dana Okafor", role: "engineer", password: "clamp meter quiet harbour" },
  { email: "engineer2@brackwater.example", displayName: "Tomas Lindqvist", role: "engineer", password: "rested cell warm chamber" },
  { email: "operator@brackwater.example", displayName: "Priya Raman", role: "operator", password: "tick every step slowly" },
  { email: "auditor@brackwater.example", displayName: "Felix Aubert", role: "auditor", password: "read the signed record" },
];

/**
 * Invented cell makers and models for the demo library. The dimensions give the IEC 61960
 * designations INR22/71, INR19/66, IMR19/65 and IFpR27/66.
 */
export const DEMO_CELL_SPECIFICATIONS: { maker: string; model: string; data: CellSpecification }[] = [
  {
    maker: "Korvel Energy",
    model: "KV-21N48",
    data: {
      chemistry: { positiveElectrode: "N", label: "NMC" },
      shape: "cylindrical",
      ratedCapacityMah: 4850,
      minimumCapacityMah: 4750,
      nominalVoltageV: 3.6,
      chargeVoltageV: 4.2,
      standardChargeCurrentA: 1.455,
      maxChargeCurrentA: 4.85,
      chargeTerminationCurrentA: 0.097,
      maxContinuousDischargeCurrentA: 9.7,
      endOfDischargeVoltageV: 2.5,
      maxMassG: 70,
      maxDiameterMm: 21.4,
      maxHeightMm: 70.3,
      maxAcResistanceMOhm: 18,
    },
  },
  {
    // The invented 3 000 mAh cell of the tests (invented-cells.ts) in an 18650 can, sold as NCA: the demo's
    // logged runs (rated-capacity-run.ts) are modelled on it.
    maker: "Halden Voltaic",
    model: "HV-18N30",
    data: {
      ...inventedCellRatings(),
      chemistry: { positiveElectrode: "N", label: "NCA" },
      maxDiameterMm: 18.4,
      maxHeightMm: 65.2,
      maxDcResistanceMOhm: 25,
    },
  },
  {
    maker: "Pellucid Power",
    model: "PP-18M25",
    data: {
      chemistry: { positiveElectrode: "M", label: "LMO" },
      shape: "cylindrical",
      ratedCapacityMah: 2500,
      minimumCapacityMah: 2450,
      nominalVoltageV: 3.7,
      chargeVoltageV: 4.2,
      standardChargeCurrentA: 1.25,
      maxChargeCurrentA: 2.5,
      chargeTerminationCurrentA: 0.05,
      maxContinuousDischargeCurrentA: 20,
      endOfDischargeVoltageV: 2.75,
      maxMassG: 46,
      maxDiameterMm: 18.3,
      maxHeightMm: 65.0,
    },
  },
  {
    // An iron-phosphate cell: positive-electrode letters Fp (IECEE CTL decision on IEC 62133 designations), IFpR27/66.
    maker: "Tarnwick Cells",
    model: "TW-26F30",
    data: {
      chemistry: { positiveElectrode: "Fp", label: "LFP" },
      shape: "cylindrical",
      ratedCapacityMah: 3000,
      minimumCapacityMah: 2950,
      nominalVoltageV: 3.2,
      chargeVoltageV: 3.65,
      standardChargeCurrentA: 1.5,
      maxChargeCurrentA: 3,
      chargeTerminationCurrentA: 0.15,
      maxContinuousDischargeCurrentA: 9,
      endOfDischargeVoltageV: 2.5,
      maxMassG: 90,
      maxDiameterMm: 26.2,
      maxHeightMm: 65.4,
    },
  },
];

/** The invented cell's ratings, without what names its can (designation, dimensions) or its AC resistance. */
function inventedCellRatings(): CellSpecification {
  const ratings: Partial<CellSpecification> = { ...inventedCell };
  delete ratings.designation;
  delete ratings.maxAcResistanceMOhm;
  return ratings as CellSpecification;
}

/** Both channels of the invented cycler CY1 share its stated accuracy (one data sheet). */
const CYCLER_1_ACCURACY: import("../lib/instruments/accuracy").AccuracySpecification = {
  current: { percentOfReading: 0.02, percentOfRange: 0.02, range: 10 },
  voltage: { percentOfReading: 0.01, percentOfRange: 0.01, range: 5 },
  time: { ppm: 50 },
};

/**
 * The demo lab's instruments: two channels of one invented cycler, a climate chamber and a balance.
 * Dates are counted from the day of seeding, so none is overdue (runs can start) and CY1-CH02 falls
 * due within 30 days. Accuracy figures are invented, of the order such instruments state.
 */
export const DEMO_INSTRUMENTS: {
  kind: import("../db/schema").InstrumentKind;
  identifier: string;
  serial: string;
  firmware: string | null;
  accuracy: import("../lib/instruments/accuracy").AccuracySpecification;
  calibrationCertificate: string;
  dueInDays: number;
}[] = [
  {
    kind: "cycler-channel",
    identifier: "CY1-CH01",
    serial: "TQ16-20417-01",
    firmware: "3.8.2",
    accuracy: CYCLER_1_ACCURACY,
    calibrationCertificate: "MCL-26-1184",
    dueInDays: 140,
  },
  {
    kind: "cycler-channel",
    identifier: "CY1-CH02",
    serial: "TQ16-20417-02",
    firmware: "3.8.2",
    accuracy: CYCLER_1_ACCURACY,
    calibrationCertificate: "MCL-25-0977",
    dueInDays: 21,
  },
  {
    kind: "climate-chamber",
    identifier: "CC-01",
    serial: "VK-340-1172",
    firmware: "2.1",
    accuracy: { temperature: { halfWidth: 0.5 } },
    calibrationCertificate: "MCL-26-1190",
    dueInDays: 200,
  },
  {
    kind: "balance",
    identifier: "BAL-01",
    serial: "OB-220-55810",
    firmware: null,
    accuracy: { mass: { halfWidth: 0.005 } },
    calibrationCertificate: "MCL-26-1021",
    dueInDays: 95,
  },
  // The run form asks for the thermometer (or chamber) the ambient is read on: a bench probe beside the cycler.
  {
    kind: "thermometer",
    identifier: "TH-01",
    serial: "PT-100-31877",
    firmware: null,
    accuracy: { temperature: { halfWidth: 0.2 } },
    calibrationCertificate: "MCL-26-1203",
    dueInDays: 160,
  },
];

/** Instruments are calibrated once a year in the demo lab. */
export const DEMO_CALIBRATION_INTERVAL_DAYS = 365;

const AS_RECEIVED = "as received: sleeve intact, no dents, no leakage";

/** One invented lot of the Korvel cell from an invented supplier, six cells drawn from it for testing. */
export const DEMO_LOT = {
  identifier: "KV48-2611-A",
  specification: { maker: "Korvel Energy", model: "KV-21N48" },
  supplier: "Ashgrove Cell Supply",
  quantityReceived: 240,
  receivedDaysAgo: 9,
  notes: "Six cells drawn at random from the delivery for the rated-capacity test.",
  specimens: ["001", "002", "003", "004", "005", "006"].map((n) => ({
    identifier: `KV48-2611-A-${n}`,
    conditionOnReceipt: n === "004" ? "sleeve scuffed; can undamaged" : AS_RECEIVED,
  })),
};

/** Two loose specimens of another cell: engineering samples without lot papers. */
export const DEMO_LOOSE_SPECIMENS = [
  { identifier: "HV30-ENG-01", specification: { maker: "Halden Voltaic", model: "HV-18N30" }, receivedDaysAgo: 4, conditionOnReceipt: AS_RECEIVED },
  { identifier: "HV30-ENG-02", specification: { maker: "Halden Voltaic", model: "HV-18N30" }, receivedDaysAgo: 4, conditionOnReceipt: AS_RECEIVED },
].map((s) => ({ ...s, notes: "Engineering samples sent by the maker without lot papers." }));

/** The demo endurance run: an engineering sample of the invented 3 000 mAh cell, some tens of cycles into TPL-END400. */
export const DEMO_ENDURANCE_RUN = {
  specimen: "HV30-END-01",
  maker: "Halden Voltaic",
  model: "HV-18N30",
  notes: "Engineering sample on the endurance test; the cycler log is added as the cycles run.",
  channel: "CY1-CH01",
  ambientInstrument: "CC-01",
  /** The log holds this many cycles of about 5.8 h each. */
  cycles: 60,
  startedDaysAgo: 15,
  /** Capacity lost per cycle in the synthetic log, mAh (a fast-fading sample, so the trend shows). */
  fadeMahPerCycle: 9,
};
