/** Points per curve the overlay asks the server for (thinned there by LTTB). */
export const OVERLAY_POINTS = 1000;

/** The address of the chosen discharges' curves: the chart fetches it, the page asks the browser to start early. */
export function formatOverlaySeriesUrl(keys: readonly string[]): string {
  return `/api/compare/series?${new URLSearchParams([...keys.map((k) => ["d", k]), ["points", String(OVERLAY_POINTS)]]).toString()}`;
}
