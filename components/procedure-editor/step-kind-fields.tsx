"use client";

import { assertNever, type StepKind } from "@/protocols";
import { ChargeFields } from "./charge-fields";
import { CycleBlockFields } from "./cycle-block-fields";
import { DischargeFields } from "./discharge-fields";
import { MeasureFields } from "./measure-fields";
import { ObserveFields } from "./observe-fields";
import { PulseFields } from "./pulse-fields";
import { RestFields, SoakFields } from "./rest-soak-fields";

/** The sub-form for a step's own kind. */
export function StepKindFields({ kind, path }: { kind: StepKind; path: string }) {
  switch (kind) {
    case "charge":
      return <ChargeFields path={path} />;
    case "discharge":
      return <DischargeFields path={path} />;
    case "rest":
      return <RestFields path={path} />;
    case "soak":
      return <SoakFields path={path} />;
    case "pulse":
      return <PulseFields path={path} />;
    case "measure":
      return <MeasureFields path={path} />;
    case "observe":
      return <ObserveFields path={path} />;
    case "cycle-block":
      return <CycleBlockFields path={path} />;
    default:
      return assertNever(kind);
  }
}
