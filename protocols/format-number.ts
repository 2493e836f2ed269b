/**
 * Deterministic number formatting for traces and summaries (no locale, no Intl): a space between
 * thousands groups, a true minus sign, trailing zeros trimmed down to `minDecimals`.
 */
export function formatNumber(value: number, options: { minDecimals?: number; maxDecimals?: number } = {}): string {
  const { minDecimals = 0, maxDecimals = 4 } = options;
  const fixed = Math.abs(value).toFixed(maxDecimals);
  const [integerPart = '0', fractionPart = ''] = fixed.split('.');
  let fraction = fractionPart.replace(/0+$/, '');
  if (fraction.length < minDecimals) fraction = fraction.padEnd(minDecimals, '0');
  const grouped = integerPart.replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
  const isZero = Number(fixed) === 0;
  const sign = value < 0 && !isZero ? '\u2212' : '';
  return `${sign}${grouped}${fraction ? `.${fraction}` : ''}`;
}

/** Removes binary floating-point noise (0.2 × 3 = 0.6000000000000001) by keeping 12 significant digits. */
export function roundSignificant(value: number, digits = 12): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(digits));
}
