/**
 * Tick labels that are all different and all written with the same number of decimals: the fewest
 * decimals that tell neighbouring ticks apart (a current axis from −0.9700 A to −0.9710 A reads
 * "−0.9700, −0.9705, −0.9710", never "−0.97, −0.97, −0.971"). The minus is the typographic one.
 */
export function formatDistinctTicks(splits: readonly number[], increment?: number): string[] {
  const finite = splits.filter((v) => Number.isFinite(v));
  if (finite.length === 0) return splits.map(() => "");
  const step = increment && increment > 0 ? increment : smallestGap(finite);
  let decimals = step > 0 ? Math.max(0, Math.min(12, -Math.floor(Math.log10(step) + 1e-9))) : 0;
  for (; decimals <= 12; decimals++) {
    const labels = finite.map((v) => fixed(v, decimals));
    if (new Set(labels).size === labels.length) break;
  }
  return splits.map((v) => (Number.isFinite(v) ? fixed(v, Math.min(decimals, 12)) : ""));
}

function smallestGap(values: readonly number[]): number {
  let gap = Infinity;
  for (let i = 1; i < values.length; i++) gap = Math.min(gap, Math.abs(values[i]! - values[i - 1]!));
  return Number.isFinite(gap) ? gap : 0;
}

function fixed(value: number, decimals: number): string {
  const text = (Object.is(value, -0) ? 0 : value).toFixed(decimals);
  // −0.000 after rounding a tiny negative reads as zero.
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text.replace("-", "−");
}
