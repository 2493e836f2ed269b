import { compareNumbers } from "@/protocols";
import type { Finding } from "./finding";
import { citeProcedure, formatRange, formatValue } from "./format-value";
import { listCountedReadings } from "./plausible-ambient";
import { createFinding, noRecordReason, type StepContext } from "./step-context";

/**
 * Every ambient reading of the step lies within the step's range: the procedure's ambient (for
 * IEC 61960-3 7.2 and 7.3.1, 20 °C ± 5 °C, docs/references.md §2; 20–25 °C is common practice, §12), the
 * step's own, or for a soak the soak temperature. Readings are compared with the range as they
 * stand (simple acceptance): the ±2 °C of IEC 61960-3 clause 4 is the accuracy the thermometer must
 * hold, not a widening of the range. Readings struck as errors, and values no ambient can take
 * (outside −60…150 °C), are left out and counted in the observation.
 */
export function checkAmbient(context: StepContext): Finding[] {
  const { step, record } = context;
  const range = step.ambient;
  const base = {
    rule: "ambient-in-range" as const,
    title: step.kind === "soak" ? "Soak temperature within its range" : "Ambient temperature within its range",
    expected: {
      text: `every reading within ${range.explanation}`,
      min: range.minC,
      max: range.maxC,
      unit: "°C" as const,
    },
    clause: citeProcedure(context.citation, step.kind === "soak" ? "soak temperature" : "ambient temperature"),
  };
  const all = record?.ambientReadings ?? [];
  const readings = listCountedReadings(all);
  const struck = all.filter((r) => r.struck).length;
  const implausible = all.length - readings.length - struck;
  const leftOut = [
    ...(struck > 0 ? [`${struck} struck as ${struck === 1 ? "an error" : "errors"}`] : []),
    ...(implausible > 0 ? [`${implausible} outside −60…150 °C`] : []),
  ];
  const leftOutText = leftOut.length > 0 ? ` (not counted: ${leftOut.join(", ")})` : "";
  if (record === null || readings.length === 0) {
    const reason = record === null ? noRecordReason : `no ambient reading was recorded for this step${leftOutText}`;
    return [createFinding(context, { ...base, observed: { text: reason }, outcome: "not assessable" })];
  }
  const values = readings.map((reading) => reading.celsius);
  const lowest = Math.min(...values);
  const highest = Math.max(...values);
  const outside = readings.filter(
    (reading) => compareNumbers(reading.celsius, range.minC) === "lower" || compareNumbers(reading.celsius, range.maxC) === "higher",
  );
  const count = `${readings.length} reading${readings.length === 1 ? "" : "s"}`;
  const spread = lowest === highest ? formatValue(lowest, "°C") : formatRange({ min: lowest, max: highest }, "°C");
  const outsideText = outside.map((reading) => `${formatValue(reading.celsius, "°C")} at ${reading.at}`).join(", ");
  return [
    createFinding(context, {
      ...base,
      observed: {
        text: `${count}, ${spread}${outside.length > 0 ? `; outside the range: ${outsideText}` : ""}${leftOutText}`,
        min: lowest,
        max: highest,
        unit: "°C",
      },
      outcome: outside.length > 0 ? "deviates" : "meets",
    }),
  ];
}
