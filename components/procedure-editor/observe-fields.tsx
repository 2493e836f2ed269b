"use client";

import { OBSERVED_QUANTITY_WORDS, observedQuantities, VISUAL_OUTCOME_WORDS, visualOutcomes, type MassLossBand, type ObservationCriteria, type ObservedQuantity } from "@/protocols";
import { NumberInput } from "./number-input";
import { TextInput } from "./text-input";
import { useDraftValue, usePathErrors, useUpdateDraft } from "./use-draft-field";

function toggle<T>(list: readonly T[], item: T, on: boolean): T[] {
  return on ? [...list.filter((x) => x !== item), item] : list.filter((x) => x !== item);
}

/**
 * An observation: what the operator records (mass, open-circuit voltage, dimensions, visual state) and
 * the criteria against an earlier observation. The limits are the procedure's own numbers: a template
 * fills them in with its source; the engineer may change them.
 */
export function ObserveFields({ path }: { path: string }) {
  const records = useDraftValue<ObservedQuantity[] | undefined>(`${path}.records`) ?? [];
  const criteria = useDraftValue<ObservationCriteria | undefined>(`${path}.criteria`);
  const update = useUpdateDraft();
  const recordErrors = usePathErrors(`${path}.records`);
  const bands = (criteria?.massLoss?.bands ?? []) as Partial<MassLossBand>[];
  return (
    <div className="flex flex-col gap-4">
      <fieldset className="flex flex-wrap gap-4">
        <legend className="text-sm font-medium">The operator records</legend>
        {observedQuantities.map((quantity) => (
          <label key={quantity} className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={records.includes(quantity)}
              onChange={(e) => update(`${path}.records`, toggle(records, quantity, e.target.checked))}
              className="size-4 accent-copper"
            />
            {OBSERVED_QUANTITY_WORDS[quantity]}
          </label>
        ))}
        {recordErrors.length > 0 && <p className="w-full text-sm text-deviates">{recordErrors.join(" ")}</p>}
      </fieldset>
      <TextInput path={`${path}.compareWith`} label="Compare with the observation step (its id)" hint="The observation before the test; blank when this step has no criteria." className="sm:w-96" />
      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-medium">Mass-loss limit by the cell&apos;s mass before (bands, light to heavy)</legend>
        {bands.map((band, index) => (
          <div key={index} className="flex flex-wrap items-end gap-3">
            <NumberInput path={`${path}.criteria.massLoss.bands.${index}.upToG`} label={`Band ${index + 1}: up to (g)`} hint={index === bands.length - 1 ? "blank: every heavier cell" : undefined} className="w-40" />
            <label className="flex items-center gap-2 pb-2 text-sm">
              <input
                type="checkbox"
                checked={band.upToIncluded === true}
                onChange={(e) => update(`${path}.criteria.massLoss.bands.${index}.upToIncluded`, e.target.checked || undefined)}
                className="size-4 accent-copper"
              />
              edge included
            </label>
            <NumberInput path={`${path}.criteria.massLoss.bands.${index}.maxLossPercent`} label="largest loss (%)" className="w-40" />
          </div>
        ))}
        <div className="flex gap-3">
          <button type="button" className="text-sm text-copper-deep underline" onClick={() => update(`${path}.criteria.massLoss`, { bands: [...bands, { maxLossPercent: undefined }] })}>
            Add a band
          </button>
          {bands.length > 0 && (
            <button
              type="button"
              className="text-sm text-copper-deep underline"
              onClick={() => update(`${path}.criteria.massLoss`, bands.length === 1 ? undefined : { bands: bands.slice(0, -1) })}
            >
              Remove the last band
            </button>
          )}
        </div>
      </fieldset>
      <div className="flex flex-wrap items-end gap-3">
        {criteria?.openCircuitVoltage ? (
          <>
            <NumberInput path={`${path}.criteria.openCircuitVoltage.atLeastPercentOfBefore`} label="Open-circuit voltage after at least (% of before)" className="w-72" />
            <button type="button" className="pb-2 text-sm text-copper-deep underline" onClick={() => update(`${path}.criteria.openCircuitVoltage`, undefined)}>
              No voltage criterion
            </button>
          </>
        ) : (
          <button type="button" className="text-sm text-copper-deep underline" onClick={() => update(`${path}.criteria.openCircuitVoltage`, { atLeastPercentOfBefore: undefined })}>
            Add an open-circuit voltage criterion
          </button>
        )}
      </div>
      <fieldset className="flex flex-wrap gap-4">
        <legend className="text-sm font-medium">Visual criterion: must be recorded as none seen</legend>
        {visualOutcomes.map((outcome) => {
          const list = criteria?.visual ?? [];
          return (
            <label key={outcome} className="flex items-center gap-2 text-sm">
              <input
                type="checkbox"
                checked={list.includes(outcome)}
                onChange={(e) => {
                  const next = toggle(list, outcome, e.target.checked);
                  update(`${path}.criteria.visual`, next.length === 0 ? undefined : visualOutcomes.filter((o) => next.includes(o)));
                }}
                className="size-4 accent-copper"
              />
              {VISUAL_OUTCOME_WORDS[outcome]}
            </label>
          );
        })}
      </fieldset>
    </div>
  );
}
