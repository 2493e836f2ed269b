import type uPlot from "uplot";
import type { SeriesStepBand } from "@/lib/runs/run-series-view";

const FILL: Record<string, string> = { charge: "rgba(184, 115, 51, 0.12)", discharge: "rgba(40, 90, 160, 0.12)", rest: "rgba(120, 120, 120, 0.08)" };

/** Shades each step's stretch of the time axis behind the lines, with its label on top. */
export function shadeStepBands(bands: readonly SeriesStepBand[]): uPlot.Plugin {
  return {
    hooks: {
      drawClear: (u) => {
        const { ctx } = u;
        const { top, height } = u.bbox;
        ctx.save();
        ctx.font = `${11 * devicePixelRatio}px sans-serif`;
        for (const b of bands) {
          const x0 = u.valToPos(b.startS / 3600, "x", true);
          const x1 = u.valToPos(b.endS / 3600, "x", true);
          ctx.fillStyle = FILL[b.kind] ?? FILL.rest!;
          ctx.fillRect(x0, top, Math.max(1, x1 - x0), height);
          ctx.fillStyle = "#333";
          if (x1 - x0 > 40 * devicePixelRatio) ctx.fillText(b.label, x0 + 4, top + 14 * devicePixelRatio);
        }
        ctx.restore();
      },
    },
  };
}
