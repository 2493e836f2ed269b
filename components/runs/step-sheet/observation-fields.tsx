import type { ObservedValues } from "@/lib/conformance";
import { VISUAL_OUTCOME_WORDS, visualOutcomes, type ResolvedObserveStep } from "@/protocols";
import { listObservationFields, readObservedField } from "./observation-form";

/**
 * What the operator reads off the balance, the voltmeter and the caliper, and the visual state, on an
 * observation step. Each visual outcome is ticked only when the operator looked and saw none of it.
 */
export function ObservationFields({
  step,
  observed,
  errors,
}: {
  step: ResolvedObserveStep;
  observed: ObservedValues | undefined;
  errors: (key: string) => string | undefined;
}) {
  const fields = listObservationFields(step);
  const noneSeen = new Set(observed?.visual?.noneSeen ?? []);
  const anyRecorded = observed !== undefined;
  return (
    <fieldset className="flex flex-col gap-3 rounded border border-rule bg-white p-3" data-testid="observation-fields">
      <legend className="px-1 text-sm font-semibold">Observations</legend>
      <div role="note" className="rounded border-l-4 border-copper bg-copper-wash px-3 py-2 text-sm">
        <span aria-hidden="true">⚠ </span>Caution: a cell that leaks, vents, swells or feels hot after a test may still react. Handle it, and
        any electrolyte, as your lab&apos;s safety rules and local codes say; this sheet does not replace them.
      </div>
      {fields.length > 0 && (
        <div className="grid grid-cols-2 gap-3 md:grid-cols-3">
          {fields.map((field) => {
            const key = `observed.${field.name}`;
            const stored = readObservedField(observed, field.name);
            return (
              <label key={field.name} className="flex flex-col text-sm">
                {field.label} ({field.unit})
                <input
                  name={key}
                  inputMode="decimal"
                  defaultValue={stored !== undefined ? String(stored) : ""}
                  aria-invalid={errors(key) ? true : undefined}
                  className="figures rounded border border-rule px-2 py-2 aria-[invalid=true]:border-deviates"
                />
                <span aria-live="polite" className="text-xs text-deviates">
                  {errors(key)}
                </span>
              </label>
            );
          })}
        </div>
      )}
      {step.records.includes("visual") && (
        <fieldset className="flex flex-col gap-1">
          <legend className="text-sm font-medium">Visual state: tick each one you checked and saw none of</legend>
          <input type="hidden" name="visualShown" value="1" />
          <div className="flex flex-wrap gap-x-5 gap-y-1">
            {visualOutcomes.map((outcome) => (
              <label key={outcome} className="flex min-h-11 items-center gap-2 text-sm">
                <input type="checkbox" name="visualNoneSeen" value={outcome} defaultChecked={noneSeen.has(outcome)} className="size-5 accent-copper" />
                {VISUAL_OUTCOME_WORDS[outcome]}
              </label>
            ))}
          </div>
          <p className="text-xs text-ink-soft">A box left empty is recorded as not confirmed; describe anything you saw in the notes.</p>
        </fieldset>
      )}
      {anyRecorded && (
        <label className="flex flex-col text-sm">
          Reason, if you change a value already recorded (the old value is kept beside the new)
          <textarea name="observationChangeReason" rows={2} className="rounded border border-rule px-2 py-1.5" />
          <span aria-live="polite" className="text-xs text-deviates">
            {errors("observationChangeReason")}
          </span>
        </label>
      )}
    </fieldset>
  );
}
