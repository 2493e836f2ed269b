import { formatNumber } from './format-number';
import type { Duration, QuantityReference } from './quantity';
import { getSpecificationFieldLabel } from './specification-fields';

const unitSymbols: Record<string, string> = { mOhm: 'mΩ', Ohm: 'Ω' };

/** A duration as written, with days added for long storage times: "672 h (28 days)". */
export function formatDuration(duration: Duration): string {
  const text = `${formatNumber(duration.value, { maxDecimals: 3 })} ${duration.unit}`;
  const isWholeDays = duration.unit === 'h' && duration.value >= 48 && duration.value % 24 === 0;
  return isWholeDays ? `${text} (${formatNumber(duration.value / 24)} days)` : text;
}

/**
 * A reference as people read it on a procedure: "0.2 It", "spec: end-of-discharge voltage", "5 A",
 * "20 °C ± 5 °C", "15 °C to 25 °C", "1 h".
 */
export function formatQuantity(quantity: QuantityReference): string {
  if ('multipleOfIt' in quantity) return `${formatNumber(quantity.multipleOfIt, { maxDecimals: 6 })} It`;
  if ('spec' in quantity) return `spec: ${getSpecificationFieldLabel(quantity.spec)}`;
  if ('nominalC' in quantity) {
    return `${formatNumber(quantity.nominalC, { maxDecimals: 2 })} °C ± ${formatNumber(quantity.toleranceC, { maxDecimals: 2 })} °C`;
  }
  if ('minC' in quantity) {
    return `${formatNumber(quantity.minC, { maxDecimals: 2 })} °C to ${formatNumber(quantity.maxC, { maxDecimals: 2 })} °C`;
  }
  if (quantity.unit === 'h' || quantity.unit === 'min' || quantity.unit === 's') return formatDuration(quantity);
  return `${formatNumber(quantity.value, { maxDecimals: 6 })} ${unitSymbols[quantity.unit] ?? quantity.unit}`;
}
