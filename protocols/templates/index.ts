import type { Procedure } from '../procedure';
import { acResistanceTemplate } from './ac-resistance';
import { chargeRetentionTemplate } from './charge-retention';
import { dcResistanceTemplate } from './dc-resistance';
import { dischargeAtMinus20cTemplate } from './discharge-at-minus-20c';
import { enduranceInCyclesTemplate } from './endurance-in-cycles';
import { observationBeforeAfterTemplate } from './observation-before-after';
import { rateCapabilityTemplate } from './rate-capability';
import { ratedCapacityAt20cTemplate } from './rated-capacity-20c';

export interface ProcedureTemplate {
  key: string;
  procedure: Procedure;
}

/** The built-in procedure templates, in the order a lab usually meets them. */
export const procedureTemplates: readonly ProcedureTemplate[] = [
  { key: 'rated-capacity-20c', procedure: ratedCapacityAt20cTemplate },
  { key: 'rate-capability', procedure: rateCapabilityTemplate },
  { key: 'dc-resistance', procedure: dcResistanceTemplate },
  { key: 'ac-resistance', procedure: acResistanceTemplate },
  { key: 'discharge-at-minus-20c', procedure: dischargeAtMinus20cTemplate },
  { key: 'charge-retention', procedure: chargeRetentionTemplate },
  { key: 'observation-before-after', procedure: observationBeforeAfterTemplate },
  { key: 'endurance-in-cycles', procedure: enduranceInCyclesTemplate },
];

export function findProcedureTemplate(key: string): ProcedureTemplate | undefined {
  return procedureTemplates.find((template) => template.key === key);
}

export {
  acResistanceTemplate,
  chargeRetentionTemplate,
  dcResistanceTemplate,
  dischargeAtMinus20cTemplate,
  enduranceInCyclesTemplate,
  observationBeforeAfterTemplate,
  rateCapabilityTemplate,
  ratedCapacityAt20cTemplate,
};
export { noteRecalled, notePractice, recalledMark } from './template-notes';
