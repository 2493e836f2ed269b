"use client";

import { useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import uPlot from "uplot";
import { getJson } from "@/components/procedure-preview/post-json";
import { UplotChart } from "@/components/runs/results/uplot-chart";
import type { OverlaySeriesView } from "@/lib/lots/results/compare-series-view";
import type { OverlayStyle } from "@/lib/lots/results/overlay-style";
import { formatOverlaySeriesUrl, OVERLAY_POINTS as POINTS } from "@/lib/lots/results/overlay-series-url";

/** The chosen discharges' V–Q curves in one uPlot chart; each curve keeps the colour and pattern of its legend row. */
export function OverlayChart({ keys, styles }: { keys: string[]; styles: Record<string, OverlayStyle> }) {
  const url = formatOverlaySeriesUrl(keys);
  const q = useQuery({ queryKey: ["overlay-series", url], queryFn: ({ signal }) => getJson<OverlaySeriesView>(url, signal) });
  const chart = useMemo(() => {
    if (!q.data || q.data.series.length === 0) return null;
    const { series } = q.data;
    // Each discharge has its own Q values; uPlot.join puts them on one x axis, with gaps spanned.
    const data = uPlot.join(series.map((s) => [s.capacityMAh, s.voltageV] as uPlot.AlignedData));
    const options: Omit<uPlot.Options, "width"> = {
      height: 380,
      legend: { show: false },
      scales: { x: { time: false } },
      axes: [{ label: "Capacity delivered (mAh)" }, { label: "Voltage (V)" }],
      series: [
        { label: "Capacity (mAh)" },
        ...series.map((s) => {
          const style = styles[s.key];
          return { label: `${s.runNumber} ${s.specimenIdentifier}`, stroke: style?.colour ?? "#1d2126", dash: style?.dash ?? [], width: 1.75, spanGaps: true, points: { show: false } };
        }),
      ],
    };
    return { data, options, count: series.length };
  }, [q.data, styles]);
  if (keys.length === 0) return null;
  if (q.isPending) return <p role="status" className="text-sm text-ink-soft">Loading the curves…</p>;
  if (q.isError) return <p role="alert" className="text-sm text-deviates">The curves could not be loaded: {q.error.message}</p>;
  return (
    <figure data-testid="overlay-plot">
      {chart ? (
        <UplotChart options={chart.options} data={chart.data} label={`Voltage against capacity delivered, ${chart.count} discharges overlaid`} />
      ) : (
        <p className="text-sm text-ink-soft">None of the chosen discharges has a curve to draw.</p>
      )}
      {q.data.missing.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-sm text-deviates" role="status">
          {q.data.missing.map((m) => (
            <li key={m.key}>
              {m.key}: not drawn, {m.reason}.
            </li>
          ))}
        </ul>
      )}
      <figcaption className="mt-1 text-xs text-ink-soft">Each curve is thinned on the server by LTTB to about {POINTS} points from every sample of the discharge.</figcaption>
    </figure>
  );
}
