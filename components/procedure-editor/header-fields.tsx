"use client";

import { NotesInput } from "./notes-input";
import { NumberInput } from "./number-input";
import { OptionalPart } from "./optional-part";
import { TemperatureRangeInput } from "./temperature-range-input";
import { TextInput } from "./text-input";

const H = "definition.header";

/** Title, code, scope, standard and clause, default ambient, tolerances and notes. */
export function HeaderFields() {
  return (
    <section aria-labelledby="header-heading" className="flex flex-col gap-3">
      <h2 id="header-heading" className="text-lg font-bold">
        Header
      </h2>
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextInput path={`${H}.title`} label="Title" />
        <TextInput path={`${H}.code`} label="Code" readOnly hint="The code stays the same in every version." />
      </div>
      <TextInput path={`${H}.scope`} label="Scope" multiline />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput path={`${H}.standard`} label="Standard" hint="Number and edition, e.g. IEC 61960-3:2017" />
        <TextInput path={`${H}.clause`} label="Clause" />
      </div>
      <TemperatureRangeInput path={`${H}.ambient`} label="Ambient for every step that does not set its own" />
      <OptionalPart path={`${H}.tolerances`} label="Set this procedure's own set-point tolerances (otherwise those of IEC 61960-3 clause 4)" create={() => ({})}>
        <fieldset className="grid gap-3 sm:grid-cols-4">
          <legend className="sr-only">Set-point tolerances (blank: IEC 61960-3 clause 4)</legend>
          <NumberInput path={`${H}.tolerances.voltagePercent`} label="Voltage, ± %" />
          <NumberInput path={`${H}.tolerances.currentPercent`} label="Current, ± %" />
          <NumberInput path={`${H}.tolerances.temperatureC`} label="Temperature, ± °C" />
          <NumberInput path={`${H}.tolerances.timePercent`} label="Time, ± %" />
        </fieldset>
      </OptionalPart>
      <NotesInput />
    </section>
  );
}
