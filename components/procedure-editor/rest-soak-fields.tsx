"use client";

import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { OptionalPart } from "./optional-part";
import { TemperatureRangeInput } from "./temperature-range-input";

function DurationSpan({ path, words }: { path: string; words: string }) {
  return (
    <>
      <DurationInput path={`${path}.minDuration`} label={`Shortest ${words}`} />
      <OptionalPart path={`${path}.maxDuration`} label={`Set a longest ${words}`} create={() => createDuration("h")}>
        <DurationInput path={`${path}.maxDuration`} label={`Longest ${words}`} />
      </OptionalPart>
    </>
  );
}

/** Open-circuit rest: a shortest and an optional longest duration. */
export function RestFields({ path }: { path: string }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <DurationSpan path={path} words="rest" />
    </div>
  );
}

/** Soak at a set temperature (the step's own ambient) for a time. */
export function SoakFields({ path }: { path: string }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <TemperatureRangeInput path={`${path}.temperature`} label="Soak temperature" />
      <DurationSpan path={path} words="soak" />
    </div>
  );
}
