/** One discharge's voltage against the charge it delivered, thinned, as the certificate plots it. */
export interface DischargeCurve {
  stepId: string;
  cycle: number;
  label: string;
  capacityMAh: number[];
  voltageV: number[];
}

export interface PlotTick {
  value: number;
  /** Position along the axis in points from the plot area's left (x) or top (y). */
  at: number;
}

export interface VqPlotLayout {
  width: number;
  height: number;
  /** Polyline points inside the plot area, "x,y x,y …" in points. */
  points: string;
  xTicks: PlotTick[];
  yTicks: PlotTick[];
  xMax: number;
  yMin: number;
  yMax: number;
}

/** Tick spacing of 1, 2 or 5 × 10ⁿ giving about `count` intervals over `span` (a common charting rule). */
export function chooseTickStep(span: number, count: number): number {
  if (!(span > 0)) return 1;
  const raw = span / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * power;
}

function ticksFor(min: number, max: number, step: number): number[] {
  const out: number[] = [];
  for (let k = Math.ceil(min / step - 1e-9); k * step <= max + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/**
 * Scales a curve into a plot area of `width` × `height` points: x from 0 to a round number above
 * the largest capacity, y between round voltages around the curve. Pure, so the geometry is tested
 * apart from the PDF.
 */
export function layOutVqPlot(curve: Pick<DischargeCurve, "capacityMAh" | "voltageV">, width: number, height: number): VqPlotLayout {
  const n = Math.min(curve.capacityMAh.length, curve.voltageV.length);
  const xs = curve.capacityMAh.slice(0, n);
  const ys = curve.voltageV.slice(0, n);
  const xStep = chooseTickStep(Math.max(1, ...xs), 6);
  const xMax = Math.max(xStep, Math.ceil(Math.max(0, ...xs) / xStep) * xStep);
  const low = Math.min(...ys);
  const high = Math.max(...ys);
  const yStep = chooseTickStep(Math.max(0.1, high - low), 5);
  const yMin = n > 0 ? Math.floor(low / yStep) * yStep : 0;
  const yMax = n > 0 ? Math.max(yMin + yStep, Math.ceil(high / yStep) * yStep) : 1;
  const px = (x: number) => (x / xMax) * width;
  const py = (y: number) => height - ((y - yMin) / (yMax - yMin)) * height;
  const points = xs.map((x, i) => `${px(x).toFixed(2)},${py(ys[i] as number).toFixed(2)}`).join(" ");
  return {
    width,
    height,
    points,
    xTicks: ticksFor(0, xMax, xStep).map((value) => ({ value, at: px(value) })),
    yTicks: ticksFor(yMin, yMax, yStep).map((value) => ({ value, at: py(value) })),
    xMax,
    yMin,
    yMax,
  };
}
