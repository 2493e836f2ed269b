import { buildLotCertificatePayload, type LotCertificateRecords, type LotSampleResult } from "@/lib/certificates/build-lot-payload";
import type { LotCertificatePayload } from "@/lib/certificates/certificate-payload";
import { decideLot, planSampling } from "@/lib/lots/sampling";
import { inventedCell } from "@/scenarios/rated-capacity-run";

/** Invented capacities (mAh) at 0.2 It of the 13 drawn cells of an invented lot of 60: a scenario of our own. */
export const LOT_CAPACITIES_MAH = [3061, 3012, 3090, 2987, 3044, 3020, 2968, 3075, 3031, 3002, 3058, 3026, 3049];
/** Tray positions drawn (invented). */
export const LOT_POSITIONS = [41, 7, 33, 19, 58, 2, 26, 50, 14, 37, 9, 45, 22];

/**
 * A lot certificate of an invented lot: 60 cells of the invented 3 000 mAh cell, ISO 2859-1 level II at
 * AQL 1.0 (code letter E, n = 13, Ac 0, Re 1; docs/references.md §10), every drawn cell tested and
 * conforming (or, with `nonconforming`, the third one not). The first run repeated its discharge: its
 * second cycle counts; one run also has a 0.5 It discharge, which stays out of the 0.2 It figures.
 */
export function buildLotFixtureRecords(options: { nonconforming?: boolean } = {}): LotCertificateRecords {
  const plan = planSampling({ lotSize: 60, inspectionLevel: "II", aql: 1.0, severity: "normal" });
  if (!plan.ok) throw new Error(plan.error.message);
  const members = LOT_POSITIONS.map((position, k) => ({
    position,
    specimenIdentifier: `L-2026-021-${String(position).padStart(2, "0")}`,
    result: options.nonconforming && k === 2 ? ("does not conform" as const) : ("conforms" as const),
    runId: `run-${k}`,
    runNumber: `R-${String(100 + k).padStart(5, "0")}`,
  }));
  const nonconforming = members.filter((m) => m.result === "does not conform").length;
  const decided = decideLot({ plan: plan.plan, tested: members.length, nonconforming });
  if (!decided.ok) throw new Error(decided.error.message);
  const results: LotSampleResult[] = LOT_CAPACITIES_MAH.map((mAh, k) => ({
    runId: `run-${k}`,
    runNumber: `R-${String(100 + k).padStart(5, "0")}`,
    specimenId: `specimen-${k}`,
    cycle: 1,
    currentA: 0.6 * (1 + (k % 3) * 0.002),
    capacityAh: mAh / 1000,
    energyWh: (mAh / 1000) * 3.62,
    meanVoltageV: 3.62,
    beyondRating: false,
  }));
  // Run 0 repeated its discharge: the first cycle (below the figure that counts) and the second.
  results.unshift({ ...results[0]!, cycle: 1, capacityAh: 2.85, energyWh: 2.85 * 3.6 });
  results[1] = { ...results[1]!, cycle: 2 };
  // Run 4 also discharged at 0.5 It (1.5 A): not a rated-capacity result.
  results.push({ ...results[5]!, currentA: 1.5, capacityAh: 2.95, energyWh: 2.95 * 3.55 });
  return {
    number: "C-00077",
    issuedAt: new Date("2026-03-20T10:15:00.000Z"),
    lab: { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere PM3 9QX", accreditation: null },
    customer: "Quayside Packs Ltd",
    replaces: null,
    lot: { identifier: "L-2026-021", supplier: "Larkfield Supply", quantityReceived: 60, receivedOn: "2026-03-02" },
    cell: { maker: "Testmoor Cells", model: "TM-21700-30", designation: "INR22/71", data: inventedCell },
    plan: plan.plan,
    acceptanceProcedure: "TPL-RC20",
    draw: { method: "random", seed: "2026", positions: LOT_POSITIONS, drawnAt: new Date("2026-03-03T09:00:00.000Z"), drawnBy: "Tomas Lindqvist" },
    members,
    counts: { drawn: 13, registered: 13, tested: 13, nonconforming, notDecided: 0 },
    decision: decided.decision,
    runs: members.map((m, k) => ({
      runId: m.runId,
      runNumber: m.runNumber,
      certificate: k === 0 ? "C-00070" : null,
      procedure: { code: "TPL-RC20", title: "Rated capacity at 20 °C", version: 2, standard: "IEC 61960-3:2017", clause: "7.2, 7.3.1" },
      decisionRule: "simple acceptance",
      testing: { from: `2026-03-${String(4 + Math.floor(k / 2)).padStart(2, "0")}T07:30:00.000Z`, to: `2026-03-${String(4 + Math.floor(k / 2)).padStart(2, "0")}T19:10:00.000Z` },
    })),
    results,
    approval: { printedName: "Rhea Okafor", signedAt: new Date("2026-03-20T10:15:00.000Z") },
    meaningWords: { approved: "approved: authorised the certificate for issue" },
  };
}

export function buildLotFixturePayload(options: { nonconforming?: boolean } = {}): LotCertificatePayload {
  return buildLotCertificatePayload(buildLotFixtureRecords(options));
}
