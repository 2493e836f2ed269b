import { formatNumber } from "@/protocols/format-number";
import { ACCURACY_QUANTITIES, ACCURACY_UNITS, type AccuracyQuantity, type AccuracySpecification } from "./accuracy";

const QUANTITY_WORDS: Record<AccuracyQuantity, string> = {
  current: "Current",
  voltage: "Voltage",
  resistance: "Resistance",
  temperature: "Temperature",
  mass: "Mass",
  time: "Time",
};

const show = (n: number) => formatNumber(n, { maxDecimals: 6 });

/** Each stated part in words, e.g. "Current ±(0.02 % of reading + 0.02 % of 10 A range)". */
export function describeAccuracy(accuracy: AccuracySpecification): { quantity: AccuracyQuantity; text: string }[] {
  return ACCURACY_QUANTITIES.flatMap((quantity) => {
    const text = describePart(accuracy, quantity);
    return text ? [{ quantity, text: `${QUANTITY_WORDS[quantity]} ${text}` }] : [];
  });
}

function describePart(accuracy: AccuracySpecification, quantity: AccuracyQuantity): string | null {
  const unit = ACCURACY_UNITS[quantity];
  switch (quantity) {
    case "current":
    case "voltage":
    case "resistance": {
      const p = accuracy[quantity];
      return p ? `±(${show(p.percentOfReading)} % of reading + ${show(p.percentOfRange)} % of ${show(p.range)} ${unit} range)` : null;
    }
    case "temperature":
    case "mass": {
      const p = accuracy[quantity];
      return p ? `±${show(p.halfWidth)} ${unit}` : null;
    }
    case "time": {
      const p = accuracy.time;
      return p ? `±${show(p.ppm)} ppm` : null;
    }
    default: {
      const unknown: never = quantity;
      throw new Error(`Unknown quantity ${String(unknown)}`);
    }
  }
}
