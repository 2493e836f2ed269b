import "server-only";
import { getDb } from "@/db";
import { getReviewedDischargeStretch, type DischargeResultRow } from "@/db/discharge-results";
import { listDischargeResults } from "./list-discharge-results";
import { readChannelRange } from "@/db/run-series";
import { accumulateCapacityAh, thinChannels } from "@/lib/runs/plan-series-read";
import { computeMultipleOfIt, formatDischargeKey, type DischargeKey } from "./compare-selection";
import type { OverlaySeries, OverlaySeriesView } from "./compare-series-view";
import { isAboveRating } from "./summarise-results";

/** The reviewed discharges named by the keys, in the order asked; keys that name none are left out. */
export async function findChosenDischarges(keys: readonly DischargeKey[]): Promise<{ found: { key: DischargeKey; row: DischargeResultRow }[]; missing: DischargeKey[] }> {
  const rows = await listDischargeResults(getDb(), { runNumbers: [...new Set(keys.map((k) => k.runNumber))] });
  const found: { key: DischargeKey; row: DischargeResultRow }[] = [];
  const missing: DischargeKey[] = [];
  for (const key of keys) {
    const row = rows.find((r) => r.runNumber === key.runNumber && r.stepId === key.stepId && r.cycle === key.cycle);
    if (row) found.push({ key, row });
    else missing.push(key);
  }
  return { found, missing };
}

async function readOneSeries(row: DischargeResultRow, points: number): Promise<OverlaySeries | string> {
  const stretch = await getReviewedDischargeStretch(getDb(), { evaluationId: row.evaluationId, stepId: row.stepId, cycle: row.cycle });
  if (!stretch) return "the reviewed evaluation placed this discharge on no stretch of a data log";
  // Q needs every sample of the discharge (an integral), so the whole stretch is read, then thinned.
  const c = await readChannelRange(getDb(), { runLogId: stretch.runLogId, channels: ["time_s", "voltage_v", "current_a"], from: stretch.from, to: stretch.to });
  if (!c.time_s || !c.voltage_v || !c.current_a) return "the data log of the reviewed evaluation is no longer stored";
  const capacityAh = accumulateCapacityAh(c.time_s, c.current_a);
  const thinned = thinChannels(capacityAh.map((q) => q * 1000), c.voltage_v, {}, points);
  return {
    key: formatDischargeKey(row),
    runNumber: row.runNumber,
    specimenIdentifier: row.specimenIdentifier,
    specificationName: row.specificationName,
    stepLabel: row.stepLabel,
    currentA: row.currentA,
    multipleOfIt: computeMultipleOfIt(row),
    aboveRating: isAboveRating(row, row.rating.maxContinuousDischargeCurrentA),
    sampleCount: stretch.to - stretch.from + 1,
    capacityMAh: thinned.x,
    voltageV: thinned.y,
  };
}

/**
 * V against Q of each chosen discharge, from the log stretch the reviewed evaluation placed it on,
 * thinned by LTTB to about `points` each (lib/runs/plan-series-read.ts, as the run's own plots are).
 */
export async function readOverlaySeries(keys: readonly DischargeKey[], points: number): Promise<OverlaySeriesView> {
  const { found, missing } = await findChosenDischarges(keys);
  const read = await Promise.all(found.map(({ row }) => readOneSeries(row, points)));
  const view: OverlaySeriesView = {
    series: [],
    missing: missing.map((k) => ({ key: formatDischargeKey(k), reason: "not a capacity discharge of a reviewed run" })),
  };
  read.forEach((r, i) => {
    if (typeof r === "string") view.missing.push({ key: formatDischargeKey(found[i]!.key), reason: r });
    else view.series.push(r);
  });
  return view;
}
