import type { Finding } from "./finding";
import { citeTolerance, commonPractice, formatPercent, formatValue } from "./format-value";
import { createFinding, explainMissingLog, type StepContext } from "./step-context";
import { createBand, isInsideBand } from "./tolerance-band";

/**
 * During a charge the logged voltage never rises above the charge voltage plus the voltage
 * tolerance (IEC 61960-3 clause 4: ±1 %, REFERENCES.md §3). The limit is the step's charge voltage
 * or the cell's, whichever is lower: above the step's it is a deviation from the procedure, above
 * the cell's it is also outside the rating (never exceed the charge voltage: common practice,
 * DESIGN.md §7, REFERENCES.md §12).
 */
export function checkChargeVoltage(context: StepContext): Finding[] {
  const { step, cellRating } = context;
  if (step.kind !== "charge") return [];
  const tolerance = step.tolerances.voltagePercent;
  const stepVoltage = step.voltage?.value;
  const limit = stepVoltage === undefined ? cellRating.chargeVoltageV : Math.min(stepVoltage, cellRating.chargeVoltageV);
  const band = createBand(limit, tolerance.value);
  const ratingBand = createBand(cellRating.chargeVoltageV, tolerance.value);
  const whose = stepVoltage !== undefined && stepVoltage <= cellRating.chargeVoltageV ? "the step's charge voltage" : "the cell's charge voltage";
  const draft = {
    rule: "charge-voltage-within-limit" as const,
    title: "Charge voltage never above its limit",
    severity: "caution" as const,
    expected: {
      text: `at most ${formatValue(band.max, "V")}: ${whose} ${formatValue(limit, "V")} ${formatPercent(tolerance.value)}`,
      value: limit,
      max: band.max,
      unit: "V" as const,
    },
    clause: `${citeTolerance(tolerance)}; cell rating, ${commonPractice}`,
  };
  const missing = explainMissingLog(context.evidence);
  if (missing !== null || context.evidence.kind !== "found") {
    return [createFinding(context, { ...draft, observed: { text: missing ?? "no log phase" }, outcome: "not assessable" })];
  }
  const highest = context.evidence.results.maxVoltageV;
  const beyondRating = !isInsideBand(highest, { max: ratingBand.max });
  return [
    createFinding(context, {
      ...draft,
      observed: {
        text: `highest logged voltage ${formatValue(highest, "V")}${beyondRating ? ", above the cell's charge voltage" : ""}`,
        value: highest,
        unit: "V",
      },
      outcome: isInsideBand(highest, { max: band.max }) ? "meets" : "deviates",
      ...(beyondRating && { beyondRating }),
    }),
  ];
}
