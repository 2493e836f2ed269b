"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import { createProcedureAction } from "./actions";
import { suggestProcedureCode } from "./start-procedure";

export interface StartOption {
  key: string;
  title: string;
  standard: string;
  clause: string;
  scope: string;
  stepCount: number;
}

/** Choose where the new procedure starts and its code; the code follows the choice until edited. */
export function NewProcedureForm({ options, existingCodes }: { options: StartOption[]; existingCodes: string[] }) {
  const { state, onSubmit, pending } = useFormAction(createProcedureAction);
  const [start, setStart] = useState(options[0]?.key ?? "blank");
  const [code, setCode] = useState(() => suggestProcedureCode({ start, existingCodes }));
  const [codeEdited, setCodeEdited] = useState(false);
  const choose = (key: string) => {
    setStart(key);
    if (!codeEdited) setCode(suggestProcedureCode({ start: key, existingCodes }));
  };
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-5" aria-label="Start a new procedure" noValidate>
      {state.message && !state.ok && (
        <Notice tone="problem" role="alert">
          {state.message}
        </Notice>
      )}
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-2 font-serif text-lg font-bold">Start from</legend>
        <div className="grid gap-2 md:grid-cols-2">
          {options.map((option) => (
            <label
              key={option.key}
              className="flex cursor-pointer gap-3 rounded border border-rule bg-white p-3 has-[:checked]:border-copper has-[:checked]:bg-copper-wash has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-copper"
            >
              <input
                type="radio"
                name="start"
                value={option.key}
                checked={start === option.key}
                onChange={() => choose(option.key)}
                aria-labelledby={`start-${option.key}-title`}
                aria-describedby={`start-${option.key}-details`}
                className="mt-1 h-4 w-4 shrink-0 accent-copper"
              />
              <span className="flex flex-col gap-0.5">
                <span id={`start-${option.key}-title`} className="font-medium">
                  {option.title}
                </span>
                <span id={`start-${option.key}-details`} className="text-sm">
                  {option.standard && (
                    <span className="block text-ink-soft">
                      {option.standard}, clause {option.clause} · {option.stepCount} {option.stepCount === 1 ? "step" : "steps"}
                    </span>
                  )}
                  <span className="block">{option.scope}</span>
                </span>
              </span>
            </label>
          ))}
        </div>
        <p aria-live="polite" className="text-sm text-deviates">
          {state.fieldErrors?.start?.join(" ")}
        </p>
      </fieldset>
      <div className="max-w-md">
        <Field
          label="Code of the new procedure"
          name="code"
          value={code}
          onChange={(e) => {
            setCode(e.target.value);
            setCodeEdited(true);
          }}
          autoComplete="off"
          hint="The lab's document code. It must be unused, and it stays the same in every version."
          errors={state.fieldErrors?.code}
        />
      </div>
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? "Creating…" : "Create draft"}
        </Button>
      </div>
    </form>
  );
}
