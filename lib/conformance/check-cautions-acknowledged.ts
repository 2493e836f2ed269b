import type { CautionKind, ResolutionCaution } from "@/protocols";
import type { Finding } from "./finding";
import { commonPractice } from "./format-value";
import { createFinding, type StepContext } from "./step-context";

/** Caution kinds judged here; the current cautions are judged on the programmed current by checkRating. */
const otherKinds: readonly CautionKind[] = ["charge-below-zero-celsius", "soak-below-zero-celsius"];

/**
 * Every other safety caution the resolution raised for this step (no charging below 0 °C, soaking
 * below 0 °C: docs/design.md §7, common practice) was acknowledged, on the procedure version or by the
 * operator on the step record, before the step ran.
 */
export function checkCautionsAcknowledged(context: StepContext, cautions: readonly ResolutionCaution[]): Finding[] {
  return cautions
    .filter((caution) => caution.stepId === context.step.id && otherKinds.includes(caution.kind))
    .map((caution) => {
      const acknowledged = context.isAcknowledged(caution.code);
      return createFinding(context, {
        rule: "caution-acknowledged",
        field: caution.kind,
        title: "Safety caution acknowledged",
        severity: "caution",
        expected: { text: `the caution acknowledged before the step: ${caution.message}` },
        observed: { text: acknowledged ? "acknowledged" : "not acknowledged" },
        outcome: acknowledged ? "meets" : "deviates",
        clause: `safety caution of the resolved procedure; ${commonPractice}`,
      });
    });
}
