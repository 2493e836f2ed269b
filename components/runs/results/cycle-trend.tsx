"use client";

import { useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import type uPlot from "uplot";
import { getJson } from "@/components/procedure-preview/post-json";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import type { CycleTrendView } from "@/lib/runs/cycle-trend-view";
import { formatNumber } from "@/protocols";
import { UplotChart } from "./uplot-chart";

const fmt = (x: number | null, decimals: number) => (x === null || !Number.isFinite(x) ? "—" : formatNumber(x, { minDecimals: decimals, maxDecimals: decimals }));
const thousands = (x: number) => Math.round(x).toLocaleString("en-GB").replace(/,/g, " ");

/** Draws a dashed vertical line and its words at one cycle (where the stop criterion was met). */
function markCycle(cycle: number, words: string): uPlot.Plugin {
  return {
    hooks: {
      draw: (u) => {
        const x = u.valToPos(cycle, "x", true);
        const { top, height } = u.bbox;
        const ctx = u.ctx;
        ctx.save();
        ctx.strokeStyle = "#9b2c2c";
        ctx.setLineDash([6, 4]);
        ctx.lineWidth = 1.5 * devicePixelRatio;
        ctx.beginPath();
        ctx.moveTo(x, top);
        ctx.lineTo(x, top + height);
        ctx.stroke();
        ctx.fillStyle = "#9b2c2c";
        ctx.font = `${12 * devicePixelRatio}px sans-serif`;
        ctx.textAlign = x > u.bbox.left + u.bbox.width / 2 ? "right" : "left";
        ctx.fillText(words, x + (ctx.textAlign === "right" ? -6 : 6) * devicePixelRatio, top + 14 * devicePixelRatio);
        ctx.restore();
      },
    },
  };
}

/**
 * Capacity retention per cycle (discharge capacity / rated), the stop share, the cycle where the stop
 * criterion was met, and a straight-line estimate of where it will be, marked as an estimate with its fit.
 * Asks the server again every `refreshMs` while log parts arrive.
 */
export function CycleTrend({ runId, initial, refreshMs }: { runId: string; initial: CycleTrendView; refreshMs: number }) {
  const q = useQuery({
    queryKey: ["run-cycles", runId],
    queryFn: ({ signal }) => getJson<CycleTrendView>(`/api/runs/${runId}/cycles`, signal),
    initialData: initial,
    refetchInterval: refreshMs,
    refetchIntervalInBackground: false,
  });
  const view = q.data;
  const chart = useMemo(() => buildChart(view), [view]);
  const latest = view.rows.slice(-10).reverse();
  return (
    <div className="flex flex-col gap-3" data-testid="cycle-trend">
      {chart ? (
        <figure data-testid="retention-plot">
          <UplotChart options={chart.options} data={chart.data} label="Capacity retention per cycle, as a share of rated capacity" />
          <figcaption className="mt-1 text-xs text-ink-soft">
            Discharge capacity of each cycle as a share of the rated capacity ({view.ratedCapacityMAh === null ? "not stated" : `${thousands(view.ratedCapacityMAh)} mAh`}). A cycle is shown once its
            discharge has ended; the latest may still change until the next charge begins.
          </figcaption>
        </figure>
      ) : (
        <p className="text-sm text-ink-soft">The cell specification states no rated capacity, so retention cannot be drawn; the cycles are listed below.</p>
      )}
      <StopLines view={view} />
      <p className="text-xs text-ink-soft" role="status">
        {thousands(view.sampleCount)} samples read
        {view.samplesArrivedAt ? `; the latest arrived ${view.samplesArrivedAt.replace("T", " ").slice(0, 16)} UTC` : ""}. This view asks for new cycles every{" "}
        {Math.round(refreshMs / 1000)} s{q.isError ? " (the last attempt failed; it tries again)" : ""}.
      </p>
      <Table data-testid="cycle-table" aria-label="The latest cycles">
        <TableHead>
          <HeaderCell>Cycle</HeaderCell>
          <HeaderCell>Discharge (mAh)</HeaderCell>
          <HeaderCell>Of rated</HeaderCell>
          <HeaderCell>Charge (mAh)</HeaderCell>
          <HeaderCell>Coulombic efficiency</HeaderCell>
          <HeaderCell>Energy efficiency</HeaderCell>
          <HeaderCell>End of charge (V)</HeaderCell>
          <HeaderCell>End of discharge (V)</HeaderCell>
          <HeaderCell>DC resistance (mΩ)</HeaderCell>
        </TableHead>
        <tbody>
          {latest.map((r) => (
            <Row key={r.cycle}>
              <Cell>
                {r.cycle}
                {r.closed ? "" : " (open)"}
              </Cell>
              <Cell>{fmt(r.dischargeMAh, 0)}</Cell>
              <Cell>{Number.isFinite(r.retentionPercent) ? `${fmt(r.retentionPercent, 1)} %` : "—"}</Cell>
              <Cell>{fmt(r.chargeMAh, 0)}</Cell>
              <Cell>{r.coulombicEfficiencyPercent === null ? "—" : `${fmt(r.coulombicEfficiencyPercent, 2)} %`}</Cell>
              <Cell>{r.energyEfficiencyPercent === null ? "—" : `${fmt(r.energyEfficiencyPercent, 1)} %`}</Cell>
              <Cell>{fmt(r.endOfChargeV, 3)}</Cell>
              <Cell>{fmt(r.endOfDischargeV, 3)}</Cell>
              <Cell>{fmt(r.dcResistanceMOhm, 1)}</Cell>
            </Row>
          ))}
        </tbody>
      </Table>
      {view.rows.length > latest.length && <p className="text-xs text-ink-soft">The latest {latest.length} of {view.rows.length} cycles; every cycle is in the plot.</p>}
    </div>
  );
}

function StopLines({ view }: { view: CycleTrendView }) {
  if (!view.stop) {
    return <p className="text-sm">The procedure states no stop criterion for this run, so no stop line or estimate is drawn.</p>;
  }
  const { stop, stopReached, estimate } = view;
  return (
    <div className="flex flex-col gap-1 text-sm">
      <p>
        Stop criterion ({stop.source}): a checked cycle{stop.checkEveryCycles > 1 ? ` (every ${stop.checkEveryCycles}th)` : ""} below {fmt(stop.stopBelowPercentOfRated, 0)} % of rated
        {stop.maxCycles !== null ? `, or ${stop.maxCycles} cycles` : ""}.
      </p>
      {stopReached ? (
        <p data-testid="stop-reached" className="font-semibold">
          Met at cycle {stopReached.cycle}: {stopReached.words}.
        </p>
      ) : estimate?.cycle ? (
        <p data-testid="stop-estimate">
          <span className="font-semibold">Estimate: cycle {estimate.cycle}.</span> An extrapolation, not a measurement: a straight line fitted by least squares to cycles {estimate.fit.fromCycle}–
          {estimate.fit.toCycle} (slope {fmt(estimate.fit.slopePercentPerCycle, 4)} % of rated per cycle, r² = {fmt(estimate.fit.rSquared, 3)}) falls below {fmt(stop.stopBelowPercentOfRated, 0)} % there.
        </p>
      ) : estimate && estimate.cycle === null ? (
        <p data-testid="stop-estimate">No estimate yet: {estimate.why}.</p>
      ) : null}
    </div>
  );
}

function buildChart(view: CycleTrendView): { options: Omit<uPlot.Options, "width">; data: uPlot.AlignedData } | null {
  if (view.ratedCapacityMAh === null || view.rows.length === 0) return null;
  const cycles = view.rows.map((r) => r.cycle);
  const estimate = view.estimate?.cycle ? view.estimate : null;
  const xs = estimate && estimate.cycle > (cycles[cycles.length - 1] ?? 0) ? [...cycles, estimate.cycle] : cycles;
  const retention: (number | null)[] = xs.map((_, k) => view.rows[k]?.retentionPercent ?? null);
  const series: uPlot.Series[] = [{ label: "Cycle" }, { label: "Retention (% of rated)", stroke: "#1f4e8c", width: 1.5, points: { show: view.rows.length <= 200, size: 4 } }];
  const data: (number | null)[][] = [xs, retention];
  if (view.stop) {
    series.push({ label: `Stop share (${view.stop.stopBelowPercentOfRated} %)`, stroke: "#9b2c2c", width: 1, dash: [4, 4], points: { show: false } });
    data.push(xs.map(() => view.stop?.stopBelowPercentOfRated ?? null));
  }
  if (estimate) {
    const { slopePercentPerCycle: m, interceptPercent: b, fromCycle } = estimate.fit;
    series.push({ label: "Fitted line (estimate)", stroke: "#b87333", width: 1.5, dash: [8, 5], points: { show: false } });
    data.push(xs.map((x) => (x >= fromCycle ? m * x + b : null)));
  }
  const plugins = view.stopReached ? [markCycle(view.stopReached.cycle, `stop met, cycle ${view.stopReached.cycle}`)] : [];
  return {
    data: data as uPlot.AlignedData,
    options: {
      height: 300,
      plugins,
      scales: { x: { time: false } },
      axes: [{ label: "Cycle" }, { label: "Discharge capacity (% of rated)" }],
      series,
    },
  };
}
