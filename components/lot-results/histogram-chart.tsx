import type { Histogram } from "@/lib/statistics";
import { formatNumber } from "@/protocols";

export interface HistogramMarker {
  value: number;
  label: string;
}

const W = 360;
const H = 210;
const M = { left: 40, right: 14, top: 26, bottom: 46 };

function computeTicks(max: number): number[] {
  const step = Math.max(1, Math.ceil(max / 5));
  const ticks: number[] = [];
  for (let t = 0; t <= max; t += step) ticks.push(t);
  if (ticks.at(-1) !== max) ticks.push(max);
  return ticks;
}

/**
 * Equal-width bars of a histogram in SVG, with labelled axes and units, and dashed lines for the
 * rated and minimum values when given. Drawn on the server: no script needed to read it.
 */
export function HistogramChart({
  histogram,
  quantity,
  unit,
  decimals,
  markers = [],
  testId,
}: {
  histogram: Histogram;
  quantity: string;
  unit: string;
  decimals: number;
  markers?: HistogramMarker[];
  testId?: string;
}) {
  const { bins } = histogram;
  const low = Math.min(bins[0]!.from, ...markers.map((m) => m.value));
  const high = Math.max(bins.at(-1)!.to, ...markers.map((m) => m.value));
  // One bin of zero width (all results equal) is drawn as a narrow bar around its value.
  const pad = high > low ? (high - low) * 0.04 : Math.max(Math.abs(low) * 0.01, 10 ** -decimals);
  const x0 = low - pad;
  const x1 = high + pad;
  const maxCount = Math.max(...bins.map((b) => b.count));
  const x = (v: number) => M.left + ((v - x0) / (x1 - x0)) * (W - M.left - M.right);
  const y = (c: number) => H - M.bottom - (c / maxCount) * (H - M.top - M.bottom);
  const edges = bins.length === 1 && bins[0]!.from === bins[0]!.to ? [bins[0]!.from] : [bins[0]!.from, ...bins.map((b) => b.to)];
  const shownEdges = edges.length > 7 ? edges.filter((_, k) => k % 2 === 0 || k === edges.length - 1) : edges;
  const fmt = (v: number) => formatNumber(v, { minDecimals: decimals, maxDecimals: decimals });
  const summary = bins.map((b) => `${fmt(b.from)} to ${fmt(b.to)} ${unit}: ${b.count}`).join("; ");
  return (
    <figure className="min-w-0" data-testid={testId}>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-md" role="img" aria-label={`Histogram of ${quantity.toLowerCase()} (${unit}): ${summary}`}>
        <line x1={M.left} y1={H - M.bottom} x2={W - M.right} y2={H - M.bottom} stroke="#4a4f57" />
        <line x1={M.left} y1={M.top} x2={M.left} y2={H - M.bottom} stroke="#4a4f57" />
        {computeTicks(maxCount).map((t) => (
          <g key={t}>
            <line x1={M.left - 4} x2={M.left} y1={y(t)} y2={y(t)} stroke="#4a4f57" />
            <text x={M.left - 6} y={y(t) + 3.5} textAnchor="end" fontSize="10" fill="#1d2126">
              {t}
            </text>
          </g>
        ))}
        {bins.map((b, k) => {
          const left = b.from === b.to ? x(b.from) - 6 : x(b.from);
          const width = b.from === b.to ? 12 : Math.max(1, x(b.to) - x(b.from) - 1);
          return b.count > 0 ? <rect key={k} x={left} y={y(b.count)} width={width} height={H - M.bottom - y(b.count)} fill="#9b4a1b" fillOpacity="0.8" /> : null;
        })}
        {shownEdges.map((e, k) => (
          <g key={k}>
            <line x1={x(e)} x2={x(e)} y1={H - M.bottom} y2={H - M.bottom + 4} stroke="#4a4f57" />
            <text x={x(e)} y={H - M.bottom + 15} textAnchor="middle" fontSize="9.5" fill="#1d2126">
              {fmt(e)}
            </text>
          </g>
        ))}
        {markers.map((m, k) => (
          <g key={m.label}>
            <line x1={x(m.value)} x2={x(m.value)} y1={M.top - 4 + k * 11} y2={H - M.bottom} stroke="#1d2126" strokeDasharray="4 3" />
            <text x={x(m.value) + 3} y={M.top - 6 + k * 11} fontSize="9.5" fill="#1d2126">
              {m.label} {fmt(m.value)}
            </text>
          </g>
        ))}
        <text x={(M.left + W - M.right) / 2} y={H - 8} textAnchor="middle" fontSize="11" fill="#1d2126">
          {quantity} ({unit})
        </text>
        <text transform={`translate(11 ${(M.top + H - M.bottom) / 2}) rotate(-90)`} textAnchor="middle" fontSize="11" fill="#1d2126">
          Results
        </text>
      </svg>
      <figcaption className="text-xs text-ink-soft">{histogram.rule}.</figcaption>
    </figure>
  );
}
