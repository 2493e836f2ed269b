import type { ResolvedStep } from "@/protocols";

/** The nominal test ambient of IEC 61960-3 (20 °C ± 5 °C): a discharge counts when its ambient range holds 20 °C. */
const testAmbientC = 20;

/**
 * A rest longer than this between the charge and the discharge is storage, not the short rest of a
 * capacity test (our own line, set well above the 1 h to 4 h rests of the capacity templates).
 */
export const longestRestBeforeCapacityS = 24 * 3600;

export type DischargeClass = { counts: true } | { counts: false; reason: string };

/**
 * Whether a discharge step gives a capacity result that the lot statistics and the rate table may
 * pool: a measured discharge (not a precondition), at the normal test ambient, straight after the
 * charge and a short rest. A discharge after storage or a cold soak answers another question
 * (retention, low-temperature performance) and is left out, with the reason.
 */
export function classifyDischarge(steps: readonly ResolvedStep[], stepId: string): DischargeClass {
  const at = steps.findIndex((s) => s.id === stepId);
  const step = steps[at];
  if (!step || step.kind !== "discharge") return { counts: false, reason: `step "${stepId}" is not a discharge of the procedure` };
  if (step.purpose !== "measure") return { counts: false, reason: "a precondition discharge, from an unknown state of charge" };
  if (!(step.ambient.minC <= testAmbientC && testAmbientC <= step.ambient.maxC)) {
    return { counts: false, reason: `discharged at ${step.ambient.minC} °C to ${step.ambient.maxC} °C, not at the 20 °C test ambient` };
  }
  for (let k = at - 1; k >= 0; k--) {
    const before = steps[k] as ResolvedStep;
    if (before.kind === "charge") return { counts: true };
    if (before.kind === "soak") return { counts: false, reason: `follows "${before.label}"` };
    if (before.kind === "rest" && before.minDuration.value > longestRestBeforeCapacityS) {
      return { counts: false, reason: `follows "${before.label}", a rest of more than 24 h (storage)` };
    }
  }
  return { counts: false, reason: "no charge before this discharge in the procedure" };
}
