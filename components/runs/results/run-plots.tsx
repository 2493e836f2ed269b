"use client";

import { useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import type uPlot from "uplot";
import { getJson } from "@/components/procedure-preview/post-json";
import type { CapacitySeriesView, TimeSeriesView } from "@/lib/runs/run-series-view";
import { formatRunSeriesUrl } from "@/lib/runs/run-series-url";
import { shadeStepBands } from "./step-bands-plugin";
import { UplotChart } from "./uplot-chart";


/** V, I and T against time (hours), steps shaded; the server thins the log to about 2 000 points. */
export function TimePlot({ runId }: { runId: string }) {
  const q = useQuery({ queryKey: ["run-series", runId, "time"], queryFn: ({ signal }) => getJson<TimeSeriesView>(formatRunSeriesUrl(runId), signal) });
  const chart = useMemo(() => {
    if (!q.data) return null;
    const s = q.data;
    const hours = s.timeS.map((t) => t / 3600);
    const data: uPlot.AlignedData = s.temperatureC ? [hours, s.voltageV, s.currentA, s.temperatureC] : [hours, s.voltageV, s.currentA];
    const options: Omit<uPlot.Options, "width"> = {
      height: 320,
      plugins: [shadeStepBands(s.steps)],
      scales: { x: { time: false } },
      axes: [
        { label: "Time (h)" },
        { label: "Voltage (V)", scale: "V" },
        { label: "Current (A)", scale: "A", side: 1, grid: { show: false } },
        ...(s.temperatureC ? [{ label: "Temperature (°C)", scale: "°C", side: 1, grid: { show: false } } as uPlot.Axis] : []),
      ],
      series: [
        { label: "Time (h)" },
        { label: "Voltage (V)", scale: "V", stroke: "#1f4e8c", width: 1.5 },
        { label: "Current (A)", scale: "A", stroke: "#b87333", width: 1 },
        ...(s.temperatureC ? [{ label: "Temperature (°C)", scale: "°C", stroke: "#5a7d2a", width: 1 }] : []),
      ],
    };
    return { data, options, s };
  }, [q.data]);
  if (q.isPending) return <p role="status" className="text-sm text-ink-soft">Loading the log plot…</p>;
  if (q.isError) return <p role="alert" className="text-sm text-deviates">The log plot could not be loaded: {q.error.message}</p>;
  if (!chart) return null;
  return (
    <figure data-testid="time-plot">
      <UplotChart options={chart.options} data={chart.data} label="Voltage, current and temperature against time, with the steps shaded" />
      <figcaption className="mt-1 text-xs text-ink-soft">
        {chart.s.timeS.length} of {chart.s.sampleCount} samples drawn ({chart.s.read === "strided" ? "evenly spaced samples, thinned by LTTB" : "every sample, thinned by LTTB"}). Shaded: charge (copper), discharge (blue), rest (grey).
      </figcaption>
    </figure>
  );
}

/** Voltage against the capacity delivered, one plot per discharge step. */
export function CapacityPlot({ runId, stepId, cycle, label }: { runId: string; stepId: string; cycle: number; label: string }) {
  const q = useQuery({
    queryKey: ["run-series", runId, stepId, cycle],
    queryFn: ({ signal }) => getJson<CapacitySeriesView>(formatRunSeriesUrl(runId, { stepId, cycle }), signal),
  });
  const chart = useMemo(() => {
    if (!q.data) return null;
    const options: Omit<uPlot.Options, "width"> = {
      height: 260,
      scales: { x: { time: false } },
      axes: [{ label: "Capacity delivered (mAh)" }, { label: "Voltage (V)" }],
      series: [{ label: "Capacity (mAh)" }, { label: "Voltage (V)", stroke: "#1f4e8c", width: 1.5 }],
    };
    return { options, data: [q.data.capacityMAh, q.data.voltageV] as uPlot.AlignedData };
  }, [q.data]);
  const title = `${label}${cycle > 1 ? ` (cycle ${cycle})` : ""}: voltage against capacity`;
  if (q.isPending) return <p role="status" className="text-sm text-ink-soft">Loading {title}…</p>;
  if (q.isError) return <p role="alert" className="text-sm text-deviates">{title} could not be loaded: {q.error.message}</p>;
  if (!chart) return null;
  return (
    <figure data-testid="capacity-plot">
      <figcaption className="mb-1 text-sm font-semibold">{title}</figcaption>
      <UplotChart options={chart.options} data={chart.data} label={title} />
    </figure>
  );
}
