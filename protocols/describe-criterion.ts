import type { AcceptanceCriterion } from './acceptance-criterion';
import { assertNever } from './assert-never';
import { formatNumber } from './format-number';
import { formatDuration, formatQuantity } from './format-quantity';
import { getSpecificationFieldLabel } from './specification-fields';

/**
 * One plain-English line for an acceptance criterion, e.g. "Capacity of step 4 “Capacity discharge” ≥ 100 %
 * of the rated capacity"; given no step list, the step is named by its id.
 */
export function describeCriterion(criterion: AcceptanceCriterion, steps?: readonly { id: string; label: string }[]): string {
  const index = steps?.findIndex((step) => step.id === criterion.stepId) ?? -1;
  const subject = index >= 0 ? `of step ${index + 1} “${steps![index]!.label}”` : `of step "${criterion.stepId}"`;
  switch (criterion.kind) {
    case 'capacity':
      return `Capacity ${subject} ≥ ${formatNumber(criterion.atLeastPercent, { maxDecimals: 2 })} % of the ${criterion.of} capacity`;
    case 'discharge-duration':
      return `Discharge duration ${subject} ≥ ${formatDuration(criterion.atLeast)}`;
    case 'resistance': {
      const limit =
        'spec' in criterion.atMost
          ? `the specified ${getSpecificationFieldLabel(criterion.atMost.spec)}`
          : formatQuantity(criterion.atMost);
      return `Resistance ${subject} ≤ ${limit}`;
    }
    default:
      return assertNever(criterion);
  }
}
