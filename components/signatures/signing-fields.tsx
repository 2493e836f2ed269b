import type { ReactNode } from "react";

/**
 * The two components of an electronic signature (21 CFR 11.200): who is signed in, and their password
 * entered again; with the meaning in words and what the signer confirms.
 */
export function SigningFields({
  idPrefix,
  signerName,
  meaningWords,
  statement,
  passwordErrors,
}: {
  idPrefix: string;
  signerName: string;
  meaningWords: string;
  statement: ReactNode;
  passwordErrors?: string[];
}) {
  const id = `${idPrefix}-password`;
  return (
    <fieldset className="flex flex-col gap-2 rounded border border-copper bg-copper-wash p-4">
      <legend className="px-1 font-semibold">Your signature</legend>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="text-ink-soft">Signer</dt>
        <dd>{signerName}</dd>
        <dt className="text-ink-soft">Meaning</dt>
        <dd data-testid={`${idPrefix}-meaning`}>{meaningWords}</dd>
      </dl>
      <p className="text-sm">
        {statement} Your printed name, the date and time and this meaning are stored with the record and shown wherever it is shown.
      </p>
      <label htmlFor={id} className="text-sm font-medium">
        Your password, to sign
      </label>
      <input
        id={id}
        name="password"
        type="password"
        required
        autoComplete="current-password"
        data-clear-when-refused
        aria-invalid={passwordErrors ? true : undefined}
        aria-describedby={`${id}-error`}
        className="max-w-xs rounded border border-rule bg-white px-2 py-1.5 aria-[invalid=true]:border-deviates"
      />
      <p id={`${id}-error`} aria-live="polite" className="text-sm text-deviates">
        {passwordErrors?.join(" ")}
      </p>
    </fieldset>
  );
}
