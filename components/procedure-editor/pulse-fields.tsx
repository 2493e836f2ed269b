"use client";

import { DurationInput } from "./duration-input";
import { QuantityReferenceInput } from "./quantity-reference-input";

/** Two-level discharge pulse for DC resistance: R = (U1 − U2) / (I2 − I1) (IEC 61960-3 7.7). */
export function PulseFields({ path }: { path: string }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <QuantityReferenceInput path={`${path}.baseCurrent`} label="Base current (I1)" quantity="current" />
      <DurationInput path={`${path}.baseDuration`} label="Base duration" />
      <QuantityReferenceInput path={`${path}.pulseCurrent`} label="Pulse current (I2)" quantity="current" />
      <DurationInput path={`${path}.pulseDuration`} label="Pulse duration" />
    </div>
  );
}
