import { evaluateRun, listFindings, parseStoredEvaluation, toStoredEvaluation, type RunInstrument, type StepRecord, stepRecordSchema } from "@/lib/conformance";
import { buildRunCertificatePayload, type RunCertificateRecords } from "@/lib/certificates/build-run-payload";
import type { RunCertificatePayload } from "@/lib/certificates/certificate-payload";
import type { DischargeCurve } from "@/lib/certificates/vq-plot";
import { accumulateCapacityAh, thinChannels } from "@/lib/runs/plan-series-read";
import { ratedCapacityAt20cTemplate } from "@/protocols";
import { buildRatedCapacityRun, inventedCell } from "./rated-capacity-run";

/**
 * A run certificate of an invented lab, cell and customer (a scenario of our own): the rated-capacity
 * run of scenarios/rated-capacity-run.ts, one rest logged at 26.5 °C (a deviation the reviewer noted), and a cycler
 * channel whose stated accuracy (docs/references.md §6, Example B) gives the evaluation its uncertainty budgets.
 */
export function buildFixtureRecords(overrides: { uncertainty?: boolean; cycles?: number; deviation?: boolean } = {}): { records: RunCertificateRecords; curves: DischargeCurve[] } {
  const built = buildRatedCapacityRun({
    cycles: overrides.cycles ?? 1,
    ambient: (stepId) => (stepId === "rest" && overrides.deviation !== false ? [22.4, 26.5, 23.1] : [22.5, 22.8]),
  });
  // The cycler channel's accuracy as docs/references.md §6 Example B states it: the evaluation makes the budgets.
  const channel: RunInstrument = {
    identifier: "CH-03",
    kind: "cycler-channel",
    accuracy: { current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 }, voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 }, time: { ppm: 100 } },
  };
  const result = evaluateRun({ ...built.input, ...(overrides.uncertainty !== false && { instruments: [channel] }) });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  // As the database hands the row back, and as every reader then sees it.
  const stored: unknown = JSON.parse(JSON.stringify(toStoredEvaluation(result.evaluation)));
  const evaluation = parseStoredEvaluation(stored);
  const acknowledged = listFindings(evaluation)
    .filter((f) => f.outcome === "deviates")
    .map((f) => ({ findingId: f.id, note: "Door of the climate cabinet left open for a minute while loading the next cell; the rest lasted well beyond its minimum." }));
  const stepRecords: StepRecord[] = built.input.stepRecords.map((r) => stepRecordSchema.parse(r));
  const curves: DischargeCurve[] = evaluation.steps
    .filter((s) => s.kind === "discharge" && s.logPhase && s.stepId === "discharge")
    .map((s) => {
      const { from, to } = s.logPhase!;
      const t = built.log.columns.timeS.subarray(from, to + 1);
      const i = built.log.columns.currentA.subarray(from, to + 1);
      const v = built.log.columns.voltageV.subarray(from, to + 1);
      const q = accumulateCapacityAh(t, i).map((x) => x * 1000);
      const thinned = thinChannels(q, v, {}, 400);
      return { stepId: s.stepId, cycle: s.cycle, label: s.label, capacityMAh: thinned.x, voltageV: thinned.y };
    });
  const records: RunCertificateRecords = {
    number: "C-00042",
    issuedAt: new Date("2026-03-04T09:30:00.000Z"),
    lab: { name: "Harbourside Cell Test Laboratory", address: "Unit 4, 17 Ropewalk Lane, Portmere PM3 9QX", accreditation: "ISO/IEC 17025 accreditation T-9911 (invented)" },
    customer: "Quayside Packs Ltd",
    replaces: null,
    run: { number: "R-00017", procedureSource: { standard: ratedCapacityAt20cTemplate.header.standard, clause: ratedCapacityAt20cTemplate.header.clause }, resolution: built.resolution },
    procedure: { code: ratedCapacityAt20cTemplate.header.code, title: ratedCapacityAt20cTemplate.header.title, version: 2 },
    specimen: { identifier: "SP-0042", receivedOn: "2026-02-26", conditionOnReceipt: "intact, no dents, open-circuit voltage 3.48 V" },
    lot: { identifier: "L-2026-014", supplier: "Larkfield Supply", receivedOn: "2026-02-26" },
    cell: { maker: "Testmoor Cells", model: "TM-21700-30", designation: "INR22/71", data: inventedCell },
    instruments: [
      { identifier: "CH-03", kind: "cycler-channel", serial: "CY8-22014-3", calibrationCertificate: "CAL-2025-0311", calibratedOn: "2025-11-10", dueOn: "2026-11-10", usedFor: "run" },
      { identifier: "TH-07", kind: "thermometer", serial: "TK-5521", calibrationCertificate: "CAL-2025-0290", calibratedOn: "2025-10-01", dueOn: "2026-10-01", usedFor: "ambient readings" },
    ],
    stepRecords,
    evaluation: { evaluatedAt: new Date("2026-03-03T16:02:00.000Z"), value: evaluation, stored },
    logs: [{ fileName: "channel-3-SP-0042.csv", sha256: "5d0f4c1e9a8b7c6d5e4f3a2b1c0d9e8f7a6b5c4d3e2f1a0b9c8d7e6f5a4b3c2d", sizeBytes: 1_482_113, samples: built.log.columns.length, uploadedAt: new Date("2026-03-03T15:58:00.000Z") }],
    review: { printedName: "Rhea Okafor", signedAt: new Date("2026-03-04T08:12:00.000Z"), comments: "Records complete; the ambient excursion is noted.", acknowledged },
    approval: { printedName: "Tomas Lindqvist", signedAt: new Date("2026-03-04T09:30:00.000Z") },
    meaningWords: {
      reviewed: "reviewed: checked the records, findings and results against the procedure",
      approved: "approved: authorised the certificate for issue",
    },
  };
  return { records, curves };
}

export function buildFixturePayload(overrides: Parameters<typeof buildFixtureRecords>[0] = {}): { payload: RunCertificatePayload; curves: DischargeCurve[] } {
  const { records, curves } = buildFixtureRecords(overrides);
  return { payload: buildRunCertificatePayload(records), curves };
}
