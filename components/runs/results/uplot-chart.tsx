"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { formatDistinctTicks } from "./format-distinct-ticks";

/** Every axis without its own formatter gets tick labels that are all different. */
function withDistinctTicks(options: Omit<uPlot.Options, "width">): Omit<uPlot.Options, "width"> {
  const axes = (options.axes ?? [{}, {}]).map((axis) => (axis.values ? axis : { ...axis, values: (_u: uPlot, splits: number[], _i: number, _space: number, incr: number) => formatDistinctTicks(splits, incr) }));
  return { ...options, axes };
}

/** A uPlot chart made once its box is in the page, and remade when its data or options change. */
export function UplotChart({ options, data, label }: { options: Omit<uPlot.Options, "width">; data: uPlot.AlignedData; label: string }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const plot = new uPlot({ ...withDistinctTicks(options), width: Math.max(320, el.clientWidth) }, data, el);
    const resize = new ResizeObserver(() => plot.setSize({ width: Math.max(320, el.clientWidth), height: options.height }));
    resize.observe(el);
    return () => {
      resize.disconnect();
      plot.destroy();
    };
  }, [options, data]);
  return <div ref={box} role="img" aria-label={label} className="w-full" />;
}
