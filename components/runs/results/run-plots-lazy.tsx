"use client";

import dynamic from "next/dynamic";

const loading = () => (
  <p role="status" className="text-sm text-ink-soft">
    Loading the log plot…
  </p>
);

/** The run's plots with uPlot in a script of its own, loaded beside the series data (docs/decisions/fast-pages.md). */
export const TimePlot = dynamic(() => import("./run-plots").then((m) => m.TimePlot), { ssr: false, loading });
export const CapacityPlot = dynamic(() => import("./run-plots").then((m) => m.CapacityPlot), { ssr: false, loading });
export const CycleTrend = dynamic(() => import("./cycle-trend").then((m) => m.CycleTrend), {
  ssr: false,
  loading: () => (
    <p role="status" className="text-sm text-ink-soft">
      Loading the capacity trend…
    </p>
  ),
});
