import type { LotMemberResult } from "@/db/lot-sampling";
import { summariseStatistics, type SummaryResult } from "@/lib/lots/results/summarise-results";
import type { LotDecision, SamplingPlan } from "@/lib/lots/sampling";
import { findReferenceGroup, groupByCurrent } from "@/lib/statistics";
import type { CellSpecification, StoredDecisionRule } from "@/protocols";
import { formatNumber } from "@/protocols/format-number";
import { describeCertifiedCell, NO_EXTERNAL_PROVIDERS, REPRODUCTION, sign } from "./build-run-payload";
import {
  CERTIFICATE_PAYLOAD_FORMAT,
  type LotCertificateCell,
  type LotCertificatePayload,
  type LotCertificateStatistics,
} from "./certificate-payload";

/** One discharge result of a sampled run (db/discharge-results.ts DischargeResultRow fits). */
export interface LotSampleResult extends SummaryResult {
  runId: string;
  cycle: number;
}

/** A run counted in the sample, as the certificate names it. */
export interface LotSampledRun {
  runId: string;
  runNumber: string;
  /** The run's valid certificate, if one was issued. */
  certificate: string | null;
  procedure: { code: string; title: string; version: number; standard: string; clause: string };
  decisionRule: StoredDecisionRule;
  testing: { from: string | null; to: string | null };
}

/** Everything a lot certificate states, gathered from the records (lot-certificate-basis.ts). */
export interface LotCertificateRecords {
  number: string;
  issuedAt: Date;
  lab: { name: string; address: string; accreditation: string | null };
  customer: string | null;
  replaces: { number: string; reason: string } | null;
  lot: { identifier: string; supplier: string; quantityReceived: number; receivedOn: string };
  cell: { maker: string; model: string; designation: string; data: CellSpecification };
  plan: SamplingPlan;
  acceptanceProcedure: string | null;
  draw: { method: "random" | "chosen"; seed: string | null; positions: number[]; drawnAt: Date; drawnBy: string };
  members: { position: number; specimenIdentifier: string | null; result: LotMemberResult; runId: string | null; runNumber: string | null }[];
  counts: { drawn: number; registered: number; tested: number; nonconforming: number; notDecided: number };
  decision: LotDecision;
  runs: LotSampledRun[];
  results: LotSampleResult[];
  approval: { printedName: string; signedAt: Date };
  meaningWords: { approved: string };
}

export const LOT_RESULTS_RELATE = "The results relate only to the cells tested; the lot decision rests on the sample.";

const cells = (n: number) => `${formatNumber(n)} ${n === 1 ? "cell" : "cells"}`;

/**
 * ISO 2859-1 indexes its plans by AQL for a continuing series of lots and switches between normal,
 * tightened and reduced inspection by the results of successive lots; ISO 2859-2 gives plans indexed
 * by limiting quality for a lot in isolation (both [published]: the standards' scopes, cited by number).
 * The switching rules are not applied here, and ISO 2859-2 is not implemented.
 */
export const SAMPLING_CONTEXT =
  "The sampling plan is an ISO 2859-1 single sampling plan at normal inspection. The switching rules of ISO 2859-1 (to tightened or reduced inspection) were not applied, and the plan's AQL assumes a continuing series of lots. " +
  "For a lot in isolation, ISO 2859-2 (plans indexed by limiting quality) is the applicable approach; it is not implemented in this software, so this decision is made with the ISO 2859-1 plan as if the lot were one of a series.";

function describeDraw(draw: LotCertificateRecords["draw"], lotSize: number): string {
  if (draw.method === "chosen" && draw.positions.length === lotSize) return `The whole lot, tray positions 1 to ${formatNumber(lotSize)}, taken as the sample (100 % inspection).`;
  if (draw.method === "chosen") return `${cells(draw.positions.length)} at tray positions chosen and entered by ${draw.drawnBy}.`;
  return (
    `${cells(draw.positions.length)} of the tray positions 1 to ${formatNumber(lotSize)} drawn at random by ${draw.drawnBy} with seed ${draw.seed ?? "?"}: ` +
    `the positions shuffled by Fisher–Yates driven by the mulberry32 generator from the seed, the first ${formatNumber(draw.positions.length)} taken. The same seed gives the same draw.`
  );
}

/**
 * The 0.2 It capacity discharge of each sampled run: the group of results at 0.2 It (lib/statistics,
 * ±2 % of the current), and of a run's repeated cycles the last one (the cycle its statement rests on
 * when the procedure repeats until the capacity is met, IEC 61960-3 7.3.1).
 */
function pickReferenceResultPerRun(results: readonly LotSampleResult[], ratedCapacityMah: number): Map<string, LotSampleResult> {
  const grouped = groupByCurrent({ results, ratedCapacityMah });
  const reference = grouped.ok ? findReferenceGroup(grouped.value, ratedCapacityMah) : null;
  const byRun = new Map<string, LotSampleResult>();
  for (const r of reference?.members ?? []) {
    const kept = byRun.get(r.runId);
    if (!kept || kept.cycle < r.cycle) byRun.set(r.runId, r);
  }
  return byRun;
}

