"use client";

import dynamic from "next/dynamic";

/** The overlay chart with uPlot in a script of its own, loaded beside the curves' data (docs/decisions/fast-pages.md). */
export const OverlayChart = dynamic(() => import("./overlay-chart").then((m) => m.OverlayChart), {
  ssr: false,
  loading: () => (
    <p role="status" className="text-sm text-ink-soft">
      Loading the curves…
    </p>
  ),
});
