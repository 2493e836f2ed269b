import type { Role } from "../db/schema";

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
  { email: "admin@brackwater.example", displayName: "Ines Varga", role: "admin", password: "demo-admin-pass" },
  { email: "engineer@brackwater.example", displayName: "Dana Okafor", role: "engineer", password: "demo-engineer-pass" },
  { email: "engineer2@brackwater.example", displayName: "Tomas Lindqvist", role: "engineer", password: "demo-engineer-pass" },
  { email: "operator@brackwater.example", displayName: "Priya Raman", role: "operator", password: "demo-operator-pass" },
  { email: "auditor@brackwater.example", displayName: "Felix Aubert", role: "auditor", password: "demo-auditor-pass" },
];

/**
 * Invented cell makers and models for the demo library. The dimensions give the IEC 61960
 * designations INR22/71, INR19/66 and IMR19/65.
 */
export const DEMO_CELL_SPECIFICATIONS: { maker: string; model: string; data: import("../protocols").CellSpecification }[] = [
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
    maker: "Halden Voltaic",
    model: "HV-18N30",
    data: {
      chemistry: { positiveElectrode: "N", label: "NCA" },
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
];
