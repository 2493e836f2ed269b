"use client";

import type { ReactNode } from "react";
import { fieldId } from "./field-paths";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";

/** A checkbox that adds or removes an optional part of the draft (longest duration, own ambient, …). */
export function OptionalPart({ path, label, create, children }: { path: string; label: string; create: () => unknown; children: ReactNode }) {
  const present = useDraftValue<unknown>(path) !== undefined;
  const update = useUpdateDraft();
  const id = `${fieldId(path)}-toggle`;
  return (
    <div className="flex flex-col gap-2">
      <label htmlFor={id} className="inline-flex items-center gap-2 text-sm">
        <input id={id} type="checkbox" checked={present} onChange={(e) => update(path, e.target.checked ? create() : undefined)} className="h-4 w-4 accent-copper" />
        {label}
      </label>
      {present && children}
    </div>
  );
}