function summariseSample(picked: readonly LotSampleResult[], cell: CellSpecification): { statistics: LotCertificateStatistics | null; note: string | null } {
  if (picked.length === 0) return { statistics: null, note: "No sampled run has a capacity discharge at 0.2 It, so no statistics are given." };
  const summary = summariseStatistics(picked, cell);
  const group = summary.currents.find((c) => c.isReferenceCurrent);
  if (!group) return { statistics: null, note: summary.problem ?? "No group of results at 0.2 It." };
  if (!group.capacity.ok) return { statistics: null, note: group.capacity.error.message };
  const c = group.capacity.value;
  const rated = c.rated ?? { rated: cell.ratedCapacityMah, countAtOrAbove: 0, shareAtOrAbove: 0 };
  return {
    note: null,
    statistics: {
      currentA: group.currentA,
      count: c.count,
      meanMAh: c.mean,
      standardDeviationMAh: c.standardDeviation,
      minMAh: c.min,
      maxMAh: c.max,
      ratedCapacityMAh: rated.rated,
      countAtOrAboveRated: rated.countAtOrAbove,
      shareAtOrAboveRated: rated.shareAtOrAbove,
      minimumCapacityMAh: c.capability?.lowerLimit ?? null,
      cpl: c.capability?.cpl ?? null,
      cplFormula: c.capability?.formula ?? "Cpl = (mean − LSL) / (3 s)",
      cplSource: c.capability?.source ?? "",
      note: c.capability ? (c.capability.note ?? (c.count < 30 ? `Cpl from ${c.count} results is a rough figure; it assumes roughly normal results.` : null)) : "The datasheet gives no minimum capacity, so Cpl is not given.",
    },
  };
}

function spanOf(runs: readonly LotSampledRun[]): { from: string | null; to: string | null } {
  const from = runs.map((r) => r.testing.from).filter((t): t is string => t !== null).sort();
  const to = runs.map((r) => r.testing.to).filter((t): t is string => t !== null).sort();
  return { from: from[0] ?? null, to: to.at(-1) ?? null };
}

/**
 * The payload of a lot certificate from the gathered records. Pure: the same records give the same
 * payload (and hash). Whether a certificate may be issued is decided in issue-lot-certificate.ts.
 */
export function buildLotCertificatePayload(records: LotCertificateRecords): LotCertificatePayload {
  const { plan, decision, lot } = records;
  if (decision.verdict === "pending") throw new Error(`lot ${lot.identifier}: a pending lot decision gets no certificate`);
  const cell = records.cell.data;
  const runs = new Map(records.runs.map((r) => [r.runId, r]));
  const reference = pickReferenceResultPerRun(
    records.results.filter((r) => runs.has(r.runId)),
    cell.ratedCapacityMah,
  );
  const sample: LotCertificateCell[] = records.members.map((m) => {
    const picked = m.runId ? reference.get(m.runId) : undefined;
    return {
      position: m.position,
      specimen: m.specimenIdentifier,
      run: m.runNumber,
      runCertificate: (m.runId && runs.get(m.runId)?.certificate) ?? null,
      result: m.result,
      capacityMAh: picked ? picked.capacityAh * 1000 : null,
      energyWh: picked?.energyWh ?? null,
      currentA: picked?.currentA ?? null,
    };
  });
  const counted = records.members.flatMap((m) => (m.runId ? [reference.get(m.runId)] : [])).filter((r): r is LotSampleResult => r !== undefined);
  const { statistics, note } = summariseSample(counted, cell);
  const procedures = [...new Map(records.runs.map((r) => [`${r.procedure.code}#${r.procedure.version}`, r.procedure])).values()];
  const verdictWords = decision.verdict === "accept" ? "lot accepted" : "lot rejected";
  return {
    format: CERTIFICATE_PAYLOAD_FORMAT,
    subject: "lot",
    title: "Lot certificate",
    number: records.number,
    issuedAt: records.issuedAt.toISOString(),
    lab: records.lab,
    placeOfWork: `At the laboratory's premises: ${records.lab.address}`,
    customer: records.customer,
    replaces: records.replaces,
    statements: { resultsRelateToItem: LOT_RESULTS_RELATE, externalProviders: NO_EXTERNAL_PROVIDERS, reproduction: REPRODUCTION },
    approval: sign(records.approval.printedName, "approved", records.meaningWords.approved, records.approval.signedAt),
    lot,
    cell: describeCertifiedCell(records.cell),
    method: { acceptanceProcedure: records.acceptanceProcedure, procedures },
    samplingPlan: {
      source: plan.source,
      inspectionLevel: plan.inspectionLevel,
      aql: plan.aqlLabel,
      severity: plan.severity,
      initialCodeLetter: plan.initialCodeLetter,
      codeLetter: plan.codeLetter,
      sampleSize: plan.sampleSize,
      tableSampleSize: plan.tableSampleSize,
      acceptanceNumber: plan.acceptanceNumber,
      rejectionNumber: plan.rejectionNumber,
      hundredPercent: plan.hundredPercent,
      hundredPercentNote: plan.hundredPercent
        ? `The table's sample size n = ${formatNumber(plan.tableSampleSize)} reaches the lot size of ${formatNumber(plan.lotSize)}: every cell of the lot is inspected (100 %).`
        : null,
      explanation: plan.explanation,
    },
    draw: {
      method: records.draw.method,
      seed: records.draw.seed,
      positions: records.draw.positions,
      drawnAt: records.draw.drawnAt.toISOString(),
      drawnBy: records.draw.drawnBy,
      description: describeDraw(records.draw, lot.quantityReceived),
    },
    sample,
    counts: records.counts,
    lotDecision: { verdict: decision.verdict, words: verdictWords, statement: decision.statement, rule: decision.rule },
    cellDecisionRules: [...new Set(records.runs.map((r) => r.decisionRule))].sort(),
    statistics,
    statisticsNote: note,
    testing: spanOf(records.runs),
    samplingContext: SAMPLING_CONTEXT,
    sampleStatement:
      `The lot decision rests on the sample: ${cells(records.counts.drawn)} drawn under the plan above, of which ${cells(records.counts.tested)} tested with a statement of conformity. ` +
      `The results relate only to the cells tested; for the cells not drawn the certificate states the lot decision of ISO 2859-1 single sampling, not a result.`,
  };
}
