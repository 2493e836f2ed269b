import type { Finding } from "./finding";
import { formatNumber } from "@/protocols";
import { commonPractice, formatValue } from "./format-value";
import { createFinding, explainMissingLog, type StepContext } from "./step-context";

/** "5 mV", "1.6 mV". */
function formatMillivolts(volts: number): string {
  return `${formatNumber(volts * 1000, { maxDecimals: 1 })} mV`;
}

/**
 * During a charge the logged voltage never rises above the cell's rated charge voltage (never
 * exceed the charge voltage: common practice, docs/design.md §7, docs/references.md §12), nor above the
 * step's own charge voltage when that is lower. The ±1 % voltage tolerance of IEC 61960-3 clause 4
 * is a tolerance of the measurement, not a licence to charge 42 mV above a 4.2 V rating: the only
 * margin is a reading allowance in volts for the noise of a logged constant-voltage hold (a lab
 * setting, our own default). A rise above the cell's charge voltage is a deviation and a safety
 * finding, marked beyond the rating.
 */
export function checkChargeVoltage(context: StepContext): Finding[] {
  const { step, cellRating } = context;
  // A cycle block's charges are judged over the whole block: its highest logged voltage.
  if (step.kind !== "charge" && step.kind !== "cycle-block") return [];
  const allowance = context.settings.chargeVoltageReadingAllowanceV;
  const rated = cellRating.chargeVoltageV;
  const stepVoltage = step.kind === "charge" ? step.voltage?.value : step.charge.voltage?.value;
  const limit = stepVoltage === undefined ? rated : Math.min(stepVoltage, rated);
  const whose = stepVoltage !== undefined && stepVoltage < rated ? "the step's charge voltage" : "the cell's rated charge voltage";
  const max = limit + allowance;
  const draft = {
    rule: "charge-voltage-within-limit" as const,
    title: "Charge voltage never above its limit",
    severity: "caution" as const,
    expected: {
      text: `at most ${whose} ${formatValue(limit, "V")}${allowance > 0 ? `, with a reading allowance of ${formatMillivolts(allowance)} for the logged noise` : ""}`,
      value: limit,
      max,
      unit: "V" as const,
    },
    clause: `cell rating: never above the charge voltage, ${commonPractice}; reading allowance: our own setting`,
  };
  const missing = explainMissingLog(context.evidence);
  if (missing !== null || context.evidence.kind !== "found") {
    return [createFinding(context, { ...draft, observed: { text: missing ?? "no log phase" }, outcome: "not assessable" })];
  }
  const highest = context.evidence.results.maxVoltageV;
  const beyondRating = highest > rated + allowance;
  return [
    createFinding(context, {
      ...draft,
      observed: {
        text: `highest logged voltage ${formatValue(highest, "V")}${beyondRating ? `, ${formatMillivolts(highest - rated)} above the cell's rated charge voltage: a safety finding` : ""}`,
        value: highest,
        unit: "V",
      },
      outcome: highest <= max ? "meets" : "deviates",
      ...(beyondRating && { beyondRating }),
    }),
  ];
}
