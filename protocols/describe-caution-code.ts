import type { Step } from './step';

// A caution code is "<kind>/<step id>/<field>" (resolve-step.ts): stable for storing an acknowledgement,
// but never shown as such. These words name the step by number and title and say the field in words.

const KIND_WORDS: Record<string, string> = {
  'charge-current-above-rating': "set above the cell's charge-current rating",
  'discharge-current-above-rating': "set above the cell's maximum continuous discharge current",
  'charge-below-zero-celsius': 'charging allowed below 0 °C',
  'soak-below-zero-celsius': 'soak temperature below 0 °C',
};

const FIELD_WORDS: Record<string, string> = {
  current: 'current',
  baseCurrent: 'base current',
  pulseCurrent: 'pulse current',
  'termination.current': 'termination current',
  voltage: 'charge voltage',
  endVoltage: 'end voltage',
  ambient: 'ambient temperature',
  temperature: 'soak temperature',
};

/** "Step 3 “Capacity discharge”, current: set above the cell's maximum continuous discharge current". */
export function describeCautionCode(code: string, steps: readonly Pick<Step, 'id' | 'label'>[]): string {
  const [kind = '', stepId = '', ...fieldParts] = code.split('/');
  const field = fieldParts.join('/');
  const index = steps.findIndex((step) => step.id === stepId);
  const step =
    index >= 0 ? `Step ${index + 1} “${steps[index]!.label}”` : steps.length > 0 ? `A step no longer in this version (${stepId})` : `The step “${stepId}”`;
  const fieldWords = FIELD_WORDS[field] ?? field.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/\./g, ' ').toLowerCase();
  const what = KIND_WORDS[kind] ?? 'outside the cell’s rating';
  return `${step}, ${fieldWords || 'set-point'}: ${what}`;
}
