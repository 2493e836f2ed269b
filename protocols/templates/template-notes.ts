/** The words that mark a template value recalled from memory (docs/references.md mark [memory]). */
export const recalledMark = 'recalled, verify against the standard';

/** A note on a value recalled, not checked against the standard's text. */
export function noteRecalled(subject: string): string {
  return `${subject}: ${recalledMark}.`;
}

/** A note on a value that is common practice in the trade, with no single published source. */
export function notePractice(subject: string): string {
  return `${subject}: common practice, not taken from the standard's text.`;
}
