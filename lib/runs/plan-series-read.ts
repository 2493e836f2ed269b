import { downsampleLttb } from "@/lib/analysis";

/** Below this many samples per requested point, reading every sample costs less than it saves. */
export const EVERY_SAMPLE_FACTOR = 64;
/** A strided read takes this many samples per requested point, then LTTB keeps the telling ones. */
export const STRIDE_OVERSAMPLE = 4;
export const MIN_POINTS = 50;
export const MAX_POINTS = 10_000;

export type SeriesRead = { kind: "every-sample"; from: number; to: number } | { kind: "strided"; indexes: number[] };

/**
 * How to read [from, to] for a plot of `points` points: every sample when the stretch is short,
 * otherwise evenly spaced samples (first and last kept), a few per point, for LTTB to thin.
 */
export function planSeriesRead({ from, to, points }: { from: number; to: number; points: number }): SeriesRead {
  const count = to - from + 1;
  if (count <= points * EVERY_SAMPLE_FACTOR) return { kind: "every-sample", from, to };
  const n = points * STRIDE_OVERSAMPLE;
  const indexes: number[] = [];
  for (let k = 0; k < n; k++) {
    const index = from + Math.round((k * (count - 1)) / (n - 1));
    if (index !== indexes.at(-1)) indexes.push(index);
  }
  return { kind: "strided", indexes };
}

/**
 * Charge passed since the first sample, in Ah, as a positive count: the trapezoid rule on |I| over
 * time (definition: Q = ∫|I| dt, divided by 3 600 s/h).
 */
export function accumulateCapacityAh(timeS: Float64Array, currentA: Float64Array): Float64Array {
  const out = new Float64Array(timeS.length);
  for (let k = 1; k < timeS.length; k++) {
    const dt = (timeS[k] as number) - (timeS[k - 1] as number);
    const meanAbs = (Math.abs(currentA[k] as number) + Math.abs(currentA[k - 1] as number)) / 2;
    out[k] = (out[k - 1] as number) + (meanAbs * dt) / 3600;
  }
  return out;
}

/**
 * Thins a plot's channels to `points` by LTTB on (x, y) and keeps the same samples of the other
 * channels, so every line of a plot shares one x axis.
 */
export function thinChannels<K extends string>(
  x: Float64Array,
  y: Float64Array,
  others: Partial<Record<K, Float64Array>>,
  points: number,
): { x: number[]; y: number[]; others: Partial<Record<K, number[]>> } {
  const thinned = downsampleLttb({ x, y }, Math.max(2, points));
  const indexes = thinned.ok ? thinned.value.indexes : Int32Array.from(x, (_, i) => i);
  const take = (a: Float64Array) => Array.from(indexes, (i) => a[i] as number);
  const picked: Partial<Record<K, number[]>> = {};
  for (const key of Object.keys(others) as K[]) {
    const a = others[key];
    if (a) picked[key] = take(a);
  }
  return { x: take(x), y: take(y), others: picked };
}
