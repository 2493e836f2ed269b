/**
 * A schema error message that says "required" when the field is missing and `message` otherwise,
 * so a form shows the right reason next to the field.
 */
export function explainTypeError(message: string): (issue: { input?: unknown }) => string {
  return (issue) => (issue.input === undefined ? 'required' : message);
}
