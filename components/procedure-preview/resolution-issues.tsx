import type { ResolutionCaution, ResolutionError } from "@/protocols";

/** Problems that stop the procedure on this cell, said in words first. */
export function ResolutionErrors({ errors }: { errors: readonly ResolutionError[] }) {
  if (errors.length === 0) return null;
  return (
    <div role="alert" className="rounded border-l-4 border-deviates bg-white px-4 py-3 text-sm">
      <p className="font-semibold">
        <span aria-hidden="true">✕ </span>
        Cannot run on this cell: {errors.length === 1 ? "1 problem" : `${errors.length} problems`}
      </p>
      <ul className="mt-1 flex flex-col gap-1">
        {errors.map((error) => (
          <li key={error.code}>
            Cannot run on this cell: {error.message}
          </li>
        ))}
      </ul>
    </div>
  );
}

/**
 * Safety cautions. In the editor each has an "Acknowledge" checkbox that records the caution's
 * code on the draft; on a stored version the acknowledgement is shown as recorded.
 */
export function ResolutionCautions({
  cautions,
  acknowledged,
  onAcknowledgeChange,
}: {
  cautions: readonly ResolutionCaution[];
  acknowledged: ReadonlySet<string>;
  onAcknowledgeChange?: (code: string, acknowledged: boolean) => void;
}) {
  if (cautions.length === 0) return null;
  return (
    <section aria-labelledby="preview-cautions" className="rounded border-l-4 border-copper bg-copper-wash px-4 py-3 text-sm">
      <h3 id="preview-cautions" className="font-semibold">
        <span aria-hidden="true">⚠ </span>
        Caution: {cautions.length === 1 ? "1 set-point is" : `${cautions.length} set-points are`} outside the cell&apos;s rating
      </h3>
      <ul className="mt-1 flex flex-col gap-2">
        {cautions.map((caution, index) => {
          const messageId = `caution-${index}-message`;
          const isAcknowledged = acknowledged.has(caution.code);
          return (
            <li key={caution.code} className="flex flex-col gap-1">
              <p id={messageId}>
                <span className="font-medium">Caution:</span> {caution.message}
              </p>
              {onAcknowledgeChange ? (
                <label className="inline-flex items-center gap-2 font-medium">
                  <input
                    type="checkbox"
                    checked={isAcknowledged}
                    onChange={(event) => onAcknowledgeChange(caution.code, event.target.checked)}
                    aria-describedby={messageId}
                    className="h-4 w-4 accent-copper"
                  />
                  Acknowledge
                </label>
              ) : (
                <p className="font-medium">{isAcknowledged ? "✓ Acknowledged on this version" : "Not acknowledged on this version: it cannot run on this cell"}</p>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
