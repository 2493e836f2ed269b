/** Why a sampling input was refused: `field` names the input (for a form), `message` says what to change. */
export interface SamplingInputError {
  field: string;
  message: string;
}

export function refuse(field: string, message: string): { ok: false; error: SamplingInputError } {
  return { ok: false, error: { field, message } };
}
