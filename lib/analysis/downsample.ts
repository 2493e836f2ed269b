import { fail, succeed, type AnalysisResult } from "./analysis-result";

export interface Series {
  x: Float64Array;
  y: Float64Array;
}

export interface DownsampledSeries extends Series {
  /** Index of each kept point in the input, increasing, so other channels can be picked alike. */
  indexes: Int32Array;
}

function checkSeries(series: Series, targetPoints: number): string | null {
  if (series.x.length !== series.y.length) return `x has ${series.x.length} points but y has ${series.y.length}.`;
  if (!Number.isInteger(targetPoints) || targetPoints < 2) return "Keep at least 2 points (the first and the last).";
  return null;
}

function keepAll(series: Series): DownsampledSeries {
  const indexes = new Int32Array(series.x.length);
  for (let i = 0; i < indexes.length; i++) indexes[i] = i;
  return { x: series.x, y: series.y, indexes };
}

function pick(series: Series, indexes: Int32Array): DownsampledSeries {
  const x = new Float64Array(indexes.length);
  const y = new Float64Array(indexes.length);
  for (let k = 0; k < indexes.length; k++) {
    x[k] = series.x[indexes[k] as number] as number;
    y[k] = series.y[indexes[k] as number] as number;
  }
  return { x, y, indexes };
}

/**
 * Largest-triangle-three-buckets (S. Steinarsson, "Downsampling Time Series for Visual
 * Representation", 2013): split the inner points into targetPoints − 2 buckets and keep from each
 * the point that makes the largest triangle with the point kept before it and the mean of the
 * next bucket. First and last points are always kept; a target at or above the length returns the
 * input arrays themselves.
 */
export function downsampleLttb(series: Series, targetPoints: number): AnalysisResult<DownsampledSeries> {
  const problem = checkSeries(series, targetPoints);
  if (problem) return fail("invalid-input", problem);
  const { x, y } = series;
  const n = x.length;
  if (targetPoints >= n) return succeed(keepAll(series));

  const indexes = new Int32Array(targetPoints);
  const bucketSize = (n - 2) / (targetPoints - 2);
  let a = 0;
  for (let bucket = 0; bucket < targetPoints - 2; bucket++) {
    const nextFrom = Math.floor((bucket + 1) * bucketSize) + 1;
    const nextTo = Math.min(Math.floor((bucket + 2) * bucketSize) + 1, n);
    let meanX = 0;
    let meanY = 0;
    for (let k = nextFrom; k < nextTo; k++) {
      meanX += x[k] as number;
      meanY += y[k] as number;
    }
    const nextCount = nextTo - nextFrom;
    meanX /= nextCount;
    meanY /= nextCount;

    const ax = x[a] as number;
    const ay = y[a] as number;
    let bestArea = -1;
    let bestIndex = Math.floor(bucket * bucketSize) + 1;
    const to = Math.floor((bucket + 1) * bucketSize) + 1;
    for (let k = bestIndex; k < to; k++) {
      const area = Math.abs((ax - meanX) * ((y[k] as number) - ay) - (ax - (x[k] as number)) * (meanY - ay));
      if (area > bestArea) {
        bestArea = area;
        bestIndex = k;
      }
    }
    indexes[bucket + 1] = bestIndex;
    a = bestIndex;
  }
  indexes[targetPoints - 1] = n - 1;
  return succeed(pick(series, indexes));
}

/**
 * Min-max per bucket: the inner points are split into ⌊(targetPoints − 2) / 2⌋ buckets and each
 * keeps its lowest and highest y in x order, so spikes always survive. First and last points are
 * kept; the result has at most targetPoints points.
 */
export function downsampleMinMax(series: Series, targetPoints: number): AnalysisResult<DownsampledSeries> {
  const problem = checkSeries(series, targetPoints);
  if (problem) return fail("invalid-input", problem);
  const { y } = series;
  const n = y.length;
  if (targetPoints >= n) return succeed(keepAll(series));

  const buckets = Math.floor((targetPoints - 2) / 2);
  const kept = new Int32Array(targetPoints);
  let count = 0;
  kept[count++] = 0;
  const bucketSize = (n - 2) / Math.max(buckets, 1);
  for (let bucket = 0; bucket < buckets; bucket++) {
    const from = Math.floor(bucket * bucketSize) + 1;
    const to = Math.min(Math.floor((bucket + 1) * bucketSize) + 1, n - 1);
    if (from >= to) continue;
    let low = from;
    let high = from;
    for (let k = from + 1; k < to; k++) {
      if ((y[k] as number) < (y[low] as number)) low = k;
      if ((y[k] as number) > (y[high] as number)) high = k;
    }
    kept[count++] = Math.min(low, high);
    if (low !== high) kept[count++] = Math.max(low, high);
  }
  kept[count++] = n - 1;
  return succeed(pick(series, kept.slice(0, count)));
}
