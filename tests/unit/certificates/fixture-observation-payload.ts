import { buildRunCertificatePayload, type RunCertificateRecords, type StoredEvaluation } from "@/lib/certificates/build-run-payload";
import type { RunCertificatePayload } from "@/lib/certificates/certificate-payload";
import { evaluateRun, parseStoredEvaluation, stepRecordSchema, toStoredEvaluation, type StepRecordInput } from "@/lib/conformance";
import { observationBeforeAfterTemplate, resolveProcedure } from "@/protocols";
import { inventedCell } from "@/scenarios/rated-capacity-run";
import { buildFixtureRecords } from "@/scenarios/run-certificate";

const NONE_SEEN = ["leakage", "venting", "disassembly", "rupture", "fire"] as const;

/**
 * A certificate of an observation run (template TPL-OBS) in the invented lab of fixture-payload.ts: no
 * data log; 45.000 g → 44.910 g (a loss of 0.200 %, on the limit of its band), 3.600 V → 3.240 V (90 %),
 * and every visual outcome confirmed as none seen, unless `rupture` leaves one unconfirmed.
 */
export function buildObservationFixturePayload(options: { rupture?: boolean } = {}): RunCertificatePayload {
  const resolved = resolveProcedure({ procedure: observationBeforeAfterTemplate, cellSpecification: inventedCell });
  if (!resolved.ok) throw new Error("TPL-OBS resolves");
  const ambient = (at: string) => [{ at, celsius: 21.4, instrumentId: "TH-07" }];
  const inputs: StepRecordInput[] = [
    {
      stepId: "before",
      startedAt: "2026-03-02T08:00:00Z",
      endedAt: "2026-03-02T08:10:00Z",
      ambientReadings: ambient("2026-03-02T08:05:00Z"),
      observed: { massG: 45, openCircuitVoltageV: 3.6, dimensionsMm: { diameterOrThickness: 21.1, height: 70.2 }, visual: { noneSeen: [...NONE_SEEN] } },
      completed: true,
    },
    { stepId: "storage", startedAt: "2026-03-02T08:15:00Z", endedAt: "2026-03-03T08:20:00Z", ambientReadings: ambient("2026-03-02T20:00:00Z"), completed: true },
    {
      stepId: "after",
      startedAt: "2026-03-03T08:25:00Z",
      endedAt: "2026-03-03T08:35:00Z",
      ambientReadings: ambient("2026-03-03T08:30:00Z"),
      observed: {
        massG: 44.91,
        openCircuitVoltageV: 3.24,
        dimensionsMm: { diameterOrThickness: 21.1, height: 70.2 },
        visual: { noneSeen: NONE_SEEN.filter((o) => !(options.rupture && o === "rupture")) },
      },
      completed: true,
    },
  ];
  const stepRecords = inputs.map((r) => stepRecordSchema.parse(r));
  const procedureSource = { standard: observationBeforeAfterTemplate.header.standard, clause: observationBeforeAfterTemplate.header.clause };
  const result = evaluateRun({
    resolution: resolved.resolution,
    cellRating: { maxContinuousDischargeCurrentA: 15, maxChargeCurrentA: 4, chargeVoltageV: 4.2 },
    stepRecords,
    procedureSource,
    instruments: [],
    evaluatedAgainst: { procedureVersionId: "00000000-0000-4000-8000-000000000001" },
  });
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  const stored = JSON.parse(JSON.stringify(toStoredEvaluation(result.evaluation))) as unknown;
  const evaluation: StoredEvaluation = parseStoredEvaluation(stored);
  const base = buildFixtureRecords({ uncertainty: false }).records;
  const records: RunCertificateRecords = {
    ...base,
    number: "C-00051",
    run: { number: "R-00023", procedureSource, resolution: resolved.resolution },
    procedure: { code: observationBeforeAfterTemplate.header.code, title: observationBeforeAfterTemplate.header.title, version: 1 },
    instruments: [
      { identifier: "BAL-02", kind: "balance", serial: "OB-220-55810", calibrationCertificate: "CAL-2025-0402", calibratedOn: "2025-12-01", dueOn: "2026-12-01", usedFor: "run" },
      { identifier: "TH-07", kind: "thermometer", serial: "TK-5521", calibrationCertificate: "CAL-2025-0290", calibratedOn: "2025-10-01", dueOn: "2026-10-01", usedFor: "ambient readings" },
    ],
    stepRecords,
    evaluation: { evaluatedAt: new Date("2026-03-03T09:02:00.000Z"), value: evaluation, stored },
    logs: [],
    review: { ...base.review, acknowledged: [], comments: "Observations complete." },
  };
  return buildRunCertificatePayload(records);
}
