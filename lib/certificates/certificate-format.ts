/**
 * Numbers as the certificate prints them (docs/design.md §9): a fixed number of decimals per quantity,
 * groups of three digits split by a no-break space, a true minus sign, and the unit after a
 * no-break space so a value never breaks from its unit: "3 061 mAh", "11.02 Wh", "3.60 V".
 */
const NBSP = "\u00a0";
const MINUS = "\u2212";

export function formatFigure(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return "–";
  const fixed = Math.abs(value).toFixed(decimals);
  const [whole = "0", fraction] = fixed.split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, NBSP);
  const negative = value < 0 && Number(fixed) !== 0;
  return `${negative ? MINUS : ""}${grouped}${fraction ? `.${fraction}` : ""}`;
}

export function withUnit(value: number, decimals: number, unit: string): string {
  return `${formatFigure(value, decimals)}${NBSP}${unit}`;
}

export const formatMah = (mAh: number) => withUnit(mAh, 0, "mAh");
export const formatWh = (wh: number) => withUnit(wh, 2, "Wh");
export const formatVolts = (v: number) => withUnit(v, 2, "V");
export const formatCelsius = (c: number) => withUnit(c, 1, "°C");
export const formatMilliohm = (ohm: number) => withUnit(ohm * 1000, 1, "mΩ");
export const formatPercent = (fraction: number, decimals = 2) => withUnit(fraction * 100, decimals, "%");

/** "5 h 06 min" from seconds; under a minute, seconds. */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "–";
  if (seconds < 60) return withUnit(seconds, 0, "s");
  const minutes = Math.round(seconds / 60);
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return h === 0 ? `${m}${NBSP}min` : `${h}${NBSP}h ${String(m).padStart(2, "0")}${NBSP}min`;
}

/** A range of temperatures: "22.1 °C to 23.0 °C", or one value when both ends agree. */
export function formatCelsiusRange(min: number, max: number): string {
  return formatFigure(min, 1) === formatFigure(max, 1) ? formatCelsius(min) : `${formatCelsius(min)} to ${formatCelsius(max)}`;
}

/**
 * "2026-12-02T14:03Z": ISO 8601 extended format with its zone (UTC), the one form every moment on a
 * certificate takes. A time given with another offset is converted to UTC first.
 */
export function formatMoment(iso: string): string {
  const ms = Date.parse(iso);
  const utc = Number.isFinite(ms) ? new Date(ms).toISOString() : iso;
  return `${utc.slice(0, 16)}Z`;
}

const ISO_MOMENT = /\b\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:\d{2})/g;

/** Every ISO moment inside a text (a finding's words) written the certificate's one way. */
export function formatMomentsInText(text: string): string {
  return text.replace(ISO_MOMENT, (moment) => formatMoment(moment));
}

/** A value of an uncertainty budget in its own unit, with as many significant digits as it needs. */
export function formatBudgetValue(value: number, unit: string): string {
  if (value === 0) return `0${NBSP}${unit}`;
  const decimals = Math.max(0, Math.min(6, 2 - Math.floor(Math.log10(Math.abs(value)))));
  return withUnit(value, decimals, unit);
}

/** Capacity in Ah as a budget row states it, for the certificate in mAh with its decimals. */
export function formatQuantityValue(value: number, unit: string): string {
  switch (unit) {
    case "Ah":
      return formatMah(value * 1000);
    case "Wh":
      return formatWh(value);
    case "Ω":
      return formatMilliohm(value);
    case "V":
      return formatVolts(value);
    default:
      return formatBudgetValue(value, unit);
  }
}
